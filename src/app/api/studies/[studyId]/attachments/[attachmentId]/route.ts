import { requireUser } from '@/lib/auth/session';
import { attachmentDownloadUrl } from '@/lib/data/attachments';
import { idParam, route } from '@/lib/http/respond';

export const dynamic = 'force-dynamic';

type Context = { params: Promise<{ studyId: string; attachmentId: string }> };

/**
 * Redirects (302) to a signed link of the file that works for 5 minutes, so only members ever hold
 * one; photos open inline, instrument files download. Others get 404.
 */
export const GET = route(async (_request: Request, { params }: Context) => {
  const { studyId, attachmentId } = await params;
  const ids = { studyId: idParam(studyId), attachmentId: idParam(attachmentId) };
  const user = await requireUser();
  const url = await attachmentDownloadUrl(user, ids.studyId, ids.attachmentId);
  // Not cached: a link outliving its signature, or a member's access, must not be replayed.
  return new Response(null, { status: 302, headers: { Location: url, 'Cache-Control': 'private, no-store' } });
});
