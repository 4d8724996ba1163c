'use client';

import Link from 'next/link';
import { usePathname, useRouter, useSearchParams } from 'next/navigation';
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { Alert } from '@/components/ui/alert';
import { Panel } from '@/components/ui/panel';
import { Skeleton } from '@/components/ui/skeleton';
import { useSolverWorker } from '@/hooks/use-solver-worker';
import { useStudyCoils } from '@/hooks/use-study-coils';
import { useStudySetups } from '@/hooks/use-study-setups';
import { coilPathPoints, type CircuitSpec, type Population } from '@/physics';
import type { SceneHandle } from './bench-scene';
import type { BenchPlacement, CameraView, Coil, Setup, Vec3 } from './bench-types';
import { buildSolveRequest, REFINED_TOLERANCE } from './build-request';
import { CautionPanel } from './caution-panel';
import { raisedCautions } from './cautions';
import { CircuitPanel } from './circuit-panel';
import { CoilPickers } from './coil-pickers';
import { boundsOfPoints, fieldGridAround, fieldPixels, fieldScale } from './field-grid';
import { FieldMapPanel } from './field-map-panel';
import { PlacementPanel } from './placement-panel';
import { ReadoutPanel } from './readout-panel';
import { SceneFrame, useSceneSupport } from './scene-frame';
import { coilSize, gridScaleFor } from './scene-framing';
import { defaultEdit, editFromSetup, parseSetupParam, setupInputFrom, type BenchEdit } from './setup-state';
import { SetupsPanel } from './setups-panel';
import { TiltChart } from './tilt-chart';

/** Points per turn of the outlines on the field map (display only). */
const OUTLINE_POINTS_PER_TURN = 48;

interface BenchWorkspaceProps {
  studyId: number;
  studyFrequencyHz: number | null;
  canEdit: boolean;
  initialCoils?: Coil[];
  initialSetups?: Setup[];
}

/**
 * The placement bench: coils, placement, circuit and operator point as state; the scene, the readout,
 * the tilt chart and the field map as views of it; src/physics in Web Workers (useSolverWorker).
 */
