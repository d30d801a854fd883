// Uploads through POST /api/samples/upload on a real server with a small upload limit: what is accepted, what is
// refused and why, and that nothing of a refused, oversized or interrupted upload stays in the database or storage/.
import http from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Client, TestServer } from '../support/server';
import { addMember, newPerson, newStudy, serverWithAdmin, type Person } from './fixtures';
import { isFinished, jetsFileText, storedFiles, upload, uploadForm, waitForSample } from './sample-fixtures';

const UPLOAD_LIMIT = 256 * 1024;

let server: TestServer;
let owner: Person;
let viewer: Person;
let studyId: number;

beforeAll(async () => {
  ({ server } = await serverWithAdmin({ env: { SPLITFIELD_UPLOAD_MAX_BYTES: String(UPLOAD_LIMIT) } }));
  owner = await newPerson(server, 'owner');
  viewer = await newPerson(server, 'viewer');
  studyId = await newStudy(owner.client, 'Upload study');
  await addMember(owner.client, studyId, viewer.email, 'viewer');
});
afterAll(() => server?.stop());

async function sampleNames(client: Client = owner.client): Promise<string[]> {
  const list = await client.get(`/api/samples?studyId=${studyId}`);
  expect(list.status, list.text).toBe(200);
  return list.body.samples.map((sample: { name: string }) => sample.name);
}

