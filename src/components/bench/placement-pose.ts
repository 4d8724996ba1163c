/**
 * The receiver's placement (distance, lateral offset, tilt) and its pose in the scene, both ways.
 * Same convention as src/physics/geometry/pose.ts (PRODUCT.md): rotate by tilt about the local y axis
 * (+z turns toward +x), then move the centre to (lateralOffset, 0, distance). The scene keeps the
 * physics frame as world frame (z up), so no axis swap happens anywhere.
 */
import type { BenchPlacement, Vec3 } from './bench-types';

const DEG = Math.PI / 180;

/** Drag results are snapped to these steps so the numbers in the inputs stay readable. */
export const DRAG_LENGTH_STEP_M = 1e-4;
export const DRAG_TILT_STEP_DEG = 0.1;

/** Round to a step without binary noise (0.1 + 0.2 style tails). */
export function snap(value: number, step: number): number {
  const snapped = Math.round(value / step) * step;
  return Number(snapped.toFixed(Math.max(0, Math.ceil(-Math.log10(step)) + 1)));
}

/** An angle in degrees folded into (-180, 180]. */
export function foldDegrees(deg: number): number {
  const r = ((deg % 360) + 360) % 360;
  return r > 180 ? r - 360 : r;
}

export interface ReceiverPose {
  /** centre [m] */
  position: Vec3;
  /** rotation about +y [rad] */
  rotationY: number;
  /** unit vector of the receiver's axis (its local +z) in world coordinates */
  axis: Vec3;
}

export function poseFromPlacement(p: BenchPlacement): ReceiverPose {
  const t = p.tiltDeg * DEG;
  return { position: [p.lateralOffset, 0, p.distance], rotationY: t, axis: [Math.sin(t), 0, Math.cos(t)] };
}

/**
 * The placement whose pose has this centre and axis. Only poses the placement form can express are
 * accepted: centre on y = 0 and axis in the x-z plane (the drag handles never leave that plane).
 */
export function placementFromPose(position: Vec3, axis: Vec3): BenchPlacement {
  if (Math.abs(position[1]) > 1e-9 || Math.abs(axis[1]) > 1e-9) {
    throw new Error('the placement form only covers centres on y = 0 and axes in the x-z plane');
  }
  return { distance: position[2], lateralOffset: position[0], tiltDeg: Math.atan2(axis[0], axis[2]) / DEG };
}

/** The placement after dragging the centre by (dx, dz) [m] from `start`, snapped to the drag step. */
export function movePlacement(start: BenchPlacement, dx: number, dz: number): BenchPlacement {
  return {
    ...start,
    lateralOffset: snap(start.lateralOffset + dx, DRAG_LENGTH_STEP_M),
    distance: snap(start.distance + dz, DRAG_LENGTH_STEP_M),
  };
}

/**
 * Angle [deg] of a point around the receiver's centre, in the x-z plane, measured like the tilt:
 * 0 along +z, positive toward +x. Turning a ring handle changes the tilt by the change of this angle.
 */
export function angleAroundCentre(centre: Vec3, point: Vec3): number {
  return Math.atan2(point[0] - centre[0], point[2] - centre[2]) / DEG;
}

/** The placement after turning the tilt handle from angle `fromDeg` to `toDeg`. */
export function turnPlacement(start: BenchPlacement, fromDeg: number, toDeg: number): BenchPlacement {
  return { ...start, tiltDeg: snap(foldDegrees(start.tiltDeg + foldDegrees(toDeg - fromDeg)), DRAG_TILT_STEP_DEG) };
}

export function samePlacement(a: BenchPlacement, b: BenchPlacement): boolean {
  return a.distance === b.distance && a.lateralOffset === b.lateralOffset && a.tiltDeg === b.tiltDeg;
}

/**
 * The receiver group's 4 x 4 transform for the scene, column-major as three.js Matrix4.fromArray takes
 * it: rotation about y by the tilt, then translation to the centre. Local coil points map through it
 * onto the solver's receiver path (unit/components/bench/placement-pose.test.ts checks that).
 */
export function receiverMatrix(p: BenchPlacement): number[] {
  const t = p.tiltDeg * DEG;
  const c = Math.cos(t);
  const s = Math.sin(t);
  return [c, 0, -s, 0, 0, 1, 0, 0, s, 0, c, 0, p.lateralOffset, 0, p.distance, 1];
}
