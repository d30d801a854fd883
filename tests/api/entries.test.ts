import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { NOTE_BODY_MAX } from '@/models/vocabulary';
import { startTestServer, type TestServer } from '../support/server';
import { addMember, newNote, newPerson, newStudy, type Person } from './fixtures';

let server: TestServer;
let owner: Person;
let editor: Person;

beforeAll(async () => {
  server = await startTestServer();
  owner = await newPerson(server, 'owner');
  editor = await newPerson(server, 'editor');
});
afterAll(() => server?.stop());

async function studyWithEditor(): Promise<number> {
  const study = await newStudy(owner.client);
  await addMember(owner.client, study, editor.email, 'editor');
  return study;
}

async function titlesInOrder(study: number): Promise<string[]> {
  const entries = (await owner.client.get(`/api/studies/${study}/entries`)).body.entries;
  expect(entries.map((entry: { position: number }) => entry.position)).toEqual(entries.map((_: unknown, i: number) => i));
  return entries.map((entry: { title: string }) => entry.title);
}

describe('notes', () => {
  it('adds notes at the end with their authors', async () => {
    const study = await studyWithEditor();
    const first = await owner.client.post(`/api/studies/${study}/entries`, { kind: 'note', title: 'A', body: '# Plan' });
    expect(first.status).toBe(201);
    expect(first.body.entry).toEqual({
      id: expect.any(Number),
      studyId: study,
      kind: 'note',
      position: 0,
      title: 'A',
      body: '# Plan',
      settings: {},
      createdBy: { id: owner.id, name: owner.name },
      updatedBy: { id: owner.id, name: owner.name },
      createdAt: expect.any(String),
      updatedAt: expect.any(String),
    });
    const second = await editor.client.post(`/api/studies/${study}/entries`, { kind: 'note', body: 'Untitled' });
    expect(second.body.entry).toMatchObject({ position: 1, title: '', createdBy: { id: editor.id } });
  });

  it('edits a note and records who changed it', async () => {
    const study = await studyWithEditor();
    const entry = await newNote(owner.client, study, 'first text');
    const changed = await editor.client.patch(`/api/studies/${study}/entries/${entry}`, { title: 'Renamed', body: 'second text' });
    expect(changed.status).toBe(200);
    expect(changed.body.entry).toMatchObject({
      title: 'Renamed',
      body: 'second text',
      createdBy: { id: owner.id },
      updatedBy: { id: editor.id, name: editor.name },
    });
  });

  it('moves a note and keeps positions without gaps', async () => {
    const study = await studyWithEditor();
    const ids = [];
    for (const title of ['a', 'b', 'c', 'd']) {
      const created = await owner.client.post(`/api/studies/${study}/entries`, { kind: 'note', title, body: title });
      ids.push(created.body.entry.id);
    }
    expect((await owner.client.patch(`/api/studies/${study}/entries/${ids[3]}`, { position: 0 })).body.entry.position).toBe(0);
    expect(await titlesInOrder(study)).toEqual(['d', 'a', 'b', 'c']);
    await owner.client.patch(`/api/studies/${study}/entries/${ids[0]}`, { position: 99 });
    expect(await titlesInOrder(study)).toEqual(['d', 'b', 'c', 'a']);
    expect((await owner.client.delete(`/api/studies/${study}/entries/${ids[1]}`)).status).toBe(204);
    expect(await titlesInOrder(study)).toEqual(['d', 'c', 'a']);
  });

  it('answers 400 for an unknown kind, a map or separation without settings, bad positions and oversized bodies', async () => {
    const study = await studyWithEditor();
    const unknown = await owner.client.post(`/api/studies/${study}/entries`, { kind: 'region', body: '' });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.details[0].path).toBe('kind');
    const separation = await owner.client.post(`/api/studies/${study}/entries`, { kind: 'separation', body: '' });
    expect(separation.status).toBe(400);
    expect(separation.body.error.details[0].path).toBe('settings');
    const map = await owner.client.post(`/api/studies/${study}/entries`, { kind: 'map', body: '' });
    expect(map.status).toBe(400);
    expect(map.body.error.details[0].path).toBe('settings');
    const huge = await owner.client.post(`/api/studies/${study}/entries`, { kind: 'note', body: 'x'.repeat(NOTE_BODY_MAX + 1) });
    expect(huge.status).toBe(400);
    const entry = await newNote(owner.client, study);
    for (const position of [-1, 1.5, '2']) {
      const response = await owner.client.patch(`/api/studies/${study}/entries/${entry}`, { position });
      expect(response.status).toBe(400);
      expect(response.body.error.details[0].path).toBe('position');
    }
    expect(await titlesInOrder(study)).toEqual(['']);
  });

  it('answers 404 for an entry of another study', async () => {
    const study = await studyWithEditor();
    const other = await studyWithEditor();
    const entry = await newNote(owner.client, other);
    expect((await owner.client.patch(`/api/studies/${study}/entries/${entry}`, { body: 'x' })).status).toBe(404);
    expect((await owner.client.delete(`/api/studies/${study}/entries/${entry}`)).status).toBe(404);
    expect((await owner.client.get(`/api/studies/${other}/entries`)).body.entries).toHaveLength(1);
  });

  it('keeps notes when their author’s membership ends', async () => {
    const study = await studyWithEditor();
    await newNote(editor.client, study, 'by the editor');
    await owner.client.delete(`/api/studies/${study}/members/${editor.id}`);
    const entries = (await owner.client.get(`/api/studies/${study}/entries`)).body.entries;
    expect(entries).toEqual([expect.objectContaining({ body: 'by the editor', createdBy: { id: editor.id, name: editor.name } })]);
  });
});
