'use client';

import { OrbitControls } from '@react-three/drei';
import { Canvas, useFrame, useThree } from '@react-three/fiber';
import { useEffect, useMemo, useRef, type MutableRefObject } from 'react';
import { NoToneMapping, type PerspectiveCamera, type Vector3 } from 'three';
import { coilPathPoints, type CoilSpec } from '@/physics';
import type { BenchPlacement, CameraView, Vec3 } from './bench-types';
import { CoilTube } from './coil-tube';
import { boundsOfPoints, type FieldGrid } from './field-grid';
import { ReceiverRig } from './receiver-rig';
import { CAMERA_FOV_DEG, coilSize, defaultView, gridScaleFor, roundVec } from './scene-framing';
import { SCENE_COLOURS } from './scene-colours';
import { Axes, FieldPlane, GroundGrid, OperatorMarker } from './scene-extras';

/** The part of drei's OrbitControls the view controller uses. */
interface OrbitLike {
  target: Vector3;
  update(): void;
  addEventListener(type: 'change', listener: () => void): void;
  removeEventListener(type: 'change', listener: () => void): void;
}

/** What the bench can ask of the scene from outside the canvas. */
export interface SceneHandle {
  /** the camera as it is now, to save with a setup */
  getView(): CameraView | null;
}

export interface BenchSceneProps {
  transmitter: CoilSpec;
  receiver: CoilSpec;
  placement: BenchPlacement;
  editable: boolean;
  /** called at most once per frame while dragging, and once more with the final placement */
  onPlacementChange: (placement: BenchPlacement) => void;
  onInteractionChange: (active: boolean) => void;
  operatorPoint: Vec3;
  field: { grid: FieldGrid; pixels: Uint8ClampedArray } | null;
  /** a view to show; applied again whenever `viewVersion` changes (opening a setup) */
  view: CameraView | null;
  viewVersion: number;
  handleRef: MutableRefObject<SceneHandle | null>;
}

/** Applies a saved or default view when asked, and reports the live one. */
function ViewController({ view, version, fallback, sceneSize, handleRef }: { view: CameraView | null; version: number; fallback: CameraView; sceneSize: number; handleRef: MutableRefObject<SceneHandle | null> }) {
  const camera = useThree((s) => s.camera) as PerspectiveCamera;
  const controls = useThree((s) => s.controls) as unknown as OrbitLike | null;
  const invalidate = useThree((s) => s.invalidate);
  const gl = useThree((s) => s.gl);
  const fallbackKey = JSON.stringify(fallback);
  const wanted = view ?? fallback;

  // the Canvas applies its camera props once: clipping planes follow the coils' size here
  useEffect(() => {
    camera.near = sceneSize / 500;
    camera.far = sceneSize * 400;
    camera.updateProjectionMatrix();
    invalidate();
  }, [camera, sceneSize, invalidate]);

  useEffect(() => {
    if (!controls) return;
    camera.position.set(...wanted.position);
    controls.target.set(...wanted.target);
    controls.update();
    invalidate();
    // only a new version (setup opened) or new coils re-aim the camera; moving the receiver does not
  }, [controls, version, fallbackKey]);

  useEffect(() => {
    const getView = () => (controls ? { position: roundVec(camera.position.toArray()), target: roundVec(controls.target.toArray()) } : null);
    handleRef.current = { getView };
    // the live view is also on the canvas element (data-view), where end-to-end tests can read it
    const publish = () => {
      gl.domElement.dataset.view = JSON.stringify(getView());
    };
    publish();
    controls?.addEventListener('change', publish);
    return () => {
      controls?.removeEventListener('change', publish);
      handleRef.current = null;
    };
  }, [camera, controls, gl, handleRef, version, fallbackKey]);
  return null;
}

/** Keeps the scene's copy of the placement in step with the inputs, except during a drag. */
function PlacementSync({ placement, placementRef, dragging }: { placement: BenchPlacement; placementRef: MutableRefObject<BenchPlacement>; dragging: MutableRefObject<boolean> }) {
  const invalidate = useThree((s) => s.invalidate);
  useEffect(() => {
    if (dragging.current) return;
    placementRef.current = placement;
    invalidate();
  }, [placement, placementRef, dragging, invalidate]);
  return null;
}

