import { signIn } from 'next-auth/react';
import { retryAfterText } from '@/lib/auth/retry-after';

/** Where to go after signing in: the page that sent the visitor here if it is on this site, else the studies. */
export function safeReturnPath(callbackUrl: string | undefined): string {
  if (!callbackUrl) return '/studies';
  try {
    const url = new URL(callbackUrl, window.location.origin);
    if (url.origin !== window.location.origin || url.pathname.startsWith('/sign-')) return '/studies';
    return `${url.pathname}${url.search}${url.hash}`;
  } catch {
    return '/studies';
  }
}

// next-auth reports a failed sign-in as a code; these are the ones the credentials check gives.
const signInMessages: Record<string, string> = {
  CredentialsSignin: 'Wrong email or password. Check both and try again.',
  AccountDisabled: 'This account is disabled. Ask an admin of this server to enable it.',
};

/** "TooManyAttempts:<seconds>" (the server's throttle, lib/auth/sign-in-throttle.ts) in words, or null. */
function throttledMessage(code: string): string | null {
  const match = /^TooManyAttempts:(\d+)$/.exec(code);
  if (!match) return null;
  return `Too many failed sign-in attempts. Try again in ${retryAfterText(Number(match[1]))}.`;
}

/** Signs in with next-auth's credentials provider; throws an Error with a message fit to show. */
export async function signInWithPassword(email: string, password: string): Promise<void> {
  const result = await signIn('credentials', { email, password, redirect: false });
  if (result?.ok && !result.error) return;
  const code = result?.error ?? 'CredentialsSignin';
  throw new Error(signInMessages[code] ?? throttledMessage(code) ?? `Sign-in failed (${code}).`);
}
