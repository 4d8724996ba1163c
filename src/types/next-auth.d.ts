import type { SiteRole } from '@/lib/auth/permissions';

declare module 'next-auth' {
  interface User {
    id: string;
    siteRole: SiteRole;
    sessionVersion: number;
  }
  interface Session {
    user: { id: string; name: string; email: string; siteRole: SiteRole };
    sessionVersion: number;
  }
}

declare module 'next-auth/jwt' {
  interface JWT {
    uid?: string;
    siteRole?: SiteRole;
    sessionVersion?: number;
  }
}
