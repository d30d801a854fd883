// Which pages need a session, and where someone without one is sent. Pure, for proxy.ts.
export const SIGN_IN_PATH = '/sign-in';

/** The request header in which proxy.ts tells the signed-in pages' layout the requested path. */
export const PATHNAME_HEADER = 'x-splitfield-pathname';

// Invitation and password reset links are opened by people who may have no session (or no account yet).
const PUBLIC_PAGES = [SIGN_IN_PATH, '/sign-up', '/invite', '/forgot-password', '/reset-password'];

export function isPublicPage(pathname: string): boolean {
  return PUBLIC_PAGES.some((page) => pathname === page || pathname.startsWith(`${page}/`));
}

/** The sign-in page, told where to return afterwards (a path on this site only). */
export function signInRedirect(requested: URL): URL {
  const target = new URL(SIGN_IN_PATH, requested);
  target.searchParams.set('callbackUrl', `${requested.pathname}${requested.search}`);
  return target;
}
