import { requireUser } from '@/lib/auth/session';
import { createAttachment, listAttachments } from '@/lib/data/attachments';
import { route } from '@/lib/http/respond';
import { parseAttachmentForm, readMultipartForm } from '@/lib/storage/upload-form';
import { planIds, type PlanContext } from '../ids';

export const dynamic = 'force-dynamic';

/** The plan's photos and instrument files, newest first. */
export const GET = route(async (_request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  return Response.json({ attachments: await listAttachments(user, studyId, planId) });
});

/**
 * Uploads one file (multipart/form-data: file, kind, pointId?, caption?) to a plan on the bench;
 * the body is refused with 413 before it is held when it is larger than any file may be.
 */
export const POST = route(async (request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  const { fields, file } = await parseAttachmentForm(await readMultipartForm(request));
  const attachment = await createAttachment(user, studyId, planId, { ...fields, fileName: file.name, bytes: file.bytes });
  return Response.json({ attachment }, { status: 201 });
});
