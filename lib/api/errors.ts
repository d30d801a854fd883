// The JSON error body every API route answers with: {"error": {"code", "message", "details"}}.

export interface ErrorDetail {
  /** Where the problem is: a dotted path into the body ("members.0.role") or a parameter name. */
  path: string;
  message: string;
}

export interface ErrorBody {
  error: { code: string; message: string; details: ErrorDetail[] | null };
}

/** Thrown anywhere below a route to answer with this status and body instead of the normal response. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details: ErrorDetail[] | null = null,
  ) {
    super(message);
    this.name = 'ApiError';
  }

  toResponse(): Response {
    const body: ErrorBody = { error: { code: this.code, message: this.message, details: this.details } };
    return Response.json(body, { status: this.status, headers: { 'Cache-Control': 'no-store' } });
  }
}

export function badRequest(message: string, details: ErrorDetail[] | null = null): ApiError {
  return new ApiError(400, 'invalid_input', message, details);
}

export function unauthenticated(): ApiError {
  return new ApiError(401, 'unauthenticated', 'Sign in to use this.');
}

export function forbidden(message: string): ApiError {
  return new ApiError(403, 'forbidden', message);
}

export function notFound(message: string): ApiError {
  return new ApiError(404, 'not_found', message);
}

export function conflict(code: string, message: string): ApiError {
  return new ApiError(409, code, message);
}
