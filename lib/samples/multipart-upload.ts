// Receives a multipart/form-data upload inside a route handler with multer: the Web request's body becomes a Node
// stream, the one file streams to the store (HashingUploadStorage), text fields are collected. Whatever goes wrong, the
// partial file is removed before the error reaches the caller.
import { Readable } from 'node:stream';
import type { ReadableStream as NodeWebReadableStream } from 'node:stream/web';
import multer from 'multer';
import { ApiError, badRequest } from '@/lib/api/errors';
import { sizeText } from '@/lib/ingest/lines';
import { HashingUploadStorage, StorageWriteError, type StoredUploadInfo } from './hashing-storage';
import type { SampleStorage } from './storage';

export interface ReceivedFile extends StoredUploadInfo {
  /** The name the client gave the file. */
  originalName: string;
}

export interface ReceivedUpload {
  /** Text fields as multer collected them. */
  fields: Record<string, unknown>;
  file: ReceivedFile | null;
  elapsedMs: number;
  /** Removes the stored file (when the upload is refused after it arrived). */
  discard(): Promise<void>;
}

export interface ReceiveOptions {
  storage: SampleStorage;
  maxBytes: number;
  /** Name of the file field. */
  fileField: string;
  /**
   * Called when the file part starts, with the fields sent before it: throw to refuse the upload before the
   * file is stored (clients that send the fields first learn of a mistake without sending the whole file).
   */
  beforeFile(fieldsSoFar: Record<string, unknown>, originalName: string): Promise<void>;
  /** Called when the file's local copy under uploads/ has been created (not with a bucket); its bytes follow. */
  onFileOpened?(storedName: string): void;
}

const MAX_FIELD_BYTES = 1024 * 1024;
const MAX_FIELDS = 20;

/** multer reads a Node request: the body as a stream, and the headers. */
function nodeRequest(request: Request): Readable & { headers: Record<string, string> } {
  const body = Readable.fromWeb(request.body as NodeWebReadableStream<Uint8Array>);
  const headers = Object.fromEntries(request.headers);
  // busboy ignores a body announced by neither header (a streamed fetch body in some clients).
  if (!headers['content-length'] && !headers['transfer-encoding']) headers['transfer-encoding'] = 'chunked';
  return Object.assign(body, { headers });
}

/** An error of multer, busboy, the connection or the disk as the API answers it. */
function uploadError(error: unknown, options: ReceiveOptions): ApiError {
  if (error instanceof ApiError) return error;
  if (error instanceof multer.MulterError) {
    switch (error.code) {
      case 'LIMIT_FILE_SIZE':
        return new ApiError(
          413,
          'too_large',
          `The file is larger than the upload limit of ${sizeText(options.maxBytes)} (SPLITFIELD_UPLOAD_MAX_BYTES); nothing was stored.`,
          [{ path: options.fileField, message: `larger than ${options.maxBytes} bytes` }],
        );
      case 'LIMIT_UNEXPECTED_FILE': {
        // With room for two files, multer names the field of the one that does not belong.
        const field = error.field ?? options.fileField;
        const problem =
          field === options.fileField
            ? `the form has a second file in the "${field}" field`
            : `the form has a file in the "${field}" field`;
        return badRequest(`Send exactly one file, in the "${options.fileField}" field: ${problem}.`, [
          { path: field, message: field === options.fileField ? 'a second file' : 'unexpected file field' },
        ]);
      }
      case 'LIMIT_FILE_COUNT':
        return badRequest(`Send exactly one file, in the "${options.fileField}" field: the form has more than one file.`, [
          { path: options.fileField, message: 'more than one file' },
        ]);
      case 'LIMIT_FIELD_VALUE':
        return badRequest(`The field "${error.field}" is longer than ${sizeText(MAX_FIELD_BYTES)}.`, [
          { path: error.field ?? '(body)', message: 'too long' },
        ]);
      default:
        return badRequest(`The upload form is not acceptable: ${error.message}.`);
    }
  }
  if (error instanceof StorageWriteError) {
    const full = /ENOSPC/.test(error.message);
    console.error('[upload] cannot store an upload', error);
    return new ApiError(
      full ? 507 : 500,
      full ? 'storage_full' : 'internal',
      full ? "The server's storage is full; nothing was stored." : 'The upload could not be stored; nothing was kept.',
    );
  }
  const message = error instanceof Error ? error.message : String(error);
  if (/aborted|closed|terminated|ECONNRESET|Unexpected end of form/i.test(message)) {
    return new ApiError(400, 'upload_interrupted', 'The upload stopped before the end of the file; nothing was stored.');
  }
  return badRequest(`The multipart/form-data body is malformed: ${message}.`);
}

/** Streams the request's multipart body: the file to the store's uploads/, the fields into memory (small, limited). */
export async function receiveUpload(request: Request, options: ReceiveOptions): Promise<ReceivedUpload> {
  if (!/^multipart\/form-data\b/i.test(request.headers.get('content-type') ?? '') || !request.body) {
    throw badRequest(`Send the upload as multipart/form-data, with the file in the "${options.fileField}" field.`);
  }
  const storage = new HashingUploadStorage(options.storage, options.onFileOpened);
  const middleware = multer({
    storage,
    // Keep the name as sent, so that a name with path separators is refused rather than silently shortened.
    preservePath: true,
    // Browsers and curl send file names as UTF-8 bytes.
    defParamCharset: 'utf8',
    // Two files allowed to busboy, so that multer, not busboy, refuses the second and names its field.
    limits: { fileSize: options.maxBytes, files: 2, fields: MAX_FIELDS, fieldSize: MAX_FIELD_BYTES },
    fileFilter(req, file, accept) {
      options.beforeFile({ ...req.body }, file.originalname).then(() => accept(null, true), accept);
    },
  }).single(options.fileField);
  const req = nodeRequest(request) as unknown as Parameters<typeof middleware>[0];
  const started = performance.now();
  try {
    await new Promise<void>((resolve, reject) => {
      middleware(req, {} as Parameters<typeof middleware>[1], (error?: unknown) => (error ? reject(error) : resolve()));
    });
  } catch (error) {
    await storage.removeAll();
    throw uploadError(error, options);
  }
  const stored = req.file as (Express.Multer.File & StoredUploadInfo) | undefined;
  return {
    fields: { ...req.body },
    file: stored
      ? { originalName: stored.originalname, storedName: stored.storedName, path: stored.path, size: stored.size, sha256: stored.sha256 }
      : null,
    elapsedMs: performance.now() - started,
    discard: () => storage.removeAll(),
  };
}
