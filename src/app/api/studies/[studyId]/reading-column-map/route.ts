import { requireUser } from '@/lib/auth/session';
import { getColumnMap } from '@/lib/data/reading-column-maps';
import { idParam, route } from '@/lib/http/respond';

export const dynamic = 'force-dynamic';

type Context = { params: Promise<{ studyId: string }> };

/** The CSV column mapping the study last imported readings with (null when none). */
export const GET = route(async (_request: Request, { params }: Context) => {
  const studyId = idParam((await params).studyId);
  const user = await requireUser();
  return Response.json({ columnMap: await getColumnMap(user, studyId) });
});
