// What the server stores is private to the account it runs as (folders 0700, files 0600), and names that read
// differently from what they are (bidirectional control characters) are refused.
import { readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type TestServer } from '../support/server';
import { newStudy, serverWithOwner, type Person } from './fixtures';
import { jetsFileText, upload, uploadDone } from './sample-fixtures';

let server: TestServer, owner: Person;

beforeAll(async () => {
  ({ server, owner } = await serverWithOwner());
});
afterAll(() => server?.stop());

function everything(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = path.join(dir, name);
    return statSync(full).isDirectory() ? [full, ...everything(full)] : [full];
  });
}

const RLO = '\u202e';

describe('private storage', () => {
  it('keeps the database, the secret, uploads and sample tables readable by the owner only', async () => {
    const studyId = await newStudy(owner.client, 'Modes');
    await uploadDone(owner.client, { studyId, file: jetsFileText(20, 3) });
    const paths = [server.storageDir, ...everything(server.storageDir)];
    expect(paths.some((file) => file.endsWith('splitfield.sqlite'))).toBe(true);
    expect(paths.some((file) => file.includes(`${path.sep}samples${path.sep}`))).toBe(true);
    for (const file of paths) {
      const stats = statSync(file);
      expect((stats.mode & 0o777).toString(8), file).toBe(stats.isDirectory() ? '700' : '600');
    }
  });
});

describe('bidirectional control characters', () => {
  it('are refused in file names, sample names, study titles, note titles and account names', async () => {
    const studyId = await newStudy(owner.client, 'Bidi');
    const file = await upload(owner.client, { studyId, file: jetsFileText(5, 1), fileName: `quark${RLO}lsonj.gz` });
    expect(file.status).toBe(400);
    expect(file.body.error.message).toContain('U+202E');
    const name = await upload(owner.client, { studyId, file: jetsFileText(5, 1), name: `run${RLO}21` });
    expect(name.status).toBe(400);
    expect(name.body.error.details).toContainEqual({ path: 'name', message: expect.stringContaining('U+202E') });
    const study = await owner.client.post('/api/studies', { title: `Gluon${RLO}kraM` });
    expect(study.status).toBe(400);
    expect(study.body.error.details[0]).toMatchObject({ path: 'title' });
    const note = await owner.client.post(`/api/studies/${studyId}/entries`, { kind: 'note', title: `a\u2066b`, body: 'text' });
    expect(note.status).toBe(400);
    expect(note.body.error.message).toContain('U+2066');
    const renamed = await owner.client.patch('/api/me', { name: `Ann${RLO}` });
    expect(renamed.status).toBe(400);
    // Free text may hold them (right-to-left writing needs them).
    const body = await owner.client.post(`/api/studies/${studyId}/entries`, { kind: 'note', body: `mixed \u200f text` });
    expect(body.status).toBe(201);
  });
});
