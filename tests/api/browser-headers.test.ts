// Browser security headers on pages and API answers: a Content-Security-Policy (a fresh nonce per page, carried
// by the page's own scripts), no framing, no content sniffing, referrers only to this site.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, type TestServer } from '../support/server';
import { serverWithAdmin } from './fixtures';

let server: TestServer, admin: Client;

beforeAll(async () => {
  ({ server, admin } = await serverWithAdmin());
});
afterAll(() => server?.stop());

function expectCommonHeaders(headers: Headers) {
  expect(headers.get('x-content-type-options')).toBe('nosniff');
  expect(headers.get('x-frame-options')).toBe('DENY');
  expect(headers.get('referrer-policy')).toBe('same-origin');
}

describe('security headers', () => {
  it('gives every page a policy with a fresh nonce that its scripts carry', async () => {
    const nonces = new Set<string>();
    for (const [client, path] of [
      [new Client(server.baseUrl), '/sign-in'],
      [admin, '/studies'],
      [admin, '/studies/1'],
      [admin, '/profile'],
    ] as const) {
      const page = await client.get(path);
      expect(page.status, path).toBe(200);
      expectCommonHeaders(page.headers);
      const policy = page.headers.get('content-security-policy') ?? '';
      expect(policy).toContain("frame-ancestors 'none'");
      expect(policy).toContain("object-src 'none'");
      expect(policy).toContain("img-src 'self' data: blob:");
      const nonce = /'nonce-([^']+)'/.exec(policy)?.[1];
      expect(nonce, path).toBeTruthy();
      nonces.add(nonce!);
      const scripts = [...page.text.matchAll(/<script\b[^>]*>/g)].map((match) => match[0]);
      expect(scripts.length).toBeGreaterThan(0);
      for (const script of scripts) expect(script, path).toContain(`nonce="${nonce}"`);
    }
    expect(nonces.size).toBe(4);
  });

  it('sends the redirect to the sign-in page with the headers too', async () => {
    const redirect = await new Client(server.baseUrl).get('/studies');
    expect(redirect.status).toBe(307);
    expectCommonHeaders(redirect.headers);
    expect(redirect.headers.get('content-security-policy')).toContain("frame-ancestors 'none'");
  });

  it('gives API answers a policy that renders nothing', async () => {
    for (const answer of [await admin.get('/api/me'), await new Client(server.baseUrl).get('/api/me')]) {
      expectCommonHeaders(answer.headers);
      expect(answer.headers.get('content-security-policy')).toBe("default-src 'none'; frame-ancestors 'none'");
    }
  });
});
