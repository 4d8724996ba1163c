import { requireUser } from '@/lib/auth/session';
import { commitReadingImport, previewReadingImport } from '@/lib/data/reading-import';
import { parseJsonBody, route } from '@/lib/http/respond';
import { CSV_MAX_BYTES, readingImportSchema } from '@/lib/validations/reading-import';
import { planIds, type PlanContext } from '../../ids';

export const dynamic = 'force-dynamic';

/** The body carries the file's text as a JSON string: room for the file, its escaping and the mapping. */
const MAX_BODY_BYTES = CSV_MAX_BYTES + 1024 * 1024;

/**
 * Checks a CSV of readings (`commit: false`, the report) or imports it (`commit: true`, 201); an
 * import with any problem stores nothing and answers 422 with the issues and the report (its error's body).
 */
export const POST = route(async (request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  const { commit, ...input } = await parseJsonBody(request, readingImportSchema, MAX_BODY_BYTES);
  if (!commit) return Response.json({ preview: await previewReadingImport(user, studyId, planId, input) });
  return Response.json({ import: await commitReadingImport(user, studyId, planId, input) }, { status: 201 });
});
