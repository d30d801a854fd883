// Sends visitors without a session to the sign-in page. API routes are not matched: they check the session
// themselves and answer 401 as JSON (and uploads must stream past this layer untouched).
import { getToken } from 'next-auth/jwt';
import { NextResponse, type NextRequest } from 'next/server';
import { isPublicPage, signInRedirect } from '@/lib/auth/paths';
import { authSecret } from '@/lib/auth/secret';

export async function proxy(request: NextRequest) {
  if (isPublicPage(request.nextUrl.pathname)) return NextResponse.next();
  // Only the token's signature and expiry are checked here; pages re-read the user (currentUser()).
  const token = await getToken({ req: request, secret: authSecret() });
  if (token) return NextResponse.next();
  return NextResponse.redirect(signInRedirect(new URL(request.url)));
}

export const config = {
  // Everything but API routes, Next's own files and files with an extension (fonts, images, icons).
  matcher: ['/((?!api(?:/|$)|_next/|[^?]*\\.[A-Za-z0-9]+$).*)'],
};
