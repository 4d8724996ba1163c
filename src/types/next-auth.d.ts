import type { SiteRole } from '@/lib/auth/permissions';

declare module 'next-auth' {
  interface User {
    id: string;
    siteRole: SiteRole;
  }
  interface Session {
    user: { id: string; name: string; email: string; siteRole: SiteRole };
    /** The user_sessions row this session belongs to (opaque; useless without the signed cookie). */
    sid: string;
  }
}

declare module 'next-auth/jwt' {
  interface JWT {
    uid?: string;
    siteRole?: SiteRole;
    /** The user_sessions row, written at sign-in; the server refuses the token once that row is ended. */
    sid?: string;
  }
}
