'use client';

import { useEffect, useMemo } from 'react';
import { CatmullRomCurve3, TubeGeometry, Vector3 } from 'three';
import { coilPathPoints, type CoilSpec } from '@/physics';
import { displayTubeRadius } from './scene-framing';

/** Samples per turn of the displayed path; the solver integrates the same curve (coilPathPoints). */
const POINTS_PER_TURN = 72;
const RADIAL_SEGMENTS = 10;
/** Upper bound of tube segments, so a 2,000-turn coil stays drawable in software WebGL. */
const MAX_TUBULAR_SEGMENTS = 6000;

/** A tube along the coil's wire axis in its own frame (the transmitter's pose is the identity). */
export function buildCoilTube(spec: CoilSpec, sceneSize: number): TubeGeometry {
  const flat = coilPathPoints(spec, null, POINTS_PER_TURN);
  const points: Vector3[] = [];
  for (let i = 0; i < flat.length; i += 3) points.push(new Vector3(flat[i], flat[i + 1], flat[i + 2]));
  // a loop's samples end on their start: drop the repeat and let the curve close itself
  const closed = spec.kind === 'loop';
  if (closed) points.pop();
  const curve = new CatmullRomCurve3(points, closed, 'centripetal');
  const segments = Math.min(MAX_TUBULAR_SEGMENTS, points.length * 2);
  return new TubeGeometry(curve, segments, displayTubeRadius(spec, sceneSize), RADIAL_SEGMENTS, closed);
}

/**
 * One coil as a tube. The geometry is built once per coil spec (and scene size); placing the receiver
 * moves its parent group, never this geometry.
 */
export function CoilTube({ spec, sceneSize, colour, name }: { spec: CoilSpec; sceneSize: number; colour: string; name: string }) {
  const specKey = JSON.stringify(spec);
  // keyed on the spec's content: a refetched coil with equal numbers keeps its geometry
  const geometry = useMemo(() => buildCoilTube(spec, sceneSize), [specKey, sceneSize]);
  useEffect(() => () => geometry.dispose(), [geometry]);
  return (
    <mesh geometry={geometry} name={name} castShadow={false}>
      <meshStandardMaterial color={colour} metalness={0.35} roughness={0.38} />
    </mesh>
  );
}
