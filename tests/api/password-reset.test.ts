// Password reset by mail: the request never tells whether an address has an account and is throttled; the link
// is signed, expiring and single-use; using it ends every session and API token of the account.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, signIn, type TestServer } from '../support/server';
import { newPerson, serverWithAdmin } from './fixtures';
import { eventually, expireNewestLink, linkToken, outbox, waitForMail } from './mail-fixtures';

let server: TestServer;
let admin: Client;

beforeAll(async () => {
  ({ server, admin } = await serverWithAdmin({ env: { SPLITFIELD_RESETS_PER_ADDRESS: '12', SPLITFIELD_RESETS_PER_ACCOUNT: '3' } }));
});
afterAll(() => server?.stop());

const anyone = () => new Client(server.baseUrl);

async function resetToken(email: string, count = 1): Promise<string> {
  return linkToken(await waitForMail(admin, email, /Reset your Splitfield password/, count), '/reset-password');
}

describe('password reset', () => {
  it('answers alike for known and unknown addresses, and mails only the account', async () => {
    const person = await newPerson(server, 'forgetful');
    const known = await anyone().post('/api/password-reset', { email: person.email.toUpperCase() });
    const unknown = await anyone().post('/api/password-reset', { email: 'nobody-here@fixtures.test' });
    expect(known.status).toBe(202);
    expect(unknown.status).toBe(202);
    expect(known.body.message.replace(person.email, 'X')).toBe(unknown.body.message.replace('nobody-here@fixtures.test', 'X'));
    const mail = await waitForMail(admin, person.email, /Reset your Splitfield password/);
    expect(mail.text).toContain(`Someone asked to reset the password of the Splitfield account ${person.email}.`);
    expect(mail.text).toContain('How to stop it: if it was not you, ignore this mail: your password stays as it is.');
    // The mail to the known address went out; nothing was queued for the unknown one.
    await eventually('the reset mail sent', async () =>
      (await outbox(admin)).queue.find((row) => row.to === person.email && row.state === 'sent'),
    );
    expect((await outbox(admin)).queue.filter((row) => row.to === 'nobody-here@fixtures.test')).toEqual([]);
    const bad = await anyone().post('/api/password-reset', { email: 'not-an-address' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('email');
  });

  it('sets the new password once, ending every session and API token', async () => {
    const person = await newPerson(server, 'reset');
    const second = await signIn(server.baseUrl, person.email, person.password);
    const token = await person.client.post('/api/tokens', { name: 'analysis script' });
    expect(token.status).toBe(201);
    await anyone().post('/api/password-reset', { email: person.email });
    const link = await resetToken(person.email);
    expect((await anyone().get(`/reset-password/${link}`)).text).toContain('Set new password');

    const short = await anyone().post('/api/password-reset/complete', { token: link, password: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.error.details[0].path).toBe('password');
    const done = await anyone().post('/api/password-reset/complete', { token: link, password: 'a-brand-new-password' });
    expect(done.status, done.text).toBe(200);
    expect(done.body).toEqual({ email: person.email, endedSessions: 2, revokedTokens: 1 });

    expect((await person.client.get('/api/me')).status).toBe(401);
    expect((await second.get('/api/me')).status).toBe(401);
    const bearer = await anyone().send('GET', '/api/me', { headers: { authorization: `Bearer ${token.body.secret}` } });
    expect(bearer.status).toBe(401);
    await expect(signIn(server.baseUrl, person.email, person.password)).rejects.toThrow();
    expect((await (await signIn(server.baseUrl, person.email, 'a-brand-new-password')).get('/api/me')).status).toBe(200);

    const reused = await anyone().post('/api/password-reset/complete', { token: link, password: 'yet-another-password' });
    expect(reused.status).toBe(410);
    expect(reused.body.error.code).toBe('link_used');
    expect((await anyone().get(`/reset-password/${link}`)).text).toContain('already used');
  });

  it('refuses tampered and expired links, and spends the older links of the account', async () => {
    const person = await newPerson(server, 'expiry');
    await anyone().post('/api/password-reset', { email: person.email });
    const first = await resetToken(person.email);
    const [nonce, signature] = first.split('.');
    const tampered = `${nonce}.${signature.slice(0, -1)}${signature.endsWith('A') ? 'B' : 'A'}`;
    const forged = await anyone().post('/api/password-reset/complete', { token: tampered, password: 'forged-password' });
    expect(forged.status).toBe(404);
    expect(forged.body.error.code).toBe('link_invalid');

    await expireNewestLink(server, 'password_resets');
    const expired = await anyone().post('/api/password-reset/complete', { token: first, password: 'too-late-password' });
    expect(expired.status).toBe(410);
    expect(expired.body.error.code).toBe('link_expired');

    await anyone().post('/api/password-reset', { email: person.email });
    await anyone().post('/api/password-reset', { email: person.email });
    const second = await resetToken(person.email, 2);
    const third = await resetToken(person.email, 3);
    expect((await anyone().post('/api/password-reset/complete', { token: third, password: 'third-link-password' })).status).toBe(200);
    const older = await anyone().post('/api/password-reset/complete', { token: second, password: 'second-link-password' });
    expect(older.body.error.code).toBe('link_used');
    await expect(signIn(server.baseUrl, person.email, 'second-link-password')).rejects.toThrow();
  });

  it('sends an account at most its share of reset mails, and throttles an address', async () => {
    const person = await newPerson(server, 'flooded');
    for (let i = 0; i < 4; i += 1) expect((await anyone().post('/api/password-reset', { email: person.email })).status).toBe(202);
    await resetToken(person.email, 3);
    await new Promise((resolve) => setTimeout(resolve, 3000));
    expect((await outbox(admin)).queue.filter((row) => row.to === person.email)).toHaveLength(3);
    // 3 + 1 + 3 + 4 = 11 requests so far from this address in this file; the limit is 12.
    const answers = [];
    for (let i = 0; i < 3; i += 1) answers.push(await anyone().post('/api/password-reset', { email: 'who@fixtures.test' }));
    expect(answers.map((answer) => answer.status)).toEqual([202, 429, 429]);
    expect(answers[1].headers.get('retry-after')).toMatch(/^\d+$/);
    expect(answers[1].body.error.message).toMatch(/^Too many password reset requests from your address/);
  });
});
