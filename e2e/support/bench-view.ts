/**
 * Where a world point [m] of the bench's scene lands on the canvas, from the camera view the canvas
 * publishes (data-view: position and target, z up) and the bench's fixed vertical field of view.
 */
export type Vec3 = [number, number, number];

/** src/components/bench/scene-framing.ts CAMERA_FOV_DEG */
export const BENCH_FOV_DEG = 38;

const sub = (a: Vec3, b: Vec3): Vec3 => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
const dot = (a: Vec3, b: Vec3) => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
const cross = (a: Vec3, b: Vec3): Vec3 => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
const unit = (a: Vec3): Vec3 => {
  const l = Math.hypot(...a);
  return [a[0] / l, a[1] / l, a[2] / l];
};

/** CSS pixel position of `point` on a canvas of `width` x `height` CSS pixels. */
export function projectToCanvas(view: { position: Vec3; target: Vec3 }, point: Vec3, width: number, height: number): { x: number; y: number } {
  const forward = unit(sub(view.target, view.position));
  const right = unit(cross(forward, [0, 0, 1]));
  const up = cross(right, forward);
  const d = sub(point, view.position);
  const depth = dot(d, forward);
  const halfHeight = Math.tan((BENCH_FOV_DEG * Math.PI) / 360) * depth;
  const halfWidth = halfHeight * (width / height);
  return { x: (1 + dot(d, right) / halfWidth) * (width / 2), y: (1 - dot(d, up) / halfHeight) * (height / 2) };
}

/** Screen rectangle [CSS px] around the projections of a world box's eight corners. */
export function projectBox(view: { position: Vec3; target: Vec3 }, min: Vec3, max: Vec3, width: number, height: number) {
  const xs: number[] = [];
  const ys: number[] = [];
  for (const x of [min[0], max[0]]) for (const y of [min[1], max[1]]) for (const z of [min[2], max[2]]) {
    const p = projectToCanvas(view, [x, y, z], width, height);
    xs.push(p.x);
    ys.push(p.y);
  }
  return { left: Math.min(...xs), right: Math.max(...xs), top: Math.min(...ys), bottom: Math.max(...ys) };
}
