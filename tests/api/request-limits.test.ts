// Request bodies are limited while they are read: a Content-Length above a route's limit is refused at once, a
// body that grows past it is cut off, and the server's memory does not grow with what a client sends.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BODY_LIMITS } from '@/lib/api/body-limits';
import { type TestServer } from '../support/server';
import { peakResidentWhile, postStreamed, residentBytes } from '../support/raw-request';
import { newStudy, serverWithOwner, type Person } from './fixtures';

let server: TestServer, owner: Person;

beforeAll(async () => {
  ({ server, owner } = await serverWithOwner());
});
afterAll(() => server?.stop());

const MB = 1024 * 1024;

describe('request body limits', () => {
  it('answers a 200 MB sign-up password with 413 before reading it, without the server growing', async () => {
    const before = residentBytes(server.pid);
    const { result, peak } = await peakResidentWhile(server.pid, () =>
      postStreamed(`${server.baseUrl}/api/signup`, {
        size: 200 * MB,
        announce: true,
        prefix: '{"name":"Big","email":"big@limits.test","password":"',
      }),
    );
    expect(result.status, result.body).toBe(413);
    const body = JSON.parse(result.body);
    expect(body.error.code).toBe('too_large');
    expect(body.error.message).toMatch(/16 kB/);
    expect(peak - before).toBeLessThan(50 * MB);
  });

  it('cuts off a chunked body (no Content-Length) once it grows past the limit', async () => {
    const before = residentBytes(server.pid);
    const { result, peak } = await peakResidentWhile(server.pid, () =>
      postStreamed(`${server.baseUrl}/api/signup`, {
        size: 200 * MB,
        announce: false,
        piece: 64 * 1024,
        prefix: '{"name":"Big","email":"big@limits.test","password":"',
      }),
    );
    expect(result.status, result.body).toBe(413);
    expect(JSON.parse(result.body).error.code).toBe('too_large');
    // The answer came long before the client had sent everything.
    expect(result.sent).toBeLessThan(100 * MB);
    expect(peak - before).toBeLessThan(50 * MB);
  });

  it('gives a note room for a long text, and refuses one above the note limit', async () => {
    const studyId = await newStudy(owner.client, 'Limits study');
    const long = await owner.client.post(`/api/studies/${studyId}/entries`, { kind: 'note', body: 'x'.repeat(150_000) });
    expect(long.status, long.text).toBe(201);
    const tooLong = await owner.client.send('POST', `/api/studies/${studyId}/entries`, {
      rawBody: JSON.stringify({ kind: 'note', body: 'y'.repeat(BODY_LIMITS.note + 10) }),
    });
    expect(tooLong.status).toBe(413);
    expect(tooLong.body.error.code).toBe('too_large');
    // A study title is small: a 100 kB body is refused as too large, not read.
    const title = await owner.client.send('POST', '/api/studies', { rawBody: JSON.stringify({ title: 't'.repeat(100_000) }) });
    expect(title.status).toBe(413);
    const entries = await owner.client.get(`/api/studies/${studyId}/entries`);
    expect(entries.body.entries).toHaveLength(1);
  });
});
