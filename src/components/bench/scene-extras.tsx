'use client';

import { Grid, Html } from '@react-three/drei';
import { useEffect, useMemo } from 'react';
import { DataTexture, DoubleSide, LinearFilter, RGBAFormat, SRGBColorSpace } from 'three';
import type { Vec3 } from './bench-types';
import type { FieldGrid } from './field-grid';
import type { GridScale } from './scene-framing';
import { SCENE_COLOURS } from './scene-colours';

/** The ground grid in a horizontal plane (z = const: the scene is z-up like the physics). */
export function GroundGrid({ z, scale, extent }: { z: number; scale: GridScale; extent: number }) {
  return (
    <Grid
      position={[0, 0, z]}
      rotation={[Math.PI / 2, 0, 0]}
      cellSize={scale.cell}
      sectionSize={scale.section}
      cellThickness={0.6}
      sectionThickness={1.1}
      cellColor={SCENE_COLOURS.gridCell}
      sectionColor={SCENE_COLOURS.gridSection}
      infiniteGrid
      fadeDistance={extent * 6}
      fadeStrength={1.5}
      side={DoubleSide}
    />
  );
}

function AxisLabel({ at, text, colour }: { at: Vec3; text: string; colour: string }) {
  return (
    <Html position={at} center zIndexRange={[10, 0]} style={{ pointerEvents: 'none' }}>
      <span style={{ color: colour, font: '600 11px ui-monospace, monospace' }}>{text}</span>
    </Html>
  );
}

/** x, y, z from the transmitter's centre, with labels. */
export function Axes({ length }: { length: number }) {
  const lines = useMemo(
    () =>
      ([
        [[length, 0, 0], SCENE_COLOURS.axisX, 'x'],
        [[0, length, 0], SCENE_COLOURS.axisY, 'y'],
        [[0, 0, length], SCENE_COLOURS.axisZ, 'z'],
      ] as [Vec3, string, string][]).map(([end, colour, text]) => ({ points: new Float32Array([0, 0, 0, ...end]), end, colour, text })),
    [length],
  );
  return (
    <group name="axes">
      {lines.map((l) => (
        <group key={l.text}>
          <line>
            <bufferGeometry>
              <bufferAttribute attach="attributes-position" args={[l.points, 3]} />
            </bufferGeometry>
            <lineBasicMaterial color={l.colour} toneMapped={false} />
          </line>
          <AxisLabel at={l.end.map((v) => v * 1.12) as Vec3} text={l.text} colour={l.colour} />
        </group>
      ))}
    </group>
  );
}

/** The operator's position: a small marker with a label. */
export function OperatorMarker({ point, size }: { point: Vec3; size: number }) {
  return (
    <group position={point} name="operator-point">
      <mesh>
        <octahedronGeometry args={[size, 0]} />
        <meshBasicMaterial color={SCENE_COLOURS.operator} toneMapped={false} />
      </mesh>
      <Html position={[0, 0, size * 2.2]} center zIndexRange={[10, 0]} style={{ pointerEvents: 'none' }}>
        <span style={{ color: SCENE_COLOURS.operator, font: '500 11px ui-sans-serif, system-ui', whiteSpace: 'nowrap' }}>operator</span>
      </Html>
    </group>
  );
}

/** |B| on y = 0 as a translucent texture, the same pixels as the map beside the scene. */
export function FieldPlane({ grid, pixels }: { grid: FieldGrid; pixels: Uint8ClampedArray }) {
  const texture = useMemo(() => {
    const t = new DataTexture(new Uint8Array(pixels.buffer.slice(0)), grid.n, grid.n, RGBAFormat);
    t.colorSpace = SRGBColorSpace;
    t.magFilter = LinearFilter;
    t.minFilter = LinearFilter;
    t.needsUpdate = true;
    return t;
  }, [grid.n, pixels]);
  useEffect(() => () => texture.dispose(), [texture]);
  // a texel is centred on its grid point: the plane reaches half a cell past the outer points
  const cellX = (grid.xMax - grid.xMin) / (grid.n - 1);
  const cellZ = (grid.zMax - grid.zMin) / (grid.n - 1);
  return (
    <mesh
      position={[(grid.xMin + grid.xMax) / 2, 0, (grid.zMin + grid.zMax) / 2]}
      rotation={[Math.PI / 2, 0, 0]}
      name="field-plane"
      // after the ground grid, so the grid behind shows through the tint instead of drawing over it
      renderOrder={2}
    >
      <planeGeometry args={[grid.xMax - grid.xMin + cellX, grid.zMax - grid.zMin + cellZ]} />
      <meshBasicMaterial map={texture} transparent opacity={0.6} side={DoubleSide} depthWrite={false} toneMapped={false} />
    </mesh>
  );
}