export function BenchWorkspace({ studyId, studyFrequencyHz, canEdit, initialCoils, initialSetups }: BenchWorkspaceProps) {
  const { coils, error: coilsError } = useStudyCoils(studyId, initialCoils);
  const { setups, error: setupsError, mutate: mutateSetups } = useStudySetups(studyId, initialSetups);
  const router = useRouter();
  const pathname = usePathname();
  const setupParam = parseSetupParam(useSearchParams().get('setup'));

  const [edit, setEdit] = useState<BenchEdit | null>(null);
  const [openSetupId, setOpenSetupId] = useState<number | null>(null);
  const [openError, setOpenError] = useState<string | null>(null);
  const [view, setView] = useState<CameraView | null>(null);
  const [viewVersion, setViewVersion] = useState(0);
  const [dragging, setDragging] = useState(false);
  const [sliding, setSliding] = useState(false);
  const [population, setPopulation] = useState<Population>('general');
  const [showField, setShowField] = useState(false);
  const [support, markNoScene] = useSceneSupport();
  const sceneHandle = useRef<SceneHandle | null>(null);
  // a setup just saved from this bench: when the URL names it, it becomes the open setup as it is on screen
  const adopt = useRef<number | null>(null);

  const applySetup = useCallback((s: Setup) => {
    setEdit(editFromSetup(s));
    setOpenSetupId(s.id);
    setView(s.view);
    setViewVersion((v) => v + 1);
    setOpenError(null);
  }, []);

  // Open the setup named in the URL (?setup=ID) once coils and setups are known; otherwise start from defaults.
  useEffect(() => {
    if (!coils) return;
    if (setupParam === null) {
      if (openSetupId !== null) setOpenSetupId(null);
      if (!edit) setEdit(defaultEdit(coils, studyFrequencyHz));
      return;
    }
    if (setupParam === openSetupId) return;
    if (adopt.current === setupParam) {
      adopt.current = null;
      setOpenSetupId(setupParam);
      return;
    }
    if (!setups) return;
    const s = setups.find((x) => x.id === setupParam);
    if (s) return applySetup(s);
    setOpenError('That setup is not in this study (it may have been deleted). The bench shows the default placement.');
    if (!edit) setEdit(defaultEdit(coils, studyFrequencyHz));
  }, [coils, setups, setupParam, openSetupId, edit, studyFrequencyHz, applySetup]);

  const openSetup = setups?.find((s) => s.id === openSetupId) ?? null;
  const tx = coils?.find((c) => c.id === edit?.transmitterCoilId) ?? null;
  const rx = coils?.find((c) => c.id === edit?.receiverCoilId) ?? null;
  const placement = edit?.placement ?? null;
  const circuit = edit?.circuit ?? null;
  const operatorPoint = edit?.operatorPoint ?? null;

  const request = useMemo(
    () => (tx && rx && placement && circuit ? buildSolveRequest({ transmitter: tx.spec, receiver: rx.spec, placement, circuit }, REFINED_TOLERANCE) : null),
    [tx, rx, placement, circuit],
  );
  const outlines = useMemo(
    () => (tx && rx && placement ? { tx: coilPathPoints(tx.spec, null, OUTLINE_POINTS_PER_TURN), rx: coilPathPoints(rx.spec, placement, OUTLINE_POINTS_PER_TURN) } : null),
    [tx, rx, placement],
  );
  const grid = useMemo(
    () => (outlines && operatorPoint ? fieldGridAround(boundsOfPoints(outlines.tx, outlines.rx, [operatorPoint[0], 0, operatorPoint[2]])) : null),
    [outlines, operatorPoint],
  );
  const results = useSolverWorker({
    request,
    interacting: dragging || sliding,
    field: grid && operatorPoint ? { grid, operatorPoint, population } : null,
  });

  const fieldAnswer = results.field.answer;
  const fieldPictures = useMemo(() => {
    if (!fieldAnswer) return null;
    const scale = fieldScale(fieldAnswer.values);
    return {
      scale,
      image: fieldPixels(fieldAnswer.values, fieldAnswer.grid.n, scale, true),
      texture: fieldPixels(fieldAnswer.values, fieldAnswer.grid.n, scale, false),
    };
  }, [fieldAnswer]);

  const update = useCallback((patch: Partial<BenchEdit>) => setEdit((e) => (e ? { ...e, ...patch } : e)), []);
  const setPlacement = useCallback((p: BenchPlacement) => update({ placement: p }), [update]);
  const setCircuit = useCallback((c: CircuitSpec) => update({ circuit: c }), [update]);
  const setOperatorPoint = useCallback((p: Vec3) => update({ operatorPoint: p }), [update]);

  const dirty = Boolean(openSetup && edit && JSON.stringify(editFromSetup(openSetup)) !== JSON.stringify(edit));

  const onSaved = async (saved: Setup) => {
    adopt.current = saved.id;
    await mutateSetups();
    router.replace(`${pathname}?setup=${saved.id}`, { scroll: false });
  };

  if (coilsError) return <Alert tone="error">The coils of this study could not be loaded: {coilsError.message}</Alert>;
  if (!coils || !edit) return <Skeleton label="Loading the bench" rows={4} />;
  if (coils.length === 0) {
    return (
      <Panel title="No coils yet">
        <p className="text-sm text-ink-700">
          The bench places two of the study&apos;s coils. Add them in the{' '}
          <Link href={`/studies/${studyId}/coils`} className="font-medium text-flux-700 hover:underline">coil library</Link> first.
        </p>
      </Panel>
    );
  }

  const sceneSize = Math.max(tx ? coilSize(tx.spec) : 0, rx ? coilSize(rx.spec) : 0, 1e-3);
  const solved = results.solve.current ? results.solve.answer?.response ?? null : null;
  const limiting = results.field.current ? results.field.answer?.operator?.limiting ?? null : null;
  const raised = raisedCautions({
    txCapacitorVoltage: solved?.transfer.txCapacitorVoltage ?? null,
    rxCapacitorVoltage: solved?.transfer.rxCapacitorVoltage ?? null,
    operatorRatio: limiting?.ratio ?? null,
    noApplicableLevel: Boolean(results.field.current && results.field.answer?.operator && !limiting),
  });
  const currentK = results.solve.current ? results.solve.answer?.response.coupling ?? null : null;

  return (
    <div className="space-y-6">
      {openError && <Alert tone="error">{openError}</Alert>}
      {results.workerError && <Alert tone="error">{results.workerError}</Alert>}
      {(!tx || !rx) && <Alert tone="error">A coil of this setup is no longer in the library. Choose the coils again.</Alert>}

      <CoilPickers
        studyId={studyId}
        coils={coils}
        transmitterId={edit.transmitterCoilId}
        receiverId={edit.receiverCoilId}
        onChange={(ids) => update(ids)}
      />

      <div className="grid items-start gap-6 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <div className="space-y-6">
          {support === 'webgl' && tx && rx ? (
            <SceneFrame
              gridScale={gridScaleFor(sceneSize)}
              editable
              onFail={markNoScene}
              scene={{
                transmitter: tx.spec,
                receiver: rx.spec,
                placement: edit.placement,
                editable: true,
                onPlacementChange: setPlacement,
                onInteractionChange: setDragging,
                operatorPoint: edit.operatorPoint,
                field: showField && fieldAnswer && fieldPictures ? { grid: fieldAnswer.grid, pixels: fieldPictures.texture } : null,
                view,
                viewVersion,
                handleRef: sceneHandle,
              }}
            />
          ) : support === 'none' ? (
            <Alert tone="info" title="3D view unavailable">
              This browser cannot draw the 3D view here (WebGL 2 is off or not supported). Everything else works: place the receiver
              with the numbers below and read the results beside them.
            </Alert>
          ) : (
            <div className="h-[440px] rounded-md bg-ink-950" />
          )}
          <div className="grid gap-6 md:grid-cols-2">
            <PlacementPanel placement={edit.placement} sceneSize={sceneSize} onChange={setPlacement} onSlideActive={setSliding} />
            <TiltChart
              sweep={results.sweep}
              tiltDeg={edit.placement.tiltDeg}
              currentK={currentK}
              distance={edit.placement.distance}
              lateralOffset={edit.placement.lateralOffset}
            />
          </div>
          <CircuitPanel circuit={edit.circuit} onChange={setCircuit} />
        </div>
        <div className="space-y-6">
          <ReadoutPanel solve={results.solve} />
          <CautionPanel
            raised={raised}
            txCapacitorVoltage={solved?.transfer.txCapacitorVoltage ?? null}
            rxCapacitorVoltage={solved?.transfer.rxCapacitorVoltage ?? null}
            limiting={limiting}
            frequencyHz={edit.circuit.frequency}
          />
        </div>
      </div>

      {outlines && (
          <FieldMapPanel
            field={results.field}
            pixels={fieldPictures?.image ?? null}
            scale={fieldPictures?.scale ?? null}
            outlines={outlines}
            operatorPoint={edit.operatorPoint}
            onOperatorPointChange={setOperatorPoint}
            population={population}
            onPopulationChange={setPopulation}
            showInScene={showField}
            onShowInSceneChange={setShowField}
            sceneAvailable={support === 'webgl'}
          />
      )}

      <SetupsPanel
        studyId={studyId}
        setups={setups}
        coils={coils}
        loadError={setupsError ? `The saved setups could not be loaded: ${setupsError.message}` : null}
        openSetup={openSetup}
        canEdit={canEdit}
        dirty={dirty}
        buildInput={(name, notes) => setupInputFrom(edit, name, notes, sceneHandle.current?.getView() ?? view)}
        onSaved={onSaved}
        onRevert={() => openSetup && applySetup(openSetup)}
      />
    </div>
  );
}
