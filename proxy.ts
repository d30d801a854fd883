// Every page gets its Content-Security-Policy here, with a fresh nonce that Next.js puts on its scripts; visitors
// without a session are sent to the sign-in page. API routes are not matched: they check the session themselves
// and answer 401 as JSON (and uploads must stream past this layer untouched).
import { getToken } from 'next-auth/jwt';
import { NextResponse, type NextRequest } from 'next/server';
import { pageContentSecurityPolicy } from '@/lib/api/security-headers';
import { isPublicPage, PATHNAME_HEADER, signInRedirect } from '@/lib/auth/paths';
import { authSecret } from '@/lib/auth/secret';

const CSP = 'Content-Security-Policy';

export async function proxy(request: NextRequest) {
  const nonce = Buffer.from(crypto.getRandomValues(new Uint8Array(16))).toString('base64');
  const policy = pageContentSecurityPolicy(nonce);
  const withPolicy = (response: NextResponse) => {
    response.headers.set(CSP, policy);
    return response;
  };
  // Only the token's signature and expiry are checked here; pages re-read the user (currentUser()).
  if (!isPublicPage(request.nextUrl.pathname) && !(await getToken({ req: request, secret: authSecret() }))) {
    return withPolicy(NextResponse.redirect(signInRedirect(new URL(request.url))));
  }
  const headers = new Headers(request.headers);
  headers.set(CSP, policy);
  // For the layout's 404 of an unknown study or sample page (lib/auth/page-access.ts); always the real path.
  headers.set(PATHNAME_HEADER, request.nextUrl.pathname);
  return withPolicy(NextResponse.next({ request: { headers } }));
}

export const config = {
  // Everything but API routes, Next's own files and files with an extension (fonts, images, icons).
  matcher: ['/((?!api(?:/|$)|_next/|[^?]*\\.[A-Za-z0-9]+$).*)'],
};
