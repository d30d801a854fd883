import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { STUDY_TITLE_MAX } from '@/models/vocabulary';
import type { Client, TestServer } from '../support/server';
import { addMember, newNote, newPerson, newStudy, serverWithOwner, type Person } from './fixtures';

let server: TestServer, admin: Client, owner: Person;

beforeAll(async () => {
  ({ server, admin, owner } = await serverWithOwner());
});
afterAll(() => server?.stop());

describe('creating studies', () => {
  it('makes the creator its owner', async () => {
    const created = await owner.client.post('/api/studies', { title: '  Groomed mass  ', description: 'SoftDrop checks' });
    expect(created.status).toBe(201);
    expect(created.body.study).toMatchObject({ title: 'Groomed mass', description: 'SoftDrop checks' });
    const detail = await owner.client.get(`/api/studies/${created.body.study.id}`);
    expect(detail.body.myRole).toBe('owner');
    expect(detail.body.members).toEqual([{ userId: owner.id, name: owner.name, email: owner.email, role: 'owner' }]);
    expect(detail.body.entries).toEqual([]);
  });

  it.each([
    ['empty', ''],
    ['blank', '   '],
    ['too long', 'x'.repeat(STUDY_TITLE_MAX + 1)],
  ])('answers 400 for a %s title and stores nothing', async (_label, title) => {
    const before = (await owner.client.get('/api/studies')).body.studies.length;
    const response = await owner.client.post('/api/studies', { title });
    expect(response.status).toBe(400);
    expect(response.body.error.details[0].path).toBe('title');
    expect((await owner.client.get('/api/studies')).body.studies).toHaveLength(before);
  });

  it('accepts a title of exactly the longest length', async () => {
    const response = await owner.client.post('/api/studies', { title: 'y'.repeat(STUDY_TITLE_MAX) });
    expect(response.status).toBe(201);
  });

  it('answers 400 for a missing title and for malformed JSON', async () => {
    expect((await owner.client.post('/api/studies', { description: 'no title' })).status).toBe(400);
    const malformed = await owner.client.send('POST', '/api/studies', { rawBody: "{'title': 'single quotes'}" });
    expect(malformed.status).toBe(400);
    expect(malformed.body.error).toMatchObject({ code: 'invalid_json', message: 'The request body is not valid JSON.' });
  });
});

describe('listing studies', () => {
  it('lists member studies with role and counts, most recently changed first', async () => {
    const person = await newPerson(server, 'lister');
    const first = await newStudy(person.client, 'First');
    const second = await newStudy(owner.client, 'Second');
    await addMember(owner.client, second, person.email, 'viewer');
    await newNote(person.client, first);

    const list = (await person.client.get('/api/studies')).body.studies;
    expect(list.map((study: { id: number }) => study.id)).toEqual([first, second]);
    expect(list[0]).toEqual({
      id: first,
      title: 'First',
      description: '',
      myRole: 'owner',
      memberCount: 1,
      entryCount: 1,
      updatedAt: expect.any(String),
    });
    expect(list[1]).toMatchObject({ id: second, myRole: 'viewer', memberCount: 2, entryCount: 0 });
  });

  it('shows an admin every study, with a null role where not a member', async () => {
    const study = await newStudy(owner.client, 'Admin can see');
    const list = (await admin.get('/api/studies')).body.studies;
    expect(list.find((item: { id: number }) => item.id === study)).toMatchObject({ myRole: null, memberCount: 1 });
  });

  it('hides studies from non-members', async () => {
    const study = await newStudy(owner.client, 'Private');
    const outsider = await newPerson(server, 'outsider');
    expect((await outsider.client.get('/api/studies')).body.studies).toEqual([]);
    const response = await outsider.client.get(`/api/studies/${study}`);
    expect(response.status).toBe(404);
    expect(response.text).not.toContain('Private');
  });
});

describe('one study', () => {
  it.each(['999999', 'abc', '0', '1.5', '-1'])('answers 404 for the study id %s', async (id) => {
    const response = await owner.client.get(`/api/studies/${id}`);
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('not_found');
  });

  it('lets an editor change title and description', async () => {
    const study = await newStudy(owner.client);
    const editor = await newPerson(server, 'editor');
    await addMember(owner.client, study, editor.email, 'editor');
    const changed = await editor.client.patch(`/api/studies/${study}`, { title: 'Renamed', description: 'Now with text' });
    expect(changed.status).toBe(200);
    expect(changed.body.study).toMatchObject({ id: study, title: 'Renamed', description: 'Now with text' });
    const tooLong = await editor.client.patch(`/api/studies/${study}`, { title: 'z'.repeat(STUDY_TITLE_MAX + 1) });
    expect(tooLong.status).toBe(400);
    expect((await editor.client.get(`/api/studies/${study}`)).body.study.title).toBe('Renamed');
  });

  it('deletes a study with its entries and members', async () => {
    const study = await newStudy(owner.client);
    const viewer = await newPerson(server, 'viewer');
    await addMember(owner.client, study, viewer.email, 'viewer');
    await newNote(owner.client, study);
    expect((await owner.client.delete(`/api/studies/${study}`)).status).toBe(204);
    expect((await owner.client.get(`/api/studies/${study}`)).status).toBe(404);
    expect((await viewer.client.get('/api/studies')).body.studies).toEqual([]);
    expect((await admin.get(`/api/studies/${study}/entries`)).status).toBe(404);
  });
});
