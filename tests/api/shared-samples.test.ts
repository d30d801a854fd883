// A file already processed in another study: its uploader can attach that sample to their own study (when they
// may see the original), and anyone else uploading it gets a done sample on the same stored tables without being
// pointed at a study they cannot open. Stored tables stay while any sample uses them.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type TestServer } from '../support/server';
import { newPerson, newStudy, serverWithOwner, type Person } from './fixtures';
import { jetsFileText, storedFiles, upload, uploadDone } from './sample-fixtures';

let server: TestServer, owner: Person, stranger: Person;
const file = jetsFileText(60, 42);

beforeAll(async () => {
  ({ server, owner } = await serverWithOwner());
  stranger = await newPerson(server, 'stranger');
});
afterAll(() => server?.stop());

/** Folders under storage/samples/ (the demo samples' too). */
const folders = () => storedFiles(server.storageDir).samples;
const plane = (person: Person, id: number) => person.client.get(`/api/samples/${id}/plane`);

describe('samples of a file processed elsewhere', () => {
  let originalId: number, studyA: number;

  it('attaches a visible done sample to another study of the uploader, without processing again', async () => {
    studyA = await newStudy(owner.client, 'Original study A');
    const original = await uploadDone(owner.client, { studyId: studyA, name: 'Quark-like run', file });
    originalId = original.id;
    const studyB = await newStudy(owner.client, 'Original study B');
    const again = await upload(owner.client, { studyId: studyB, name: 'Same file', file });
    expect(again.status).toBe(200);
    expect(again.body.duplicateOf).toMatchObject({ id: originalId, studyId: studyA });

    const attached = await owner.client.post(`/api/samples/${originalId}/attach`, { studyId: studyB });
    expect(attached.status, attached.text).toBe(201);
    expect(attached.body.sample).toMatchObject({ studyId: studyB, state: 'done', name: 'Quark-like run', counts: original.counts });
    const [a, b] = [await plane(owner, originalId), await plane(owner, attached.body.sample.id)];
    expect(b.status).toBe(200);
    expect(b.body.density).toEqual(a.body.density);
    // One stored folder for both.
    expect(folders()).toContain(String(originalId));
    expect(folders()).not.toContain(String(attached.body.sample.id));
    const twice = await owner.client.post(`/api/samples/${originalId}/attach`, { studyId: studyB });
    expect(twice.status).toBe(409);
    expect(twice.body.error.code).toBe('already_in_study');
  });

  it('never attaches from a study the caller cannot see', async () => {
    const own = await newStudy(stranger.client, 'Own study');
    const refused = await stranger.client.post(`/api/samples/${originalId}/attach`, { studyId: own });
    expect(refused.status).toBe(404);
  });

  it('gives someone who cannot see the original a done sample on its tables, naming nothing of it', async () => {
    const own = await newStudy(stranger.client, 'Stranger study');
    const shared = await upload(stranger.client, { studyId: own, name: 'My copy', file, fileName: 'mine.jsonl' });
    expect(shared.status, shared.text).toBe(201);
    expect(shared.body.sample).toMatchObject({ studyId: own, state: 'done', name: 'My copy', fileName: 'mine.jsonl' });
    expect(shared.text).not.toContain('Original study');
    expect(shared.text).not.toContain(`"id":${originalId},`);
    const detail = await stranger.client.get(`/api/samples/${shared.body.sample.id}`);
    expect(detail.body.sample.provenance.study).toEqual({ id: own, title: 'Stranger study' });
    expect(detail.body.sample.uploadedBy.id).toBe(stranger.id);
    expect((await plane(stranger, shared.body.sample.id)).status).toBe(200);
    expect(storedFiles(server.storageDir).uploads).toEqual([]);
  });

  it('keeps the stored tables until the last sample using them is deleted', async () => {
    const list = (await owner.client.get('/api/samples')).body.samples.filter((sample: { id: number; name: string }) =>
      sample.id !== originalId && sample.name === 'Quark-like run',
    );
    const strangers = (await stranger.client.get('/api/samples')).body.samples;
    expect((await owner.client.delete(`/api/samples/${originalId}`)).status).toBe(204);
    expect(folders()).toContain(String(originalId));
    for (const sample of strangers) {
      expect((await plane(stranger, sample.id)).status).toBe(200);
      const exported = await stranger.client.get(`/api/samples/${sample.id}/export`);
      expect(exported.status).toBe(200);
      expect(exported.text.split('\n').length).toBeGreaterThan(10);
    }
    for (const sample of list) expect((await owner.client.delete(`/api/samples/${sample.id}`)).status).toBe(204);
    expect(folders()).toContain(String(originalId));
    // Deleting the study of the last user removes the folder.
    const study = strangers[0].studyId;
    expect((await stranger.client.delete(`/api/studies/${study}`)).status).toBe(204);
    expect(folders()).not.toContain(String(originalId));
  });
});
