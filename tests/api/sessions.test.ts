// Sessions end the moment an admin disables the account, and stay ended when it is enabled again.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, postSignIn, signIn, type TestServer } from '../support/server';
import { serverWithAdmin } from './fixtures';

let server: TestServer;
let admin: Client;

beforeAll(async () => {
  ({ server, admin } = await serverWithAdmin());
});
afterAll(() => server?.stop());

async function newMember(tag: string) {
  const person = { name: `Member ${tag}`, email: `${tag}@sessions.test`, password: `password-${tag}` };
  const created = await new Client(server.baseUrl).post('/api/signup', person);
  expect(created.status).toBe(201);
  return { ...person, id: created.body.user.id as number };
}

describe('session revocation', () => {
  it('ends a disabled user’s session at once and refuses their sign-in', async () => {
    const member = await newMember('disabled');
    const session = await signIn(server.baseUrl, member.email, member.password);
    expect((await session.get('/api/studies')).status).toBe(200);

    const disabled = await admin.patch(`/api/admin/users/${member.id}`, { disabled: true });
    expect(disabled.status).toBe(200);
    expect(disabled.body.user).toMatchObject({ id: member.id, disabled: true });

    expect((await session.get('/api/studies')).status).toBe(401);
    expect((await session.get('/api/me')).status).toBe(401);
    expect((await session.get('/api/auth/session')).body).toEqual({});
    const attempt = await postSignIn(new Client(server.baseUrl), member.email, member.password);
    expect(attempt.status).toBe(401);
    expect(attempt.body.url).toContain('error=AccountDisabled');
  });

  it('does not bring old sessions back when the account is enabled again', async () => {
    const member = await newMember('reenabled');
    const oldSession = await signIn(server.baseUrl, member.email, member.password);
    await admin.patch(`/api/admin/users/${member.id}`, { disabled: true });
    await admin.patch(`/api/admin/users/${member.id}`, { disabled: false });

    expect((await oldSession.get('/api/me')).status).toBe(401);
    const newSession = await signIn(server.baseUrl, member.email, member.password);
    expect((await newSession.get('/api/me')).status).toBe(200);
  });

  it('applies a site role change to the next request of an existing session', async () => {
    const member = await newMember('promoted');
    const session = await signIn(server.baseUrl, member.email, member.password);
    expect((await session.get('/api/admin/users')).status).toBe(403);
    await admin.patch(`/api/admin/users/${member.id}`, { siteRole: 'admin' });
    expect((await session.get('/api/admin/users')).status).toBe(200);
    expect((await session.get('/api/auth/session')).body.user).toMatchObject({ id: member.id, siteRole: 'admin' });
  });

  it('does not let an admin disable or demote themselves', async () => {
    const me = (await admin.get('/api/me')).body.user;
    for (const change of [{ disabled: true }, { siteRole: 'member' }]) {
      const refused = await admin.patch(`/api/admin/users/${me.id}`, change);
      expect(refused.status).toBe(409);
      expect(refused.body.error.code).toBe('self_lockout');
    }
    expect((await admin.get('/api/admin/users')).status).toBe(200);
  });

  it('lists users for admins without secrets', async () => {
    const list = await admin.get('/api/admin/users');
    expect(list.body.users[0]).toEqual({
      id: expect.any(Number),
      name: expect.any(String),
      email: server.credentials.admin.email,
      siteRole: 'admin',
      disabled: false,
      createdAt: expect.any(String),
    });
    expect(list.text).not.toMatch(/passwordHash|sessionVersion/);
  });

  it('answers 404 for an unknown user and 400 for an unknown site role', async () => {
    expect((await admin.patch('/api/admin/users/999999', { disabled: true })).status).toBe(404);
    const member = await newMember('badrole');
    const response = await admin.patch(`/api/admin/users/${member.id}`, { siteRole: 'superuser' });
    expect(response.status).toBe(400);
    expect(response.body.error.details[0]).toEqual({ path: 'siteRole', message: 'Site role must be one of: member, admin' });
  });

  it('rejects a session token signed with another secret', async () => {
    const response = await fetch(`${server.baseUrl}/api/me`, {
      headers: { cookie: 'next-auth.session-token=eyJhbGciOiJkaXIiLCJlbmMiOiJBMjU2R0NNIn0..x.y.z' },
    });
    expect(response.status).toBe(401);
    expect((await response.json()).error.code).toBe('unauthenticated');
  });
});
