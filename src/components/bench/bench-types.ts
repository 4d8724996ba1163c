/**
 * Shapes the bench works with. Coils and setups come from the study API (src/lib/data/coils.ts,
 * setups.ts; type-only imports, nothing server-side reaches the page). SI throughout, tilt in degrees.
 */
export type { Coil } from '@/lib/data/coils';
export type { Setup } from '@/lib/data/setups';
export type { SetupCreateInput as SetupInput } from '@/lib/validations/setup';

export type Vec3 = [number, number, number];

/** Receiver placement as the bench edits it: distance and lateral offset [m], tilt [deg]. */
export interface BenchPlacement {
  distance: number;
  lateralOffset: number;
  tiltDeg: number;
}

/** Orbit camera: where it stands and what it looks at [m]. */
export interface CameraView {
  position: Vec3;
  target: Vec3;
}