/** Counts rendered frames on the canvas element (data-frames), so tests can wait for a real picture. */
function FrameCounter() {
  const gl = useThree((s) => s.gl);
  const count = useRef(0);
  useFrame(() => {
    count.current += 1;
    gl.domElement.dataset.frames = String(count.current);
  });
  return null;
}

/**
 * The 3D bench: both coils as tubes along the paths the solver integrates, transmitter at the origin,
 * receiver at its placement, axes, a ground grid, the operator point and (optionally) the |B| plane.
 * Rendered on demand (frameloop "demand"): nothing is drawn while nothing changes.
 */
export default function BenchScene(props: BenchSceneProps) {
  const { transmitter, receiver, placement, editable, onPlacementChange, onInteractionChange, operatorPoint, field, view, viewVersion, handleRef } = props;
  const placementRef = useRef<BenchPlacement>(placement);
  const dragging = useRef(false);
  const pendingFrame = useRef<number | null>(null);
  const latestDrag = useRef<BenchPlacement>(placement);

  const sceneSize = Math.max(coilSize(transmitter), coilSize(receiver));
  const txKey = JSON.stringify(transmitter);
  const rxKey = JSON.stringify(receiver);
  // The framing depends on the coils only: the default view and grid do not jump as the receiver moves.
  const framing = useMemo(() => {
    const tx = coilPathPoints(transmitter, null, 16);
    const rx = coilPathPoints(receiver, placementRef.current, 16);
    const bounds = boundsOfPoints(tx, rx);
    const txBounds = boundsOfPoints(tx);
    return { fallback: defaultView(bounds), groundZ: txBounds.min[2] - sceneSize * 0.08 };
  }, [txKey, rxKey, sceneSize]);
  const gridScale = gridScaleFor(sceneSize);

  useEffect(() => () => {
    if (pendingFrame.current !== null) cancelAnimationFrame(pendingFrame.current);
  }, []);

  const onDrag = (p: BenchPlacement) => {
    latestDrag.current = p;
    if (pendingFrame.current !== null) return;
    pendingFrame.current = requestAnimationFrame(() => {
      pendingFrame.current = null;
      onPlacementChange(latestDrag.current);
    });
  };
  const onDragActive = (active: boolean) => {
    dragging.current = active;
    if (!active) {
      if (pendingFrame.current !== null) cancelAnimationFrame(pendingFrame.current);
      pendingFrame.current = null;
      onPlacementChange(placementRef.current);
    }
    onInteractionChange(active);
  };

  return (
    <Canvas
      frameloop="demand"
      dpr={[1, 2]}
      flat
      gl={{ preserveDrawingBuffer: true, antialias: true, toneMapping: NoToneMapping }}
      camera={{ fov: CAMERA_FOV_DEG, near: sceneSize / 500, far: sceneSize * 400, up: [0, 0, 1], position: framing.fallback.position }}
      aria-label="3D view of the two coils"
      role="img"
    >
      <color attach="background" args={[SCENE_COLOURS.background]} />
      <hemisphereLight args={['#e9edf3', '#2a3547', 1.6]} />
      <directionalLight position={[sceneSize * 2, -sceneSize * 3, sceneSize * 4]} intensity={2.2} />
      <directionalLight position={[-sceneSize * 3, sceneSize * 2, sceneSize]} intensity={0.6} />
      <OrbitControls makeDefault enableDamping={false} minDistance={sceneSize * 0.2} maxDistance={sceneSize * 60} />
      <ViewController view={view} version={viewVersion} fallback={framing.fallback} sceneSize={sceneSize} handleRef={handleRef} />
      <PlacementSync placement={placement} placementRef={placementRef} dragging={dragging} />
      <FrameCounter />
      <GroundGrid z={framing.groundZ} scale={gridScale} extent={sceneSize} />
      <Axes length={gridScale.section * 0.5} />
      <CoilTube spec={transmitter} sceneSize={sceneSize} colour={SCENE_COLOURS.transmitter} name="transmitter-coil" />
      <ReceiverRig spec={receiver} sceneSize={sceneSize} placementRef={placementRef} editable={editable} onDrag={onDrag} onDragActive={onDragActive} />
      <OperatorMarker point={operatorPoint} size={sceneSize * 0.018} />
      {field && <FieldPlane grid={field.grid} pixels={field.pixels} />}
    </Canvas>
  );
}
