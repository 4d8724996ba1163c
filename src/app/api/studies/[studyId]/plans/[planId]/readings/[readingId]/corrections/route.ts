import { requireUser } from '@/lib/auth/session';
import { correctReading } from '@/lib/data/readings';
import { idParam, parseJsonBody, route } from '@/lib/http/respond';
import { readingCorrectionSchema } from '@/lib/validations/reading';
import { planIds } from '../../../ids';

export const dynamic = 'force-dynamic';

type ReadingContext = { params: Promise<{ studyId: string; planId: string; readingId: string }> };

/** Corrects a reading: a new version with the reason (201); the earlier version stays in the history. */
export const POST = route(async (request: Request, { params }: ReadingContext) => {
  const { studyId, planId } = await planIds(params);
  const readingId = idParam((await params).readingId);
  const user = await requireUser();
  const input = await parseJsonBody(request, readingCorrectionSchema);
  return Response.json({ reading: await correctReading(user, studyId, planId, readingId, input) }, { status: 201 });
});
