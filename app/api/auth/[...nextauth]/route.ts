// next-auth's own endpoints: csrf, session, sign-in callback (throttled), sign-out.
import NextAuth from 'next-auth';
import type { NextRequest } from 'next/server';
import { authOptions } from '@/lib/auth/options';
import { throttledAuth } from '@/lib/auth/sign-in-throttle';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

type NextAuthContext = { params: Promise<{ nextauth: string[] }> };

function handle(request: NextRequest, context: NextAuthContext) {
  return throttledAuth(request, (forwarded) => NextAuth(authOptions())(forwarded, context));
}

export { handle as GET, handle as POST };
