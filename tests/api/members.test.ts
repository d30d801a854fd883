import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestServer, type TestServer } from '../support/server';
import { addMember, newPerson, newStudy, type Person } from './fixtures';

let server: TestServer;
let owner: Person;

beforeAll(async () => {
  server = await startTestServer();
  owner = await newPerson(server, 'owner');
});
afterAll(() => server?.stop());

async function members(studyId: number, reader = owner) {
  return (await reader.client.get(`/api/studies/${studyId}`)).body.members as { userId: number; role: string }[];
}

describe('study members', () => {
  it('adds a member by e-mail and lists owners first', async () => {
    const study = await newStudy(owner.client);
    const person = await newPerson(server, 'added');
    const added = await owner.client.post(`/api/studies/${study}/members`, { email: person.email.toUpperCase(), role: 'commenter' });
    expect(added.status).toBe(201);
    expect(added.body.member).toEqual({ userId: person.id, name: person.name, email: person.email, role: 'commenter' });
    expect(await members(study)).toEqual([
      expect.objectContaining({ userId: owner.id, role: 'owner' }),
      expect.objectContaining({ userId: person.id, role: 'commenter' }),
    ]);
    const detail = await person.client.get(`/api/studies/${study}`);
    expect(detail.body.myRole).toBe('commenter');
  });

  it('answers 409 for someone who is already a member', async () => {
    const study = await newStudy(owner.client);
    const person = await newPerson(server, 'twice');
    await addMember(owner.client, study, person.email, 'viewer');
    const again = await owner.client.post(`/api/studies/${study}/members`, { email: person.email, role: 'editor' });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('already_member');
    expect((await members(study)).find((member) => member.userId === person.id)?.role).toBe('viewer');
  });

  it('answers 404 for an e-mail without an account and 400 for an unknown role', async () => {
    const study = await newStudy(owner.client);
    const unknown = await owner.client.post(`/api/studies/${study}/members`, { email: 'ghost@fixtures.test', role: 'viewer' });
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.message).toContain('ghost@fixtures.test');
    const person = await newPerson(server, 'badrole');
    const badRole = await owner.client.post(`/api/studies/${study}/members`, { email: person.email, role: 'reader' });
    expect(badRole.status).toBe(400);
    expect(badRole.body.error.details).toEqual([{ path: 'role', message: 'Role must be one of: viewer, commenter, editor, owner' }]);
    expect(await members(study)).toHaveLength(1);
  });

  it('changes a role and removes a member', async () => {
    const study = await newStudy(owner.client);
    const person = await newPerson(server, 'changed');
    await addMember(owner.client, study, person.email, 'viewer');
    const changed = await owner.client.patch(`/api/studies/${study}/members/${person.id}`, { role: 'editor' });
    expect(changed.status).toBe(200);
    expect(changed.body.member.role).toBe('editor');
    expect((await owner.client.delete(`/api/studies/${study}/members/${person.id}`)).status).toBe(204);
    expect((await person.client.get(`/api/studies/${study}`)).status).toBe(404);
    expect((await owner.client.delete(`/api/studies/${study}/members/${person.id}`)).status).toBe(404);
  });

  it('keeps at least one owner', async () => {
    const study = await newStudy(owner.client);
    const demote = await owner.client.patch(`/api/studies/${study}/members/${owner.id}`, { role: 'editor' });
    expect(demote.status).toBe(409);
    expect(demote.body.error.code).toBe('last_owner');
    const remove = await owner.client.delete(`/api/studies/${study}/members/${owner.id}`);
    expect(remove.status).toBe(409);
    expect(await members(study)).toEqual([expect.objectContaining({ userId: owner.id, role: 'owner' })]);
  });

  it('hands ownership over: a second owner first, then the first steps down', async () => {
    const study = await newStudy(owner.client);
    const successor = await newPerson(server, 'successor');
    await addMember(owner.client, study, successor.email, 'owner');
    expect((await owner.client.patch(`/api/studies/${study}/members/${owner.id}`, { role: 'viewer' })).status).toBe(200);
    expect((await owner.client.post(`/api/studies/${study}/members`, { email: 'x@fixtures.test', role: 'viewer' })).status).toBe(403);
    expect((await successor.client.delete(`/api/studies/${study}/members/${owner.id}`)).status).toBe(204);
    expect(await members(study, successor)).toEqual([expect.objectContaining({ userId: successor.id, role: 'owner' })]);
  });
});
