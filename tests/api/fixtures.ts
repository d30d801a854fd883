// People and studies made through the API itself, for the API tests.
import { expect } from 'vitest';
import type { StudyRole } from '@/models/vocabulary';
import { Client, signIn, startTestServer, type TestServer, type TestServerOptions } from '../support/server';

export interface Person {
  id: number;
  name: string;
  email: string;
  password: string;
  /** Signed in as this person. */
  client: Client;
}

/** A fresh server and its demo admin, signed in. */
export async function serverWithAdmin(options?: TestServerOptions): Promise<{ server: TestServer; admin: Client }> {
  const server = await startTestServer(options);
  const { email, password } = server.credentials.admin;
  return { server, admin: await signIn(server.baseUrl, email, password) };
}

/** A fresh server, its demo admin and a new member account labelled 'owner', both signed in. */
export async function serverWithOwner(options?: TestServerOptions): Promise<{ server: TestServer; admin: Client; owner: Person }> {
  const { server, admin } = await serverWithAdmin(options);
  return { server, admin, owner: await newPerson(server, 'owner') };
}

let made = 0;

/** A new member account made through open sign-up, not signed in. */
export async function newAccount(server: TestServer, label = 'person'): Promise<Omit<Person, 'client'>> {
  made += 1;
  const tag = `${label}-${made}-${process.pid}`;
  const fields = { name: `Person ${tag}`, email: `${tag}@fixtures.test`, password: `password-${tag}` };
  const created = await new Client(server.baseUrl).post('/api/signup', fields);
  expect(created.status, created.text).toBe(201);
  return { ...fields, id: created.body.user.id };
}

/** A new member account, signed in. */
export async function newPerson(server: TestServer, label = 'person'): Promise<Person> {
  const account = await newAccount(server, label);
  return { ...account, client: await signIn(server.baseUrl, account.email, account.password) };
}

export async function newStudy(owner: Client, title = 'Fixture study'): Promise<number> {
  const created = await owner.post('/api/studies', { title });
  expect(created.status, created.text).toBe(201);
  return created.body.study.id;
}

export async function addMember(owner: Client, studyId: number, email: string, role: StudyRole): Promise<void> {
  const added = await owner.post(`/api/studies/${studyId}/members`, { email, role });
  expect(added.status, added.text).toBe(201);
}

export async function newNote(editor: Client, studyId: number, body = 'A note.'): Promise<number> {
  const created = await editor.post(`/api/studies/${studyId}/entries`, { kind: 'note', body });
  expect(created.status, created.text).toBe(201);
  return created.body.entry.id;
}
