import 'server-only';
import { db } from '../db';
import { unprocessable } from '../http/errors';
import { requireStudyAccess } from '../auth/access';
import type { SessionUser } from '../auth/session-user';
import type { PlanPose } from '../plans/points';
import { readingCreateSchema, type ReadingFromFile } from '../validations/reading';
import { parseTouchstone, TouchstoneError, twoPortRawFromTouchstone, zParametersAt } from '../../physics/touchstone';
import { readAttachmentBytes } from './attachments';
import { fromJsonColumn } from './json-column';
import { createReading, type Reading } from './readings';

/** The frequency a point is measured at: an axis may set it, otherwise the setup's drive frequency. */
async function pointFrequency(planId: number, pointId: number): Promise<number | null> {
  const row = await db('sweep_points')
    .join('sweep_plans', 'sweep_plans.id', 'sweep_points.plan_id')
    .join('setups', 'setups.id', 'sweep_plans.setup_id')
    .where({ 'sweep_points.id': pointId, 'sweep_points.plan_id': planId })
    .first('sweep_points.pose', 'setups.circuit');
  if (!row) return null;
  const pose = fromJsonColumn<PlanPose>(row.pose);
  return pose.frequencyHz ?? fromJsonColumn<{ frequency: number }>(row.circuit).frequency;
}

const fileIssue = (message: string) => unprocessable('Some fields need attention.', [{ path: 'attachmentId', message }]);

/**
 * A two-port reading whose Z-parameters come from a Touchstone file already attached to this plan:
 * the server parses the file, takes the data point nearest the measurement frequency and derives M
 * and k from it; the reading names the file it came from.
 */
export async function createReadingFromTouchstone(actor: SessionUser, studyId: number, planId: number, input: ReadingFromFile): Promise<Reading> {
  // the role first, as every other write: a reviewer learns nothing about files from a refused log
  await requireStudyAccess(actor, studyId, 'readings.log');
  const { attachment, bytes } = await readAttachmentBytes(actor, studyId, input.attachmentId);
  if (attachment.planId !== planId) throw fileIssue('Choose a file attached to this plan.');
  let data;
  try {
    data = parseTouchstone(new TextDecoder('utf-8', { fatal: true }).decode(bytes));
  } catch (error) {
    if (error instanceof TouchstoneError) throw fileIssue(`${attachment.fileName}: ${error.message}`);
    if (error instanceof TypeError) throw fileIssue(`${attachment.fileName} is not a text file.`);
    throw error;
  }
  const frequency = input.frequency ?? (await pointFrequency(planId, input.pointId));
  if (frequency === null) throw unprocessable('Some fields need attention.', [{ path: 'pointId', message: 'Choose a point of this plan.' }]);
  const used = zParametersAt(data, frequency);
  const notes: string[] = [];
  if (Math.abs(used.frequency - frequency) > 0.005 * frequency) {
    notes.push(`The file has no data at ${frequency} Hz; the nearest point, ${used.frequency} Hz, was used.`);
  }
  const { attachmentId, frequency: _requested, ...circumstances } = input;
  const reading = readingCreateSchema.parse({ ...circumstances, method: 'two_port', raw: twoPortRawFromTouchstone(data, frequency) });
  return createReading(actor, studyId, planId, reading, { source: 'touchstone', attachmentId, notes });
}
