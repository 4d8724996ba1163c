import type { SiteRole } from './permissions';

/** The signed-in person as every protected function sees them. */
export interface SessionUser {
  id: number;
  email: string;
  name: string;
  siteRole: SiteRole;
}
