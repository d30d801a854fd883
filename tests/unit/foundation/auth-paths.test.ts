import { describe, expect, it } from 'vitest';
import { isPublicPage, signInRedirect } from '@/lib/auth/paths';

describe('public pages', () => {
  it.each(['/sign-in', '/sign-up', '/sign-in/', '/sign-up/confirm', '/invite/abc.def', '/forgot-password', '/reset-password/abc.def'])('%s needs no session', (pathname) => {
    expect(isPublicPage(pathname)).toBe(true);
  });

  it.each(['/', '/studies', '/sign-inside', '/admin/sign-in', '/sign-upper', '/invites', '/admin/mail'])('%s needs a session', (pathname) => {
    expect(isPublicPage(pathname)).toBe(false);
  });
});

describe('sign-in redirect', () => {
  it('keeps path and query of the requested page as the way back, on the same site', () => {
    const target = signInRedirect(new URL('http://127.0.0.1:3000/studies/4?tab=members'));
    expect(target.origin).toBe('http://127.0.0.1:3000');
    expect(target.pathname).toBe('/sign-in');
    expect(target.searchParams.get('callbackUrl')).toBe('/studies/4?tab=members');
  });
});
