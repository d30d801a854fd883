// proxy.ts: pages need a session, the sign-in and sign-up pages do not, and API routes answer for themselves.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, signIn, startTestServer, type TestServer } from '../support/server';

let server: TestServer;

beforeAll(async () => {
  server = await startTestServer();
});
afterAll(() => server?.stop());

describe('page access', () => {
  it.each(['/', '/studies', '/studies/1', '/admin/users', '/admin/mail', '/admin/mail/1', '/profile'])(
    'sends a visitor without a session from %s to the sign-in page, remembering where they were',
    async (pathname) => {
      const response = await new Client(server.baseUrl).get(`${pathname}?tab=notes`);
      expect(response.status).toBe(307);
      const location = new URL(response.headers.get('location')!, server.baseUrl);
      expect(location.pathname).toBe('/sign-in');
      expect(location.searchParams.get('callbackUrl')).toBe(`${pathname}?tab=notes`);
    },
  );

  it.each(['/sign-in', '/sign-up', '/forgot-password', '/invite/not-a-link', '/reset-password/not-a-link'])('serves %s without a session', async (pathname) => {
    const response = await new Client(server.baseUrl).get(pathname);
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toContain('text/html');
  });

  it('lets a signed-in member through to the pages', async () => {
    const { admin } = server.credentials;
    const client = await signIn(server.baseUrl, admin.email, admin.password);
    const response = await client.get('/studies');
    expect(response.status).toBe(200);
  });

  it('does not redirect API calls or files: they answer for themselves', async () => {
    const api = await new Client(server.baseUrl).get('/api/studies');
    expect(api.status).toBe(401);
    expect(api.headers.get('content-type')).toContain('application/json');
    expect(api.body.error.code).toBe('unauthenticated');
    const file = await new Client(server.baseUrl).get('/no-such-file.png');
    expect(file.status).toBe(404);
  });

  it('answers 404 for the page of a study or sample that does not exist or that the visitor may not see', async () => {
    const { admin, members } = server.credentials;
    const adminClient = await signIn(server.baseUrl, admin.email, admin.password);
    const outsider = await new Client(server.baseUrl).post('/api/signup', {
      name: 'Outsider',
      email: 'outsider@pages.test',
      password: 'outsider-password',
    });
    expect(outsider.status).toBe(201);
    const stranger = await signIn(server.baseUrl, 'outsider@pages.test', 'outsider-password');
    const member = await signIn(server.baseUrl, members[0].email, members[0].password);
    for (const [client, pathname, status] of [
      [adminClient, '/studies/999999', 404],
      [adminClient, '/samples/999999', 404],
      [adminClient, '/studies/not-an-id', 404],
      [stranger, '/studies/1', 404],
      [stranger, '/samples/1', 404],
      [member, '/studies/1', 200],
      [member, '/samples/1', 200],
    ] as const) {
      const page = await client.get(pathname);
      expect(page.status, pathname).toBe(status);
      if (status === 404) expect(page.text).toContain('Page not found');
    }
  });

  it('treats a forged session cookie as no session', async () => {
    const response = await fetch(`${server.baseUrl}/studies`, {
      redirect: 'manual',
      headers: { cookie: 'next-auth.session-token=not-a-token' },
    });
    expect(response.status).toBe(307);
  });
});
