// Browser-side access to Splitfield's JSON API. Every failure becomes an ApiError that carries the
// server's own message ({"error":{"code","message","details"}}), so screens can show it as is.

/** Where in the request a problem is, as the server names it (a field, or a dotted path into the body). */
export interface ApiErrorDetail {
  path: string;
  message: string;
}

export class ApiError extends Error {
  constructor(
    message: string,
    readonly status: number,
    readonly code?: string,
    readonly details: ApiErrorDetail[] = [],
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

async function readResponse<T>(response: Response): Promise<T> {
  if (response.status === 204) return undefined as T;
  const body = await response.json().catch(() => null);
  if (!response.ok) {
    const error = body?.error;
    const message =
      typeof error?.message === 'string' && error.message
        ? error.message
        : `The server answered ${response.status} ${response.statusText}`.trim();
    throw new ApiError(message, response.status, error?.code, Array.isArray(error?.details) ? error.details : []);
  }
  return body as T;
}

/** The swr fetcher: GET a JSON resource. */
export async function fetcher<T>(url: string): Promise<T> {
  return readResponse<T>(await fetch(url, { headers: { accept: 'application/json' } }));
}

/** POST, PATCH or DELETE with an optional JSON body. */
export async function sendJson<T = unknown>(
  method: 'POST' | 'PATCH' | 'DELETE',
  url: string,
  body?: unknown,
): Promise<T> {
  const response = await fetch(url, {
    method,
    headers: { accept: 'application/json', ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  return readResponse<T>(response);
}

/** A readable message for anything thrown. */
export function messageOf(error: unknown): string {
  if (error instanceof Error && error.message) return error.message;
  return 'Something went wrong. Please try again.';
}
