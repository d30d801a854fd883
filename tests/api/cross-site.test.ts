// Data-changing requests with a session cookie must come from Splitfield's own pages (Sec-Fetch-Site or Origin),
// and JSON routes take only JSON bodies; scripts with a bearer token are not affected.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, type TestServer } from '../support/server';
import { newAccount, newStudy, serverWithOwner, type Person } from './fixtures';
import { jetsFileText, uploadForm } from './sample-fixtures';
import { storedFiles } from './sample-fixtures';

let server: TestServer, owner: Person;

beforeAll(async () => {
  ({ server, owner } = await serverWithOwner());
});
afterAll(() => server?.stop());

async function members(studyId: number): Promise<string[]> {
  const detail = await owner.client.get(`/api/studies/${studyId}`);
  return detail.body.members.map((member: { email: string }) => member.email);
}

describe('cross-site requests', () => {
  it('refuses a text/plain body carrying JSON from another origin, and adds no owner', async () => {
    const studyId = await newStudy(owner.client, 'Cross-site target');
    const intruder = await newAccount(server, 'intruder');
    const attack = await owner.client.send('POST', `/api/studies/${studyId}/members`, {
      rawBody: JSON.stringify({ email: intruder.email, role: 'owner' }),
      headers: { origin: 'http://other.example', 'content-type': 'text/plain' },
    });
    expect(attack.status).toBe(403);
    expect(attack.body.error.code).toBe('cross_site');
    expect(attack.body.error.message).toContain('http://other.example');
    expect(await members(studyId)).not.toContain(intruder.email);
  });

  it('refuses JSON from another origin or another site, and accepts the same origin', async () => {
    const studyId = await newStudy(owner.client, 'Origins');
    const note = (headers: Record<string, string>) =>
      owner.client.send('POST', `/api/studies/${studyId}/entries`, { body: { kind: 'note', body: 'hello' }, headers });
    expect((await note({ origin: 'http://other.example' })).status).toBe(403);
    // Another port of the same host is another origin, though the same site.
    const otherPort = new URL(server.baseUrl);
    otherPort.port = String(Number(otherPort.port) + 1);
    expect((await note({ origin: otherPort.origin })).status).toBe(403);
    expect((await note({ origin: 'null' })).status).toBe(403);
    expect((await note({ 'sec-fetch-site': 'same-site' })).status).toBe(403);
    expect((await note({ 'sec-fetch-site': 'cross-site', origin: server.baseUrl })).status).toBe(403);
    expect((await note({ origin: server.baseUrl })).status).toBe(201);
    expect((await note({ 'sec-fetch-site': 'same-origin', origin: server.baseUrl })).status).toBe(201);
    const entries = await owner.client.get(`/api/studies/${studyId}/entries`);
    expect(entries.body.entries).toHaveLength(2);
  });

  it('answers a JSON route sent without a JSON content type with 415', async () => {
    const studyId = await newStudy(owner.client, 'Content types');
    for (const type of ['text/plain', 'application/x-www-form-urlencoded', 'multipart/form-data; boundary=x']) {
      const refused = await owner.client.send('PATCH', `/api/studies/${studyId}`, {
        rawBody: JSON.stringify({ title: 'Changed' }),
        headers: { 'content-type': type },
      });
      expect(refused.status, type).toBe(415);
      expect(refused.body.error.code).toBe('unsupported_media_type');
    }
    expect((await owner.client.get(`/api/studies/${studyId}`)).body.study.title).toBe('Content types');
  });

  it('refuses a cross-origin upload before storing anything', async () => {
    const studyId = await newStudy(owner.client, 'Upload target');
    // The demo samples of the first start may still be waiting in uploads/: only a new file would be this upload's.
    const before = new Set(storedFiles(server.storageDir).uploads);
    const refused = await owner.client.send('POST', '/api/samples/upload', {
      multipart: uploadForm({ studyId, file: jetsFileText(5, 1) }),
      headers: { origin: 'http://other.example' },
    });
    expect(refused.status).toBe(403);
    expect(storedFiles(server.storageDir).uploads.filter((name) => !before.has(name))).toEqual([]);
    expect((await owner.client.get(`/api/samples?studyId=${studyId}`)).body.samples).toEqual([]);
  });

  it('refuses a cross-origin sign-up', async () => {
    const refused = await new Client(server.baseUrl).send('POST', '/api/signup', {
      body: { name: 'Cross', email: 'cross@site.test', password: 'password-cross' },
      headers: { origin: 'http://other.example' },
    });
    expect(refused.status).toBe(403);
  });

  it('lets scripts with a bearer token work from anywhere', async () => {
    const studyId = await newStudy(owner.client, 'Scripted');
    const made = await owner.client.post('/api/tokens', { name: 'cross-site test' });
    const script = new Client(server.baseUrl);
    const created = await script.send('POST', `/api/studies/${studyId}/entries`, {
      body: { kind: 'note', body: 'from a script' },
      headers: { authorization: `Bearer ${made.body.secret}`, origin: 'http://other.example' },
    });
    expect(created.status, created.text).toBe(201);
  });
});