/** Uploads stored right now: none once every upload is either refused or processed. */
async function waitForNoUploads(): Promise<void> {
  const deadline = Date.now() + 60_000;
  while (storedFiles(server.storageDir).uploads.length > 0 && Date.now() < deadline) {
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  expect(storedFiles(server.storageDir).uploads).toEqual([]);
}

describe('an accepted upload', () => {
  it('answers 202 with the queued sample, its fields and defaults, and processes it', async () => {
    const response = await upload(owner.client, {
      studyId,
      name: '  Quark-like run 7  ',
      file: jetsFileText(40, 11),
      fileName: 'run-7.jsonl',
      fields: { label: 'q7', description: 'Seven.', tags: 'quark, demo ,quark' },
    });
    expect(response.status, response.text).toBe(202);
    const sample = response.body.sample;
    expect(sample).toMatchObject({
      name: 'Quark-like run 7',
      label: 'q7',
      description: 'Seven.',
      tags: ['quark', 'demo'],
      studyId,
      studyTitle: 'Upload study',
      fileName: 'run-7.jsonl',
      fileSize: Buffer.byteLength(jetsFileText(40, 11)),
      uploadedBy: { id: owner.id, name: owner.name },
    });
    expect(['queued', 'running', 'done']).toContain(sample.state);
    const done = await waitForSample(owner.client, sample.id, isFinished);
    expect(done.state).toBe('done');
    expect(done.settings).toEqual({
      jet: { algorithm: 'antikt', R: 0.4, ptMin: 20, yMax: 2.5, maxJets: null, exclusive: null },
      softDrop: { zCut: 0.1, beta: 0, R0: 0.4, mode: 'grooming' },
      multiplicityKtCut: 1,
      fullTree: false,
      collision: 'hadron',
      ee: { algorithm: 'durham', p: -1, eMin: 0 },
      particles: { dropNeutrinos: false, pidExclude: [], pidInclude: [], chargedOnly: false, ptMin: 0, rapidityMax: null, rapidityKind: 'y' },
      flavourTags: false,
    });
    expect(done.counts).toMatchObject({ records: 40, jets: 40 });
    expect(done.myRole).toBe('owner');
  });

  it('takes tags as a JSON array and partial settings completed with the defaults (R0 follows R)', async () => {
    const response = await upload(owner.client, {
      studyId,
      file: jetsFileText(10, 12),
      fields: { tags: '["wide", "R08"]', settings: JSON.stringify({ jet: { R: 0.8, maxJets: 1 }, fullTree: true }) },
    });
    expect(response.status, response.text).toBe(202);
    const detail = (await owner.client.get(`/api/samples/${response.body.sample.id}`)).body.sample;
    expect(detail.tags).toEqual(['wide', 'R08']);
    expect(detail.settings).toEqual({
      jet: { algorithm: 'antikt', R: 0.8, ptMin: 20, yMax: 2.5, maxJets: 1, exclusive: null },
      softDrop: { zCut: 0.1, beta: 0, R0: 0.8, mode: 'grooming' },
      multiplicityKtCut: 1,
      fullTree: true,
      collision: 'hadron',
      ee: { algorithm: 'durham', p: -1, eMin: 0 },
      particles: { dropNeutrinos: false, pidExclude: [], pidInclude: [], chargedOnly: false, ptMin: 0, rapidityMax: null, rapidityKind: 'y' },
      flavourTags: false,
    });
  });
});

describe('an upload of a file already stored', () => {
  it('offers the existing sample for the same bytes and settings, and processes it again when forced', async () => {
    const file = jetsFileText(15, 21);
    const first = await upload(owner.client, { studyId, name: 'Original', file });
    expect(first.status, first.text).toBe(202);
    const before = storedFiles(server.storageDir).uploads.length;

    const again = await upload(owner.client, { studyId, name: 'Same again', file, fileName: 'other-name.jsonl' });
    expect(again.status, again.text).toBe(200);
    expect(again.body.duplicateOf).toMatchObject({ id: first.body.sample.id, name: 'Original' });
    expect(await sampleNames()).not.toContain('Same again');
    expect(storedFiles(server.storageDir).uploads.length).toBeLessThanOrEqual(before);

    const forced = await upload(owner.client, { studyId, name: 'Forced', file, fields: { force: '1' } });
    expect(forced.status, forced.text).toBe(202);
    const otherSettings = await upload(owner.client, {
      studyId,
      name: 'Other cuts',
      file,
      fields: { settings: '{"jet":{"ptMin":50}}' },
    });
    expect(otherSettings.status, otherSettings.text).toBe(202);
  });
});

describe('a refused upload', () => {
  async function expectRefused(
    response: { status: number; body: any; text: string },
    status: number,
    code: string,
    message: RegExp,
  ) {
    expect(response.status, response.text).toBe(status);
    expect(response.body.error.code).toBe(code);
    expect(response.body.error.message).toMatch(message);
    await waitForNoUploads();
  }

  it.each([
    ['../../etc/passwd.jsonl', /path separators/],
    ['runs/run-1.jsonl', /path separators/],
    ['C:\\data\\run.jsonl', /path separators/],
    ['..jsonl', /"\.\."/],
  ])('names the problem with the file name %s', async (fileName, message) => {
    const name = `Named ${fileName}`;
    const response = await upload(owner.client, { studyId, name, file: jetsFileText(3, 1), fileName });
    await expectRefused(response, 400, 'invalid_input', message);
    expect(response.body.error.details).toEqual([{ path: 'file', message: expect.stringMatching(message) }]);
    expect(await sampleNames()).not.toContain(name);
  });

  it('names each field that is wrong', async () => {
    const response = await owner.client.send('POST', '/api/samples/upload', {
      multipart: uploadForm({
        studyId: 'seven',
        name: ' ',
        file: jetsFileText(3, 2),
        fields: { settings: '{"jet":{"R":-1,"colour":"red"}}', tags: `ok, ${'long'.repeat(20)}`, force: 'maybe' },
      }),
    });
    await expectRefused(response, 400, 'invalid_input', /^Invalid upload: /);
    const paths = response.body.error.details.map((detail: { path: string }) => detail.path);
    expect(paths).toEqual(expect.arrayContaining(['studyId', 'name', 'settings.jet', 'settings.jet.R', 'tags.1', 'force']));
  });

  it('says when settings are not JSON, or a field is unknown', async () => {
    const notJson = await upload(owner.client, { studyId, file: jetsFileText(3, 3), fields: { settings: '{R: 0.4}' } });
    await expectRefused(notJson, 400, 'invalid_input', /settings must be JSON/);
    const unknown = await upload(owner.client, { studyId, file: jetsFileText(3, 3), fields: { colour: 'red' } });
    await expectRefused(unknown, 400, 'invalid_input', /colour/);
  });

  it('needs the file, and a non-empty one', async () => {
    const form = new FormData();
    form.append('studyId', String(studyId));
    form.append('name', 'No file');
    const missing = await owner.client.send('POST', '/api/samples/upload', { multipart: form });
    await expectRefused(missing, 400, 'invalid_input', /"file" field with the file is missing/);
    const empty = await upload(owner.client, { studyId, name: 'Empty', file: '' });
    await expectRefused(empty, 400, 'invalid_input', /the file is empty/);
    expect(await sampleNames()).not.toContain('Empty');
  });

  it('wants multipart/form-data', async () => {
    const response = await owner.client.post('/api/samples/upload', { studyId, name: 'As JSON' });
    expect(response.status).toBe(400);
    expect(response.body.error.message).toMatch(/multipart\/form-data/);
  });

  it('refuses a file over the size limit with 413 and keeps nothing of it', async () => {
    const big = jetsFileText(2000, 4);
    expect(Buffer.byteLength(big)).toBeGreaterThan(UPLOAD_LIMIT);
    const response = await upload(owner.client, { studyId, name: 'Too big', file: big });
    await expectRefused(response, 413, 'too_large', /larger than the upload limit/);
    expect(await sampleNames()).not.toContain('Too big');
  });

  it('refuses a viewer with 403 before storing the file', async () => {
    const response = await upload(viewer.client, { studyId, name: 'By a viewer', file: jetsFileText(3, 5) });
    await expectRefused(response, 403, 'forbidden', /editor role/);
    expect(await sampleNames()).not.toContain('By a viewer');
  });

  it('refuses a viewer also when the study comes after the file', async () => {
    const form = new FormData();
    form.append('name', 'Study last');
    form.append('file', new Blob([jetsFileText(3, 6)]), 'late.jsonl');
    form.append('studyId', String(studyId));
    const response = await viewer.client.send('POST', '/api/samples/upload', { multipart: form });
    await expectRefused(response, 403, 'forbidden', /editor role/);
  });
});

describe('an upload interrupted half way', () => {
  it('leaves no file and no sample, and the server goes on', async () => {
    await waitForNoUploads();
    const boundary = 'splitfield-interrupted-upload';
    const part = (name: string, value: string) =>
      `--${boundary}\r\nContent-Disposition: form-data; name="${name}"\r\n\r\n${value}\r\n`;
    const head =
      part('studyId', String(studyId)) +
      part('name', 'Interrupted') +
      `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="half.jsonl"\r\n\r\n`;
    const half = Buffer.from(jetsFileText(300, 7)).subarray(0, UPLOAD_LIMIT / 2);
    const request = http.request(`${server.baseUrl}/api/samples/upload`, {
      method: 'POST',
      headers: {
        cookie: owner.client.cookieList().map(({ name, value }) => `${name}=${value}`).join('; '),
        'content-type': `multipart/form-data; boundary=${boundary}`,
        'content-length': String(head.length + 2 * half.length),
      },
    });
    const closed = new Promise<void>((resolve) => {
      request.on('error', () => resolve());
      request.on('close', () => resolve());
    });
    request.write(head);
    request.write(half);
    // The server is storing the file when its first bytes are on disk: then the client goes away.
    const deadline = Date.now() + 30_000;
    while (storedFiles(server.storageDir).uploads.length === 0 && Date.now() < deadline) {
      await new Promise((resolve) => setTimeout(resolve, 20));
    }
    request.destroy();
    await closed;

    await waitForNoUploads();
    expect(await sampleNames()).not.toContain('Interrupted');
    expect((await owner.client.get('/api/me')).status).toBe(200);
  });
});
