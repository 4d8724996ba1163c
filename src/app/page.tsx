import { redirect } from 'next/navigation';
import { getSessionUser } from '@/lib/auth/session';

/** The bare address has no page of its own: it sends people where they can start. */
export default async function HomePage() {
  const user = await getSessionUser();
  redirect(user ? '/dashboard' : '/signin');
}
