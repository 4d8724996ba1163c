/**
 * Refuses field points inside a coil's wire. The Biot-Savart integral of a filament diverges on its axis:
 * such a point costs the adaptive quadrature its full depth (about 0.7 s a point, measured) and returns a
 * number that means nothing, so it is an input error at its own path (`fieldPoints.3`) instead.
 */
import type { SolveIssue } from '../../physics';
import { samplePath } from '../../physics/geometry/coil-path';
import type { CoilPath } from '../../physics/geometry/path';
import type { Point3 } from './job';

/** Chords per turn of the sampled axis; the curve stays within a sagitta h^2 / (8 rho) of its chords. */
const CHORDS_PER_TURN = 256;
/** Chords per bounding box: a point is compared only with the chords of boxes within reach. */
const CHORDS_PER_BOX = 32;

/** Squared distance [m^2] from p to the chord between the samples at offsets ia and ia + 3 of s. */
function chordDistance2(s: Float64Array, ia: number, px: number, py: number, pz: number): number {
  const ax = s[ia], ay = s[ia + 1], az = s[ia + 2];
  const dx = s[ia + 3] - ax, dy = s[ia + 4] - ay, dz = s[ia + 5] - az;
  const len2 = dx * dx + dy * dy + dz * dz;
  const u = len2 > 0 ? Math.min(1, Math.max(0, ((px - ax) * dx + (py - ay) * dy + (pz - az) * dz) / len2)) : 0;
  const ex = px - ax - u * dx, ey = py - ay - u * dy, ez = pz - az - u * dz;
  return ex * ex + ey * ey + ez * ez;
}

interface SampledCoil {
  name: string;
  samples: Float64Array;
  /** per box of CHORDS_PER_BOX chords: [xmin, ymin, zmin, xmax, ymax, zmax], padded by the reach */
  boxes: Float64Array;
  reach: number;
}

function sampleCoil(name: string, path: CoilPath): SampledCoil {
  const samples = samplePath(path, CHORDS_PER_TURN);
  const chord = (path.maxSpeed(0, path.tEnd) * 2 * Math.PI) / CHORDS_PER_TURN;
  const reach = path.wireRadius + (chord * chord) / (8 * path.minCurvatureRadius);
  const chords = samples.length / 3 - 1;
  const boxes = new Float64Array(6 * Math.ceil(chords / CHORDS_PER_BOX));
  for (let b = 0; b < boxes.length / 6; b++) {
    const box = boxes.subarray(6 * b, 6 * b + 6);
    box.set([Infinity, Infinity, Infinity, -Infinity, -Infinity, -Infinity]);
    const last = Math.min(chords, (b + 1) * CHORDS_PER_BOX);
    for (let i = b * CHORDS_PER_BOX; i <= last; i++) {
      for (let k = 0; k < 3; k++) {
        box[k] = Math.min(box[k], samples[3 * i + k] - reach);
        box[k + 3] = Math.max(box[k + 3], samples[3 * i + k] + reach);
      }
    }
  }
  return { name, samples, boxes, reach };
}

/** Is the point within reach of the coil's sampled axis? */
function near(c: SampledCoil, [px, py, pz]: Point3): boolean {
  const chords = c.samples.length / 3 - 1;
  const reach2 = c.reach * c.reach;
  for (let b = 0; b < c.boxes.length / 6; b++) {
    const o = 6 * b;
    const bx = c.boxes;
    if (px < bx[o] || py < bx[o + 1] || pz < bx[o + 2] || px > bx[o + 3] || py > bx[o + 4] || pz > bx[o + 5]) continue;
    const last = Math.min(chords, (b + 1) * CHORDS_PER_BOX);
    for (let i = b * CHORDS_PER_BOX; i < last; i++) if (chordDistance2(c.samples, 3 * i, px, py, pz) < reach2) return true;
  }
  return false;
}

/** One issue per field point inside (or touching, within the chord sagitta) either coil's wire. */
export function fieldPointIssues(points: Point3[], paths: { tx: CoilPath; rx: CoilPath }): SolveIssue[] {
  const coils = [sampleCoil('transmitter', paths.tx), sampleCoil('receiver', paths.rx)];
  const issues: SolveIssue[] = [];
  points.forEach((point, i) => {
    const hit = coils.find((c) => near(c, point));
    if (hit) issues.push({ path: ['fieldPoints', i], message: `This point is inside the ${hit.name}'s wire, where the field is not modelled. Move it off the wire.` });
  });
  return issues;
}
