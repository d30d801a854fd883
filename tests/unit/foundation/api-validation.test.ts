import { z } from 'zod';
import { describe, expect, it } from 'vitest';
import { ApiError } from '@/lib/api/errors';
import { atLeastOneField, emailSchema, idParam, passwordSchema, studyTitleSchema } from '@/lib/api/schemas';
import { readJsonBody, readRouteParams } from '@/lib/api/validation';

function post(body: string): Request {
  return new Request('http://localhost/api/x', { method: 'POST', body, headers: { 'content-type': 'application/json' } });
}

async function failure(promise: Promise<unknown>): Promise<ApiError> {
  const error = await promise.then(
    () => undefined,
    (thrown: unknown) => thrown,
  );
  expect(error).toBeInstanceOf(ApiError);
  return error as ApiError;
}

const schema = z.strictObject({ title: studyTitleSchema, count: z.number().int().optional() });

describe('reading a JSON body', () => {
  it('returns the parsed, checked value', async () => {
    await expect(readJsonBody(post('{"title":"  Jets  ","count":2}'), schema)).resolves.toEqual({ title: 'Jets', count: 2 });
  });

  it('answers invalid_json for text that is not JSON, and says when it is empty', async () => {
    const broken = await failure(readJsonBody(post('{"title":'), schema));
    expect([broken.status, broken.code]).toEqual([400, 'invalid_json']);
    const empty = await failure(readJsonBody(post(''), schema));
    expect(empty.details).toEqual([{ path: '(body)', message: 'The body is empty.' }]);
  });

  it('answers invalid_input naming each field, nested paths dotted', async () => {
    const nested = z.strictObject({ items: z.array(z.strictObject({ title: studyTitleSchema })) });
    const error = await failure(readJsonBody(post('{"items":[{"title":"ok"},{"title":""}]}'), nested));
    expect([error.status, error.code]).toEqual([400, 'invalid_input']);
    expect(error.details).toEqual([{ path: 'items.1.title', message: 'Title must not be empty' }]);
    expect(error.message).toBe('Invalid request body: items.1.title: Title must not be empty');
  });

  it('refuses unknown fields and a body that is not an object', async () => {
    expect((await failure(readJsonBody(post('{"title":"a","extra":1}'), schema))).details?.[0].path).toBe('(body)');
    expect((await failure(readJsonBody(post('[1,2]'), schema))).code).toBe('invalid_input');
  });
});

describe('path parameters', () => {
  const params = z.object({ studyId: idParam });

  it('turns an id into a number', () => {
    expect(readRouteParams({ studyId: '42' }, params)).toEqual({ studyId: 42 });
  });

  it.each(['0', '007', '-1', '1e3', 'x', '1234567890123456'])('answers 404 for the id %s', (studyId) => {
    let thrown: unknown;
    try {
      readRouteParams({ studyId }, params);
    } catch (error) {
      thrown = error;
    }
    expect(thrown).toMatchObject({ status: 404, code: 'not_found' });
  });
});

describe('shared input shapes', () => {
  it('normalises e-mails and refuses non-addresses', () => {
    expect(emailSchema.parse('  Ada@Example.TEST ')).toBe('ada@example.test');
    expect(emailSchema.safeParse('ada@').success).toBe(false);
  });

  it('limits passwords to 8..72 bytes, counting bytes not characters', () => {
    expect(passwordSchema.safeParse('1234567').success).toBe(false);
    expect(passwordSchema.safeParse('12345678').success).toBe(true);
    expect(passwordSchema.safeParse('é'.repeat(36)).success).toBe(true);
    expect(passwordSchema.safeParse('é'.repeat(37)).success).toBe(false);
  });

  it('wants at least one field in a change', () => {
    const change = atLeastOneField({ title: studyTitleSchema.optional() });
    expect(change.safeParse({}).success).toBe(false);
    expect(change.safeParse({ title: 'x' }).success).toBe(true);
  });
});
