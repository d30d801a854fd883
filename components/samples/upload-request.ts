// Sends an upload with XMLHttpRequest, which (unlike fetch) reports how much of the body has gone out.

import { ApiError } from '@/lib/api/client';
import type { SampleSummary } from '@/lib/samples/shapes';

/** 202 queued or 201 done on tables of the same file processed elsewhere: `sample`; 200: `duplicateOf`. */
export type UploadAnswer = { sample: SampleSummary } | { duplicateOf: SampleSummary };

export interface UploadHandle {
  /** Resolves with the server's answer; rejects with an ApiError (status 0 when cancelled or offline). */
  done: Promise<UploadAnswer>;
  cancel(): void;
}

export const UPLOAD_CANCELLED = 'Upload cancelled.';

/** POSTs the form to the upload route; `onProgress` gets the fraction of the body sent so far. */
export function sendUpload(form: FormData, onProgress: (fraction: number) => void): UploadHandle {
  const request = new XMLHttpRequest();
  const done = new Promise<UploadAnswer>((resolve, reject) => {
    request.open('POST', '/api/samples/upload');
    request.setRequestHeader('accept', 'application/json');
    request.responseType = 'json';
    request.upload.onprogress = (event) => {
      if (event.lengthComputable && event.total > 0) onProgress(event.loaded / event.total);
    };
    request.onload = () => {
      const body = request.response;
      if (request.status >= 200 && request.status < 300 && body) return resolve(body as UploadAnswer);
      const message = typeof body?.error?.message === 'string' ? body.error.message : `The server answered ${request.status}.`;
      const details = Array.isArray(body?.error?.details) ? body.error.details : [];
      reject(new ApiError(message, request.status, body?.error?.code, details));
    };
    request.onerror = () => reject(new ApiError('The upload did not reach the server. Check the connection and try again.', 0));
    request.onabort = () => reject(new ApiError(UPLOAD_CANCELLED, 0, 'cancelled'));
    request.send(form);
  });
  return { done, cancel: () => request.abort() };
}
