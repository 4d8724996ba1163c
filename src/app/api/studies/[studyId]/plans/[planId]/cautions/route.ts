import { z } from 'zod';
import { requireUser } from '@/lib/auth/session';
import { acknowledgeCautions, getCautionAcknowledgement } from '@/lib/data/readings';
import { parseJsonBody, route } from '@/lib/http/respond';
import { planIds, type PlanContext } from '../ids';

export const dynamic = 'force-dynamic';

const acknowledgementSchema = z.object({
  version: z.string({ error: 'Say which version of the cautions was read.' }).min(1, 'Say which version of the cautions was read.').max(20, 'Unknown version.'),
  acknowledged: z.literal(true, { error: 'Tick the box to acknowledge the cautions.' }),
});

/** Whether the signed-in person has acknowledged the current bench cautions on this plan. */
export const GET = route(async (_request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  return Response.json({ acknowledgement: await getCautionAcknowledgement(user, studyId, planId) });
});

/** Stores the acknowledgement (students and researchers, before their first reading on the plan). */
export const POST = route(async (request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  const input = await parseJsonBody(request, acknowledgementSchema);
  return Response.json({ acknowledgement: await acknowledgeCautions(user, studyId, planId, input.version) });
});
