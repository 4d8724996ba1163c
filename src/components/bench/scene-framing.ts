/**
 * Sizes and camera framing of the 3D bench, from the coils' sampled paths. World frame = physics frame
 * (metres, z up), so nothing is scaled or swapped between the solver and the picture.
 */
import type { CoilSpec } from '@/physics';
import type { CameraView, Vec3 } from './bench-types';
import type { Bounds } from './field-grid';

/** Largest extent of a coil [m]: its diameter, or its length if longer. */
export function coilSize(spec: CoilSpec): number {
  switch (spec.kind) {
    case 'loop':
      return 2 * spec.radius;
    case 'helix':
      return Math.max(2 * spec.radius, spec.length);
    case 'spiral':
      return 2 * spec.outerRadius;
  }
}

/** Thin wire would vanish on screen: the tube is at least this fraction of the scene's largest coil. */
const MIN_TUBE_FRACTION = 0.008;
/** Exaggerated tubes stay below this fraction of the winding pitch, so neighbouring turns never merge. */
const MAX_PITCH_FRACTION = 0.3;

/** Radius of the drawn tube [m]: the wire radius, thickened for visibility but never past the pitch. */
export function displayTubeRadius(spec: CoilSpec, sceneSize: number): number {
  const wire = spec.wireDiameter / 2;
  const pitch = spec.kind === 'helix' && spec.turns > 1
    ? spec.length / spec.turns
    : spec.kind === 'spiral' ? (spec.outerRadius - spec.innerRadius) / spec.turns : Infinity;
  return Math.max(wire, Math.min(sceneSize * MIN_TUBE_FRACTION, MAX_PITCH_FRACTION * pitch));
}

export interface GridScale {
  /** small squares [m] */
  cell: number;
  /** bold lines every [m] */
  section: number;
  label: string;
}

/** Ground-grid squares that suit the scene: 1 mm / 1 cm for small coils, 1 cm / 10 cm, or 10 cm / 1 m. */
export function gridScaleFor(sceneSize: number): GridScale {
  if (sceneSize < 0.05) return { cell: 0.001, section: 0.01, label: '1 mm squares, bold lines every 1 cm' };
  if (sceneSize < 0.8) return { cell: 0.01, section: 0.1, label: '1 cm squares, bold lines every 10 cm' };
  return { cell: 0.1, section: 1, label: '10 cm squares, bold lines every 1 m' };
}

/** Direction from the target to the default camera: in front (-y), a little to +x and above. */
const DEFAULT_VIEW_DIRECTION: Vec3 = [0.5, -1, 0.55];
/** Field of view of the bench camera [deg] (vertical). */
export const CAMERA_FOV_DEG = 38;
/** Room around the coils in the default view. */
const FRAMING_MARGIN = 1.0;

/** A camera that shows the whole box from the front-right, looking at its centre. */
export function defaultView(bounds: Bounds): CameraView {
  const target: Vec3 = [0, 1, 2].map((a) => (bounds.min[a] + bounds.max[a]) / 2) as Vec3;
  const radius = Math.max(1e-3, Math.hypot(...([0, 1, 2].map((a) => bounds.max[a] - bounds.min[a]) as Vec3)) / 2);
  const distance = (FRAMING_MARGIN * radius) / Math.sin((CAMERA_FOV_DEG * Math.PI) / 360);
  const d = Math.hypot(...DEFAULT_VIEW_DIRECTION);
  const position = target.map((t, a) => t + (DEFAULT_VIEW_DIRECTION[a] / d) * distance) as Vec3;
  return { position: roundVec(position), target: roundVec(target) };
}

/** Camera coordinates are stored to the 0.01 mm: enough to restore a view exactly as seen. */
export function roundVec(v: readonly number[]): Vec3 {
  return [0, 1, 2].map((a) => Math.round(v[a] * 1e5) / 1e5 + 0) as Vec3;
}
