/**
 * Build the wire-axis path of any coil kind, and sample it for display.
 */
import type { CoilSpec } from '../types';
import { helixPath } from './helix';
import { loopPath } from './loop';
import type { CoilPath } from './path';
import type { Pose } from './pose';
import { spiralPath } from './spiral';

/** The path of a coil spec placed by a pose; wire radius = wireDiameter / 2 [m]. */
export function coilPath(spec: CoilSpec, pose: Pose): CoilPath {
  const wireRadius = spec.wireDiameter / 2;
  switch (spec.kind) {
    case 'loop':
      return loopPath(spec.radius, wireRadius, pose);
    case 'helix':
      return helixPath(spec.radius, spec.turns, spec.length, wireRadius, pose);
    case 'spiral':
      return spiralPath(spec.innerRadius, spec.outerRadius, spec.turns, wireRadius, pose);
  }
}

/**
 * Points along a path, xyz interleaved [m], `pointsPerTurn` per 2 pi of parameter, both ends included.
 * For a closed loop the last point repeats the first so a line strip closes.
 */
export function samplePath(path: CoilPath, pointsPerTurn = 64): Float64Array {
  const segments = Math.max(1, Math.ceil((path.tEnd / (2 * Math.PI)) * pointsPerTurn));
  const out = new Float64Array(3 * (segments + 1));
  const scratch = new Float64Array(6);
  for (let i = 0; i <= segments; i++) {
    path.evaluate((path.tEnd * i) / segments, scratch, 0);
    out[3 * i] = scratch[0];
    out[3 * i + 1] = scratch[1];
    out[3 * i + 2] = scratch[2];
  }
  return out;
}
