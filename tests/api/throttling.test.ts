// Guessing is throttled: failed sign-ins per account and per client address (a made-up X-Forwarded-For does not
// help), sign-ups per address, wrong current passwords and unknown API tokens; over a limit the answer is 429
// with the time to wait. The limits are the defaults of README "Configuration".
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, postSignIn, signIn, type TestServer } from '../support/server';
import { newAccount, serverWithAdmin } from './fixtures';

let server: TestServer;

beforeAll(async () => {
  // '' = the default sign-up limit (the test harness raises it for the other files).
  ({ server } = await serverWithAdmin({ env: { SPLITFIELD_SIGNUPS_PER_ADDRESS: '' } }));
});
afterAll(() => server?.stop());

/** next-auth's error code of a sign-in answer. */
function signInError(answer: { body: { url?: string } }): string | null {
  return answer.body?.url ? new URL(answer.body.url).searchParams.get('error') : null;
}

describe('sign-in throttling', () => {
  it('blocks an account after 10 failed sign-ins, even with the right password, and says when to retry', async () => {
    const person = await newAccount(server, 'guessed');
    for (let i = 0; i < 10; i++) {
      const wrong = await postSignIn(new Client(server.baseUrl), person.email, `wrong-${i}`);
      expect(wrong.status).toBe(401);
    }
    const blocked = await postSignIn(new Client(server.baseUrl), person.email, person.password);
    expect(blocked.status).toBe(429);
    const retryAfter = Number(blocked.headers.get('retry-after'));
    expect(retryAfter).toBeGreaterThan(0);
    expect(retryAfter).toBeLessThanOrEqual(900);
    expect(signInError(blocked)).toBe(`TooManyAttempts:${retryAfter}`);
    expect(blocked.body.error.message).toMatch(/Too many failed sign-in attempts\. Try again in \d+ (seconds|minutes)\./);
    // Another account from the same address is not blocked by this one's failures.
    const other = await newAccount(server, 'bystander');
    expect((await postSignIn(new Client(server.baseUrl), other.email, other.password)).status).toBe(200);
  });

  it('forgets an account’s failures after a successful sign-in', async () => {
    const person = await newAccount(server, 'forgetful');
    for (let round = 0; round < 2; round++) {
      for (let i = 0; i < 6; i++) await postSignIn(new Client(server.baseUrl), person.email, `wrong-${i}`);
      expect((await postSignIn(new Client(server.baseUrl), person.email, person.password)).status).toBe(200);
    }
  });
});

describe('per-address throttling', () => {
  let fresh: TestServer;
  beforeAll(async () => {
    ({ server: fresh } = await serverWithAdmin());
  });
  afterAll(() => fresh?.stop());

  it('blocks an address after 50 failures across accounts, whatever X-Forwarded-For says', async () => {
    for (let i = 0; i < 50; i++) {
      const client = new Client(fresh.baseUrl);
      const csrf = await client.get('/api/auth/csrf');
      const answer = await client.send('POST', '/api/auth/callback/credentials', {
        form: { csrfToken: csrf.body.csrfToken, email: `nobody-${i}@throttle.test`, password: 'wrong-password', json: 'true' },
        headers: { 'x-forwarded-for': `10.0.${i}.1`, [`x-splitfield-client-address`]: `10.1.${i}.1` },
      });
      expect(answer.status).toBe(401);
    }
    const person = await newAccount(fresh, 'late');
    const blocked = await postSignIn(new Client(fresh.baseUrl), person.email, person.password);
    expect(blocked.status).toBe(429);
    // Bearer requests with unknown tokens count against the same address, so they are refused now too.
    const script = await new Client(fresh.baseUrl).send('GET', '/api/me', { headers: { authorization: 'Bearer sft_guess' } });
    expect(script.status).toBe(429);
    expect(script.headers.get('retry-after')).toMatch(/^\d+$/);
  });
});

describe('other throttled requests', () => {
  it('blocks password changes after 10 wrong current passwords', async () => {
    const person = await newAccount(server, 'changer');
    const session = await signIn(server.baseUrl, person.email, person.password);
    for (let i = 0; i < 10; i++) {
      const wrong = await session.patch('/api/me', { currentPassword: `wrong-${i}`, newPassword: 'new-password-1' });
      expect(wrong.status).toBe(400);
    }
    const blocked = await session.patch('/api/me', { currentPassword: person.password, newPassword: 'new-password-1' });
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe('too_many_attempts');
  });

  it('limits sign-ups per address to 20 a window', async () => {
    // The fixture accounts made above count too; fill up to the limit, then one more is refused.
    let status = 201;
    let made = 0;
    while (status === 201 && made < 25) {
      const answer = await new Client(server.baseUrl).post('/api/signup', {
        name: 'Many',
        email: `many-${made}@throttle.test`,
        password: 'password-many',
      });
      status = answer.status;
      made += 1;
      if (status === 429) {
        expect(answer.body.error.code).toBe('too_many_attempts');
        expect(answer.body.error.message).toMatch(/Try again in/);
      }
    }
    expect(status).toBe(429);
  });
});
