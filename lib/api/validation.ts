import type { z } from 'zod';
import { readLimitedText } from './body';
import { BODY_LIMITS } from './body-limits';
import { ApiError, badRequest, notFound, type ErrorDetail } from './errors';
import { requireJsonContentType } from './request-origin';

/** zod's issues as the error body's details, each naming where in the input it is (`root`: the input itself). */
export function issueDetails(error: z.ZodError, root = '(body)'): ErrorDetail[] {
  return error.issues.map((issue) => ({
    path: issue.path.length > 0 ? issue.path.map(String).join('.') : root,
    message: issue.message,
  }));
}

function summary(details: ErrorDetail[]): string {
  return details.map((detail) => `${detail.path}: ${detail.message}`).join('; ');
}

/**
 * The request's JSON body checked against the schema: 415 without a JSON content type, 413 above `limit` bytes
 * (enforced while reading), 400 when it is not JSON or does not fit.
 */
export async function readJsonBody<T>(
  request: Request,
  schema: z.ZodType<T>,
  limit: number = BODY_LIMITS.standard,
): Promise<T> {
  requireJsonContentType(request);
  const text = await readLimitedText(request, limit);
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    throw new ApiError(400, 'invalid_json', 'The request body is not valid JSON.', [
      { path: '(body)', message: text.trim() === '' ? 'The body is empty.' : 'The body could not be parsed as JSON.' },
    ]);
  }
  return checkedInput(schema, body, 'request body');
}

/** `value` checked against the schema; 400 `invalid_input` naming each problem and where it is. */
export function checkedInput<T>(schema: z.ZodType<T>, value: unknown, what: string, root = '(body)'): T {
  const parsed = schema.safeParse(value);
  if (!parsed.success) {
    const details = issueDetails(parsed.error, root);
    throw badRequest(`Invalid ${what}: ${summary(details)}`, details);
  }
  return parsed.data;
}

/** The URL's query parameters (the last value of a repeated one) checked against the schema. */
export function readQuery<T>(request: Request, schema: z.ZodType<T>): T {
  return checkedInput(schema, Object.fromEntries(new URL(request.url).searchParams), 'query', '(query)');
}

/**
 * The path parameters checked against the schema. A malformed id names nothing that exists, so it answers
 * 404 like an unknown one.
 */
export function readRouteParams<T>(raw: unknown, schema: z.ZodType<T>): T {
  const parsed = schema.safeParse(raw);
  if (!parsed.success) throw notFound(`Nothing found at this address (${summary(issueDetails(parsed.error))}).`);
  return parsed.data;
}
