// next-auth's own endpoints: csrf, session, sign-in callback, sign-out.
import NextAuth from 'next-auth';
import type { NextRequest } from 'next/server';
import { authOptions } from '@/lib/auth/options';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

type NextAuthContext = { params: Promise<{ nextauth: string[] }> };

function handle(request: NextRequest, context: NextAuthContext) {
  return NextAuth(authOptions())(request, context);
}

export { handle as GET, handle as POST };
