'use client';

import dynamic from 'next/dynamic';
import { Component, useEffect, useState, type ReactNode } from 'react';
import type { BenchSceneProps } from './bench-scene';
import type { GridScale } from './scene-framing';
import { hasWebGL2 } from './webgl-support';

/** three.js and react-three-fiber load with this page only, and only in the browser. */
const BenchScene = dynamic(() => import('./bench-scene'), {
  ssr: false,
  loading: () => <SceneMessage>Loading the 3D view…</SceneMessage>,
});

function SceneMessage({ children }: { children: ReactNode }) {
  return <div className="flex h-full items-center justify-center px-6 text-center text-sm text-ink-300">{children}</div>;
}

/** If the renderer fails after detection said yes (lost context, driver refusal), fall back to the numbers. */
class SceneBoundary extends Component<{ onFail: () => void; children: ReactNode }, { failed: boolean }> {
  state = { failed: false };
  static getDerivedStateFromError() {
    return { failed: true };
  }
  componentDidCatch() {
    this.props.onFail();
  }
  render() {
    return this.state.failed ? null : this.props.children;
  }
}

export type SceneSupport = 'checking' | 'webgl' | 'none';

/** WebGL 2 detection once on the client; 'checking' on the server and the first render. */
export function useSceneSupport(): [SceneSupport, () => void] {
  const [support, setSupport] = useState<SceneSupport>('checking');
  useEffect(() => setSupport(hasWebGL2() ? 'webgl' : 'none'), []);
  return [support, () => setSupport('none')];
}

/**
 * The dark viewport with the scene, its legend (grid scale, which coil is which) and a hint on the handles.
 */
export function SceneFrame({ scene, gridScale, editable, onFail }: { scene: BenchSceneProps; gridScale: GridScale; editable: boolean; onFail: () => void }) {
  return (
    <div className="relative h-[440px] overflow-hidden rounded-md bg-ink-950 ring-1 ring-ink-800" data-testid="bench-scene">
      <SceneBoundary onFail={onFail}>
        <BenchScene {...scene} />
      </SceneBoundary>
      <div className="pointer-events-none absolute left-3 top-3 space-y-1 text-[11px] leading-4 text-ink-300">
        <p className="flex items-center gap-2">
          <span aria-hidden="true" className="inline-block h-1.5 w-4 rounded-full bg-copper-500" /> transmitter, centre at the origin, axis +z
        </p>
        <p className="flex items-center gap-2">
          <span aria-hidden="true" className="inline-block h-1.5 w-4 rounded-full bg-copper-300" /> receiver
        </p>
      </div>
      <p className="pointer-events-none absolute bottom-3 left-3 rounded bg-ink-900/80 px-2 py-1 font-mono text-[11px] text-ink-200">
        Grid: {gridScale.label}
      </p>
      <p className="pointer-events-none absolute bottom-3 right-3 max-w-[18rem] text-right text-[11px] leading-4 text-ink-400">
        {editable ? 'Drag the receiver to slide it, its ring to tilt it. ' : ''}Drag the background to orbit, scroll to zoom.
      </p>
    </div>
  );
}
