/**
 * The x-z plane (y = 0) through both coils, sampled on a square grid for the |B| map, and the colours
 * of that map. The plane contains both axes (the receiver tilts about y), so it cuts every winding.
 */
import type { Vec3 } from './bench-types';

/** Grid points per side (a coarse 41 x 41 map). */
export const FIELD_GRID_SIZE = 41;
/** Margin around the coils' extent, as a fraction of the larger side. */
const FIELD_MARGIN = 0.2;

export interface FieldGrid {
  /** [m] */
  xMin: number;
  xMax: number;
  zMin: number;
  zMax: number;
  /** points per side; point (i, j) is at x = xMin + i dx, z = zMin + j dz */
  n: number;
}

export interface Bounds {
  min: Vec3;
  max: Vec3;
}

/** Bounding box of xyz-interleaved points [m]. */
export function boundsOfPoints(...paths: ArrayLike<number>[]): Bounds {
  const min: Vec3 = [Infinity, Infinity, Infinity];
  const max: Vec3 = [-Infinity, -Infinity, -Infinity];
  for (const p of paths) {
    for (let i = 0; i + 2 < p.length; i += 3) {
      for (let a = 0; a < 3; a++) {
        if (p[i + a] < min[a]) min[a] = p[i + a];
        if (p[i + a] > max[a]) max[a] = p[i + a];
      }
    }
  }
  return { min, max };
}

/** Round sizes of the map's half-side, per decade. */
const NICE_STEPS = [1, 1.5, 2, 2.5, 3, 4, 5, 6, 8, 10];

/** The smallest round size (1, 1.5, 2, 2.5, 3, 4, 5, 6, 8 x 10^k) at or above x. */
export function niceCeil(x: number): number {
  const decade = 10 ** Math.floor(Math.log10(x));
  const m = x / decade;
  const step = NICE_STEPS.find((s) => m <= s + 1e-9) ?? 10;
  return Number((step * decade).toPrecision(6));
}

/**
 * A square grid in the x-z plane around the bounds, with a margin. Its half-side is a 1-2-5 number and
 * its centre sits on tenths of it, so small moves of the receiver keep the same grid (a calm map).
 */
export function fieldGridAround(bounds: Bounds, n = FIELD_GRID_SIZE): FieldGrid {
  const cx = (bounds.min[0] + bounds.max[0]) / 2;
  const cz = (bounds.min[2] + bounds.max[2]) / 2;
  const side = Math.max(bounds.max[0] - bounds.min[0], bounds.max[2] - bounds.min[2], 1e-3) * (1 + 2 * FIELD_MARGIN);
  const half = niceCeil(side / 2);
  const step = half / 10;
  const sx = Number((Math.round(cx / step) * step).toPrecision(9));
  const sz = Number((Math.round(cz / step) * step).toPrecision(9));
  const fix = (v: number) => Number(v.toPrecision(9));
  return { xMin: fix(sx - half), xMax: fix(sx + half), zMin: fix(sz - half), zMax: fix(sz + half), n };
}

/** The grid's points, row by row in z (j), x fastest (i): index = j n + i. */
export function fieldGridPoints(grid: FieldGrid): Vec3[] {
  const pts: Vec3[] = [];
  const dx = (grid.xMax - grid.xMin) / (grid.n - 1);
  const dz = (grid.zMax - grid.zMin) / (grid.n - 1);
  for (let j = 0; j < grid.n; j++) for (let i = 0; i < grid.n; i++) pts.push([grid.xMin + i * dx, 0, grid.zMin + j * dz]);
  return pts;
}

export interface FieldScale {
  /** log10 of the flux density [T] at the bottom and top of the colour bar */
  logMin: number;
  logMax: number;
}

/** Decades shown below the top of the colour bar. */
export const FIELD_DECADES = 3;
/** The top of the bar sits at this quantile, so the few points on a wire (near-infinite B) do not wash it out. */
const TOP_QUANTILE = 0.98;

export function fieldScale(values: ArrayLike<number>): FieldScale {
  const finite = Array.from(values).filter((v) => Number.isFinite(v) && v > 0).sort((a, b) => a - b);
  if (finite.length === 0) return { logMin: -FIELD_DECADES, logMax: 0 };
  const top = finite[Math.min(finite.length - 1, Math.floor(TOP_QUANTILE * (finite.length - 1)))];
  const logMax = Math.ceil(Math.log10(top) * 4) / 4;
  return { logMin: logMax - FIELD_DECADES, logMax };
}

/** Colour ramp of the map, dark to light (ink-950, flux-700, flux-400, copper-300, copper-50): lightness rises monotonically. */
const RAMP: readonly Vec3[] = [
  [16, 21, 30],
  [31, 98, 100],
  [68, 181, 179],
  [233, 165, 115],
  [253, 245, 239],
];

/** Colour of a position 0..1 on the ramp (clamped). */
export function rampColour(t: number): Vec3 {
  const x = Math.min(1, Math.max(0, Number.isFinite(t) ? t : 1)) * (RAMP.length - 1);
  const k = Math.min(RAMP.length - 2, Math.floor(x));
  const f = x - k;
  const a = RAMP[k];
  const b = RAMP[k + 1];
  return [Math.round(a[0] + (b[0] - a[0]) * f), Math.round(a[1] + (b[1] - a[1]) * f), Math.round(a[2] + (b[2] - a[2]) * f)];
}

/** Position 0..1 of a flux density [T] on the log colour bar. Non-finite (on a wire) counts as the top. */
export function scalePosition(b: number, scale: FieldScale): number {
  if (!Number.isFinite(b)) return 1;
  if (b <= 0) return 0;
  return (Math.log10(b) - scale.logMin) / (scale.logMax - scale.logMin);
}

/**
 * RGBA pixels of the map, one per grid point. `topRowFirst` (ImageData) puts the largest z in row 0;
 * without it the smallest z comes first, as a WebGL texture expects.
 */
export function fieldPixels(values: ArrayLike<number>, n: number, scale: FieldScale, topRowFirst = true): Uint8ClampedArray {
  const out = new Uint8ClampedArray(n * n * 4);
  for (let j = 0; j < n; j++) {
    for (let i = 0; i < n; i++) {
      const [r, g, b] = rampColour(scalePosition(values[j * n + i], scale));
      const o = ((topRowFirst ? n - 1 - j : j) * n + i) * 4;
      out[o] = r;
      out[o + 1] = g;
      out[o + 2] = b;
      out[o + 3] = 255;
    }
  }
  return out;
}
