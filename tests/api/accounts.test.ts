import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, postSignIn, signIn, type TestServer } from '../support/server';
import { serverWithAdmin } from './fixtures';

let server: TestServer;
let admin: Client;

beforeAll(async () => {
  ({ server, admin } = await serverWithAdmin());
});
afterAll(() => server?.stop());

let counter = 0;
function newPerson() {
  counter += 1;
  return { name: `Person ${counter}`, email: `person${counter}@accounts.test`, password: `pass-word-${counter}` };
}

describe('sign-up and sign-in', () => {
  it('creates an account that can then sign in and read itself', async () => {
    const person = newPerson();
    const created = await new Client(server.baseUrl).post('/api/signup', person);
    expect(created.status).toBe(201);
    expect(created.body.user).toEqual({ id: expect.any(Number), name: person.name, email: person.email, siteRole: 'member' });
    expect(created.text).not.toContain('password');

    const client = await signIn(server.baseUrl, person.email, person.password);
    const me = await client.get('/api/me');
    expect(me.status).toBe(200);
    expect(me.body.user).toEqual(created.body.user);
  });

  it('keeps e-mails case-insensitive and trimmed', async () => {
    const person = newPerson();
    const created = await new Client(server.baseUrl).post('/api/signup', { ...person, email: `  ${person.email.toUpperCase()} ` });
    expect(created.status).toBe(201);
    expect(created.body.user.email).toBe(person.email);
    await expect(signIn(server.baseUrl, person.email.toUpperCase(), person.password)).resolves.toBeInstanceOf(Client);
  });

  it('refuses a wrong password without a session', async () => {
    const person = newPerson();
    await new Client(server.baseUrl).post('/api/signup', person);
    const client = new Client(server.baseUrl);
    const attempt = await postSignIn(client, person.email, `${person.password}x`);
    expect(attempt.status).toBe(401);
    expect(attempt.body.url).toContain('error=CredentialsSignin');
    expect((await client.get('/api/me')).status).toBe(401);
  });

  it('refuses an unknown e-mail the same way as a wrong password', async () => {
    const attempt = await postSignIn(new Client(server.baseUrl), 'nobody@accounts.test', 'whatever-password');
    expect(attempt.status).toBe(401);
    expect(attempt.body.url).toContain('error=CredentialsSignin');
  });

  it('answers 409 for an e-mail that already has an account, in any case', async () => {
    const person = newPerson();
    expect((await new Client(server.baseUrl).post('/api/signup', person)).status).toBe(201);
    const again = await new Client(server.baseUrl).post('/api/signup', { ...person, email: person.email.toUpperCase() });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('email_taken');
    const users = await admin.get('/api/admin/users');
    expect(users.body.users.filter((user: { email: string }) => user.email === person.email)).toHaveLength(1);
  });

  it('names each invalid field', async () => {
    const response = await new Client(server.baseUrl).post('/api/signup', { name: '', email: 'not-an-address', password: 'short' });
    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('invalid_input');
    expect(response.body.error.details.map((detail: { path: string }) => detail.path).sort()).toEqual(['email', 'name', 'password']);
    expect(response.body.error.message).toContain('password: Password must be at least 8 characters');
  });

  it('answers 400 invalid_json for a body that is not JSON, and for an empty one', async () => {
    for (const rawBody of ['{"name": "x",', '']) {
      const response = await new Client(server.baseUrl).send('POST', '/api/signup', { rawBody });
      expect(response.status).toBe(400);
      expect(response.body.error.code).toBe('invalid_json');
    }
  });

  it('rejects fields it does not know', async () => {
    const response = await new Client(server.baseUrl).post('/api/signup', { ...newPerson(), siteRole: 'admin' });
    expect(response.status).toBe(400);
    expect(response.body.error.details[0].path).toBe('(body)');
  });

  it('answers 403 while sign-up is closed, and tells the sign-up page', async () => {
    expect((await admin.patch('/api/admin/settings', { openSignup: false })).body).toEqual({ openSignup: false });
    try {
      expect((await new Client(server.baseUrl).get('/api/signup')).body).toEqual({ openSignup: false });
      const refused = await new Client(server.baseUrl).post('/api/signup', newPerson());
      expect(refused.status).toBe(403);
      expect(refused.body.error.message).toMatch(/closed/);
    } finally {
      await admin.patch('/api/admin/settings', { openSignup: true });
    }
    expect((await new Client(server.baseUrl).post('/api/signup', newPerson())).status).toBe(201);
  });
});

describe('own profile', () => {
  it('changes the name', async () => {
    const person = newPerson();
    await new Client(server.baseUrl).post('/api/signup', person);
    const client = await signIn(server.baseUrl, person.email, person.password);
    const changed = await client.patch('/api/me', { name: '  New Name  ' });
    expect(changed.status).toBe(200);
    expect(changed.body.user.name).toBe('New Name');
    expect((await client.get('/api/auth/session')).body.user.name).toBe('New Name');
  });

  it('changes the password only with the right current one', async () => {
    const person = newPerson();
    await new Client(server.baseUrl).post('/api/signup', person);
    const client = await signIn(server.baseUrl, person.email, person.password);

    const wrong = await client.patch('/api/me', { currentPassword: 'not-the-password', newPassword: 'brand-new-pass' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.details[0].path).toBe('currentPassword');
    const half = await client.patch('/api/me', { newPassword: 'brand-new-pass' });
    expect(half.status).toBe(400);

    const right = await client.patch('/api/me', { currentPassword: person.password, newPassword: 'brand-new-pass' });
    expect(right.status).toBe(200);
    expect((await postSignIn(new Client(server.baseUrl), person.email, person.password)).status).toBe(401);
    await expect(signIn(server.baseUrl, person.email, 'brand-new-pass')).resolves.toBeInstanceOf(Client);
  });

  it('answers 400 for an empty change', async () => {
    const response = await admin.patch('/api/me', {});
    expect(response.status).toBe(400);
    expect(response.body.error.message).toContain('at least one field');
  });
});
