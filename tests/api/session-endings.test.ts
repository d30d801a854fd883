// Sessions end on the server: a password change ends every other session (and the API tokens unless kept),
// a sign-out ends that session even for a copy of its cookie, "sign out everywhere" ends them all; disabling an
// account ends its tokens for good; two admins demoting or disabling each other at once leave one admin.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDatabase } from '@/lib/db/connection';
import { Client, signIn, type TestServer } from '../support/server';
import { newAccount, serverWithAdmin } from './fixtures';

let server: TestServer;
let admin: Client;

beforeAll(async () => {
  ({ server, admin } = await serverWithAdmin());
});
afterAll(() => server?.stop());

function withToken(secret: string) {
  const client = new Client(server.baseUrl);
  return { get: (path: string) => client.send('GET', path, { headers: { authorization: `Bearer ${secret}` } }) };
}

/** A client holding a copy of another client's cookies. */
function copyOf(client: Client): Client {
  const copy = new Client(server.baseUrl);
  const cookie = client.cookieList().map(({ name, value }) => `${name}=${value}`).join('; ');
  return Object.assign(copy, {
    get: (path: string) => copy.send('GET', path, { headers: { cookie } }),
  });
}

async function signOut(client: Client) {
  const csrf = await client.get('/api/auth/csrf');
  const answer = await client.send('POST', '/api/auth/signout', { form: { csrfToken: csrf.body.csrfToken, json: 'true' } });
  expect(answer.status, answer.text).toBe(200);
}

describe('ending sessions', () => {
  it('ends every other session and revokes the API tokens when the password changes', async () => {
    const person = await newAccount(server, 'changer');
    const here = await signIn(server.baseUrl, person.email, person.password);
    const elsewhere = await signIn(server.baseUrl, person.email, person.password);
    const token = (await here.post('/api/tokens', { name: 'nightly' })).body.secret;
    expect((await withToken(token).get('/api/me')).status).toBe(200);

    const changed = await here.patch('/api/me', { currentPassword: person.password, newPassword: 'a-new-password-1' });
    expect(changed.status, changed.text).toBe(200);
    expect(changed.body).toMatchObject({ endedSessions: 1, revokedTokens: 1 });
    expect((await elsewhere.get('/api/me')).status).toBe(401);
    expect((await withToken(token).get('/api/me')).status).toBe(401);
    expect((await here.get('/api/me')).status).toBe(200);
  });

  it('keeps the API tokens when asked to', async () => {
    const person = await newAccount(server, 'keeper');
    const here = await signIn(server.baseUrl, person.email, person.password);
    const token = (await here.post('/api/tokens', { name: 'kept' })).body.secret;
    const changed = await here.patch('/api/me', {
      currentPassword: person.password,
      newPassword: 'another-password-2',
      keepApiTokens: true,
    });
    expect(changed.body).toMatchObject({ endedSessions: 0, revokedTokens: 0 });
    expect((await withToken(token).get('/api/me')).status).toBe(200);
  });

  it('ends the session on the server at sign-out, so a copied cookie stops working', async () => {
    const person = await newAccount(server, 'leaver');
    const session = await signIn(server.baseUrl, person.email, person.password);
    const copy = copyOf(session);
    expect((await copy.get('/api/me')).status).toBe(200);
    await signOut(session);
    expect((await copy.get('/api/me')).status).toBe(401);
    expect((await copy.get('/api/auth/session')).body).toEqual({});
  });

  it('signs out everywhere, this session included, and keeps the tokens', async () => {
    const person = await newAccount(server, 'everywhere');
    const one = await signIn(server.baseUrl, person.email, person.password);
    const two = await signIn(server.baseUrl, person.email, person.password);
    const token = (await one.post('/api/tokens', { name: 'stays' })).body.secret;
    expect((await one.delete('/api/me/sessions')).status).toBe(204);
    expect((await one.get('/api/me')).status).toBe(401);
    expect((await two.get('/api/me')).status).toBe(401);
    expect((await withToken(token).get('/api/me')).status).toBe(200);
    expect((await signIn(server.baseUrl, person.email, person.password).then((again) => again.get('/api/me'))).status).toBe(200);
  });

  it('ends an account’s API tokens for good when it is disabled', async () => {
    const person = await newAccount(server, 'tokened');
    const session = await signIn(server.baseUrl, person.email, person.password);
    const token = (await session.post('/api/tokens', { name: 'before the disable' })).body.secret;
    expect((await admin.patch(`/api/admin/users/${person.id}`, { disabled: true })).status).toBe(200);
    expect((await admin.patch(`/api/admin/users/${person.id}`, { disabled: false })).status).toBe(200);
    expect((await withToken(token).get('/api/me')).status).toBe(401);
  });
});

describe('the last admin', () => {
  async function secondAdmin(label: string) {
    const person = await newAccount(server, label);
    expect((await admin.patch(`/api/admin/users/${person.id}`, { siteRole: 'admin' })).status).toBe(200);
    return { ...person, client: await signIn(server.baseUrl, person.email, person.password) };
  }

  async function enabledAdmins(): Promise<number> {
    const database = openDatabase(server.databasePath);
    try {
      return await database.models.User.count({ where: { siteRole: 'admin', disabled: false } });
    } finally {
      await database.sequelize.close();
    }
  }

  for (const change of [{ siteRole: 'member' }, { disabled: true }] as const) {
    it(`keeps one when two admins change each other at once (${JSON.stringify(change)})`, async () => {
      const other = await secondAdmin(`rival-${Object.keys(change)[0]}`);
      const me = (await admin.get('/api/me')).body.user;
      const admins = await enabledAdmins();
      const answers = await Promise.all([
        admin.patch(`/api/admin/users/${other.id}`, change),
        other.client.patch(`/api/admin/users/${me.id}`, change),
      ]);
      const statuses = answers.map((answer) => answer.status).sort();
      expect(statuses.filter((status) => status === 200)).toHaveLength(1);
      expect(statuses.find((status) => status !== 200)).toBeGreaterThanOrEqual(403);
      expect(await enabledAdmins()).toBe(admins - 1);
      // Restore: whoever stayed admin brings the other back.
      const winner = answers[0].status === 200 ? admin : other.client;
      const loserId = answers[0].status === 200 ? other.id : me.id;
      expect((await winner.patch(`/api/admin/users/${loserId}`, { siteRole: 'admin', disabled: false })).status).toBe(200);
    });
  }
});
