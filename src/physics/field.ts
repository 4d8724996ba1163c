/**
 * Magnetic flux density of the coils' phasor currents by the Biot-Savart law
 *   B(r) = mu0 I / (4 pi) integral dl' x (r - r') / |r - r'|^3
 * (Biot & Savart 1820; Jackson, Classical Electrodynamics, 3rd ed., eq. 5.14) on the same paths as the
 * Neumann integral, with Gauss-Legendre panels bisected until two orders agree.
 */
import type { Complex } from './complex';
import { MU0_OVER_4PI } from './constants';
import type { CoilPath } from './geometry/path';
import { gaussLegendre } from './quadrature/gauss-legendre';

/** Orders compared on each panel. */
const LOW_ORDER = 12;
const HIGH_ORDER = 24;
/** Panels are not bisected more than this many times (points inside the wire stop here). */
const MAX_DEPTH = 30;

const scratch = new Float64Array(6);
const lowSum = new Float64Array(3);
const highSum = new Float64Array(3);

function panelSum(path: CoilPath, t0: number, t1: number, n: number, px: number, py: number, pz: number, out: Float64Array): void {
  const { nodes, weights } = gaussLegendre(n);
  const half = 0.5 * (t1 - t0);
  out[0] = 0;
  out[1] = 0;
  out[2] = 0;
  for (let i = 0; i < n; i++) {
    path.evaluate(t0 + half * (nodes[i] + 1), scratch, 0);
    const rx = px - scratch[0], ry = py - scratch[1], rz = pz - scratch[2];
    const r2 = rx * rx + ry * ry + rz * rz;
    const w = (half * weights[i]) / (r2 * Math.sqrt(r2));
    const dx = scratch[3], dy = scratch[4], dz = scratch[5];
    out[0] += w * (dy * rz - dz * ry);
    out[1] += w * (dz * rx - dx * rz);
    out[2] += w * (dx * ry - dy * rx);
  }
}

function adaptive(
  path: CoilPath, t0: number, t1: number, px: number, py: number, pz: number,
  absTol: number, depth: number, acc: Float64Array,
): void {
  panelSum(path, t0, t1, LOW_ORDER, px, py, pz, lowSum);
  const lx = lowSum[0], ly = lowSum[1], lz = lowSum[2];
  panelSum(path, t0, t1, HIGH_ORDER, px, py, pz, highSum);
  const diff = Math.hypot(highSum[0] - lx, highSum[1] - ly, highSum[2] - lz);
  if (diff <= absTol || depth >= MAX_DEPTH) {
    acc[0] += highSum[0];
    acc[1] += highSum[1];
    acc[2] += highSum[2];
    return;
  }
  const tm = 0.5 * (t0 + t1);
  adaptive(path, t0, tm, px, py, pz, absTol / 2, depth + 1, acc);
  adaptive(path, tm, t1, px, py, pz, absTol / 2, depth + 1, acc);
}

/**
 * Flux density per unit current [T/A] of a path at a point, written into out[0..2].
 * @param tolerance relative tolerance against a first coarse estimate of |B|
 */
export function fieldPerAmpere(path: CoilPath, px: number, py: number, pz: number, tolerance: number, out: Float64Array): void {
  const turns = path.panelCount;
  out[0] = 0;
  out[1] = 0;
  out[2] = 0;
  const coarse = new Float64Array(3);
  for (let k = 0; k < turns; k++) {
    panelSum(path, (path.tEnd * k) / turns, (path.tEnd * (k + 1)) / turns, HIGH_ORDER, px, py, pz, lowSum);
    coarse[0] += lowSum[0];
    coarse[1] += lowSum[1];
    coarse[2] += lowSum[2];
  }
  const absTol = Math.max(tolerance * Math.hypot(coarse[0], coarse[1], coarse[2]), Number.MIN_VALUE) / turns;
  for (let k = 0; k < turns; k++) {
    adaptive(path, (path.tEnd * k) / turns, (path.tEnd * (k + 1)) / turns, px, py, pz, absTol, 0, out);
  }
  out[0] *= MU0_OVER_4PI;
  out[1] *= MU0_OVER_4PI;
  out[2] *= MU0_OVER_4PI;
}

/**
 * rms flux density [T] at points (xyz interleaved [m]) from paths carrying rms phasor currents [A]:
 * B = sum_c B_c,unit I_c (complex vector), |B|rms = sqrt(sum over x, y, z of |B_axis|^2).
 */
export function fluxDensityRms(
  points: ArrayLike<number>, paths: CoilPath[], currents: Complex[], tolerance = 1e-6,
): Float64Array {
  const count = Math.floor(points.length / 3);
  const result = new Float64Array(count);
  const unit = new Float64Array(3);
  const re = new Float64Array(3);
  const im = new Float64Array(3);
  for (let p = 0; p < count; p++) {
    re.fill(0);
    im.fill(0);
    for (let c = 0; c < paths.length; c++) {
      fieldPerAmpere(paths[c], points[3 * p], points[3 * p + 1], points[3 * p + 2], tolerance, unit);
      for (let k = 0; k < 3; k++) {
        re[k] += unit[k] * currents[c].re;
        im[k] += unit[k] * currents[c].im;
      }
    }
    result[p] = Math.sqrt(re[0] ** 2 + re[1] ** 2 + re[2] ** 2 + im[0] ** 2 + im[1] ** 2 + im[2] ** 2);
  }
  return result;
}
