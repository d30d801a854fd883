// What Splitfield adds to next-auth's user, session and token.
import type { SiteRole } from '@/models/vocabulary';

declare module 'next-auth' {
  interface User {
    siteRole: SiteRole;
    sessionVersion: number;
  }
  interface Session {
    user: { id: number; name: string; email: string; siteRole: SiteRole };
  }
}

declare module 'next-auth/jwt' {
  interface JWT {
    siteRole?: SiteRole;
    /** The user's sessionVersion when this token was issued. */
    sessionVersion?: number;
    /** The key of the session's row on the server (lib/auth/server-sessions.ts). */
    sid?: string;
  }
}
