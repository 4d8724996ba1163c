import { db } from '@/lib/db';

export const dynamic = 'force-dynamic';

/** Liveness and database reachability, for the start script and for monitoring. */
export async function GET() {
  try {
    await db.raw('select 1');
    return Response.json({ ok: true, database: 'up' });
  } catch {
    return Response.json({ ok: false, database: 'down' }, { status: 503 });
  }
}
