import type { PointPose } from '@/components/plans/plan-types';
import { formatFrequency, formatLength, formatResistance } from '@/lib/units';

/** "10 cm · tilt 30° · offset 2 cm" (offset only when set; frequency and load when an axis sets them). */
export function poseLabel(pose: PointPose): string {
  const parts = [formatLength(pose.distance), `tilt ${Number(pose.tiltDeg.toPrecision(6))}\u00b0`];
  if (pose.lateralOffset !== 0) parts.push(`offset ${formatLength(pose.lateralOffset)}`);
  if (pose.frequencyHz !== undefined && pose.frequencyHz !== null) parts.push(formatFrequency(pose.frequencyHz));
  if (pose.loadResistance !== undefined && pose.loadResistance !== null) parts.push(`load ${formatResistance(pose.loadResistance)}`);
  return parts.join(' \u00b7 ');
}
