import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import { verifyCredentials } from './credentials';
import { authSecret } from './secret';
import { endServerSession, SESSION_MAX_AGE_SECONDS, startServerSession } from './server-sessions';
import { activeUserForToken } from './session';
import { SIGN_IN_PATH } from './paths';

/** Thrown from the jwt callback so next-auth clears the cookie of a session that no longer counts. */
class SessionRevoked extends Error {
  override name = 'SessionRevoked';
}

let options: NextAuthOptions | undefined;

/** next-auth's settings, built on first use so that `next build` never needs the secret. */
export function authOptions(): NextAuthOptions {
  options ??= {
    secret: authSecret(),
    session: { strategy: 'jwt', maxAge: SESSION_MAX_AGE_SECONDS },
    pages: { signIn: SIGN_IN_PATH, error: SIGN_IN_PATH },
    providers: [
      CredentialsProvider({
        name: 'e-mail and password',
        credentials: {
          email: { label: 'E-mail', type: 'email' },
          password: { label: 'Password', type: 'password' },
        },
        async authorize(fields) {
          const user = await verifyCredentials(fields);
          if (!user) return null;
          const { id, name, email, siteRole, sessionVersion } = user;
          return { id: String(id), name, email, siteRole, sessionVersion };
        },
      }),
    ],
    callbacks: {
      async jwt({ token, user }) {
        if (user) {
          // Every use re-reads the user and this row, so ending a session does not wait for the token's expiry.
          const sid = await startServerSession(Number(user.id));
          return { ...token, siteRole: user.siteRole, sessionVersion: user.sessionVersion, sid };
        }
        const current = await activeUserForToken(token);
        if (!current) throw new SessionRevoked('The account was disabled or its sessions were ended.');
        return { ...token, name: current.name, email: current.email, siteRole: current.siteRole };
      },
      session({ session, token }) {
        session.user = {
          id: Number(token.sub),
          name: token.name ?? '',
          email: token.email ?? '',
          siteRole: token.siteRole ?? 'member',
        };
        return session;
      },
    },
    events: {
      // The browser forgets its cookie; the server forgets the session, so a copy of the cookie stops working.
      async signOut({ token }) {
        await endServerSession(token?.sid);
      },
    },
    logger: {
      error(code, metadata) {
        // A revoked session is expected, not a fault worth a stack trace.
        if (metadata instanceof SessionRevoked) return;
        console.error(`[auth] ${code}`, metadata);
      },
      warn(code) {
        console.warn(`[auth] ${code}`);
      },
      debug() {},
    },
  };
  return options;
}
