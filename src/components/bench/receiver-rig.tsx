'use client';

import { useFrame, useThree, type ThreeEvent } from '@react-three/fiber';
import { useEffect, useMemo, useRef, useState, type MutableRefObject } from 'react';
import { DoubleSide, Plane, Vector3, type Group } from 'three';
import type { CoilSpec } from '@/physics';
import type { BenchPlacement, Vec3 } from './bench-types';
import { CoilTube } from './coil-tube';
import { angleAroundCentre, movePlacement, poseFromPlacement, receiverMatrix, turnPlacement } from './placement-pose';
import { coilSize } from './scene-framing';
import { SCENE_COLOURS } from './scene-colours';

/** Below this |cos| between the view ray and the plane's normal, y = 0 is seen edge-on: drag on a camera-facing plane. */
const EDGE_ON_COS = 0.2;

type Drag =
  | { mode: 'move'; start: BenchPlacement; plane: Plane; from: Vector3 }
  | { mode: 'turn'; start: BenchPlacement; plane: Plane; fromDeg: number };

const hit = new Vector3();

interface ReceiverRigProps {
  spec: CoilSpec;
  sceneSize: number;
  /** the pose drawn each frame; the rig writes to it while dragging, the bench when inputs change */
  placementRef: MutableRefObject<BenchPlacement>;
  editable: boolean;
  onDrag: (placement: BenchPlacement) => void;
  onDragActive: (active: boolean) => void;
}

/**
 * The receiver with its two handles: its face (slide it in the x-z plane: distance and lateral offset)
 * and the ring around it (turn it about y: tilt). The pose comes from `placementRef` in useFrame, so a
 * drag moves the coil at frame rate without re-rendering React.
 */
export function ReceiverRig({ spec, sceneSize, placementRef, editable, onDrag, onDragActive }: ReceiverRigProps) {
  const group = useRef<Group>(null);
  const drag = useRef<Drag | null>(null);
  const [hover, setHover] = useState<'move' | 'turn' | null>(null);
  const [active, setActive] = useState<'move' | 'turn' | null>(null);
  const { camera, gl, invalidate } = useThree();
  const controls = useThree((s) => s.controls) as unknown as { enabled: boolean } | null;

  useFrame(() => {
    const g = group.current;
    if (!g) return;
    g.matrix.fromArray(receiverMatrix(placementRef.current));
    g.matrixWorldNeedsUpdate = true;
  });

  const size = coilSize(spec);
  const radius = spec.kind === 'spiral' ? spec.outerRadius : spec.radius;
  const length = spec.kind === 'helix' ? spec.length : 0;
  // the ring clears the coil however it is tilted: past its radius and its half-length
  const ringRadius = Math.hypot(radius, length / 2) * 1.25 + sceneSize * 0.01;
  const ringTube = Math.max(sceneSize * 0.0035, size * 0.012);

  useEffect(() => {
    gl.domElement.style.cursor = active ? 'grabbing' : hover ? 'grab' : '';
  }, [gl, hover, active]);

  const dragPlane = (e: ThreeEvent<PointerEvent>, centre: Vec3): Plane => {
    // the receiver only moves in y = 0; when that plane is edge-on, drag on one facing the camera
    if (Math.abs(e.ray.direction.y) > EDGE_ON_COS) return new Plane(new Vector3(0, 1, 0), 0);
    const normal = camera.getWorldDirection(new Vector3()).negate();
    return new Plane().setFromNormalAndCoplanarPoint(normal, new Vector3(...centre));
  };

  const start = (mode: 'move' | 'turn') => (e: ThreeEvent<PointerEvent>) => {
    if (!editable || e.button !== 0) return;
    e.stopPropagation();
    const p = placementRef.current;
    const centre = poseFromPlacement(p).position;
    const plane = dragPlane(e, centre);
    if (!e.ray.intersectPlane(plane, hit)) return;
    (e.target as unknown as Element).setPointerCapture(e.pointerId);
    drag.current = mode === 'move'
      ? { mode, start: p, plane, from: hit.clone() }
      : { mode, start: p, plane, fromDeg: angleAroundCentre(centre, [hit.x, hit.y, hit.z]) };
    if (controls) controls.enabled = false;
    setActive(mode);
    onDragActive(true);
  };

  const move = (e: ThreeEvent<PointerEvent>) => {
    const d = drag.current;
    if (!d || !e.ray.intersectPlane(d.plane, hit)) return;
    e.stopPropagation();
    const next = d.mode === 'move'
      ? movePlacement(d.start, hit.x - d.from.x, hit.z - d.from.z)
      : turnPlacement(d.start, d.fromDeg, angleAroundCentre(poseFromPlacement(d.start).position, [hit.x, hit.y, hit.z]));
    placementRef.current = next;
    invalidate();
    onDrag(next);
  };

  const end = (e: ThreeEvent<PointerEvent>) => {
    if (!drag.current) return;
    e.stopPropagation();
    (e.target as unknown as Element).releasePointerCapture(e.pointerId);
    drag.current = null;
    if (controls) controls.enabled = true;
    setActive(null);
    onDragActive(false);
  };

  const handlers = (mode: 'move' | 'turn') => ({
    onPointerDown: start(mode),
    onPointerMove: move,
    onPointerUp: end,
    onPointerCancel: end,
    onPointerOver: (e: ThreeEvent<PointerEvent>) => { if (editable) { e.stopPropagation(); setHover(mode); } },
    onPointerOut: () => setHover((h) => (h === mode ? null : h)),
  });

  const bodyHeight = Math.max(length, spec.wireDiameter * 2, sceneSize * 0.004);
  const faceOpacity = active === 'move' ? 0.28 : hover === 'move' ? 0.2 : 0.08;
  const ringColour = active === 'turn' || hover === 'turn' ? SCENE_COLOURS.handleActive : SCENE_COLOURS.handle;
  const axisPoints = useMemo(() => new Float32Array([0, 0, 0, 0, 0, Math.max(length / 2, 0) + size * 0.45]), [length, size]);

  return (
    <group ref={group} name="receiver" matrixAutoUpdate={false}>
      <CoilTube spec={spec} sceneSize={sceneSize} colour={SCENE_COLOURS.receiver} name="receiver-coil" />
      {/* grab body: the coil's outline as a faint cylinder (axis = local z) */}
      <mesh rotation={[Math.PI / 2, 0, 0]} {...handlers('move')} visible={editable}>
        <cylinderGeometry args={[radius, radius, bodyHeight, 48, 1, false]} />
        <meshBasicMaterial color={SCENE_COLOURS.handle} transparent opacity={faceOpacity} depthWrite={false} side={DoubleSide} toneMapped={false} />
      </mesh>
      {/* tilt ring about y, in the x-z plane through the centre */}
      {editable && (
        <mesh rotation={[Math.PI / 2, 0, 0]} {...handlers('turn')}>
          <torusGeometry args={[ringRadius, ringTube, 12, 96]} />
          <meshBasicMaterial color={ringColour} transparent opacity={active === 'turn' || hover === 'turn' ? 1 : 0.55} toneMapped={false} />
        </mesh>
      )}
      {/* the receiver's axis (its local +z), so tilt reads at a glance */}
      <line>
        <bufferGeometry>
          <bufferAttribute attach="attributes-position" args={[axisPoints, 3]} />
        </bufferGeometry>
        <lineBasicMaterial color={SCENE_COLOURS.axisLine} toneMapped={false} />
      </line>
    </group>
  );
}
