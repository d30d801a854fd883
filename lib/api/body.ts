// Reads a request body with a size limit enforced while reading: a Content-Length above the limit is refused
// before any byte is read, and a body that grows past it (chunked, or lying about its length) is cut off there.
import { sizeText } from '@/lib/ingest/lines';
import { ApiError } from './errors';

export function tooLarge(limit: number): ApiError {
  return new ApiError(413, 'too_large', `The request body is larger than this route's limit of ${sizeText(limit)}.`, [
    { path: '(body)', message: `larger than ${limit} bytes` },
  ]);
}

/** The body as UTF-8 text, at most `limit` bytes; 413 otherwise. */
export async function readLimitedText(request: Request, limit: number): Promise<string> {
  const declared = request.headers.get('content-length');
  if (declared !== null && /^\d+$/.test(declared) && Number(declared) > limit) throw tooLarge(limit);
  if (!request.body) return '';
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let size = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.byteLength;
    if (size > limit) {
      await reader.cancel().catch(() => undefined);
      throw tooLarge(limit);
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks, size).toString('utf8');
}
