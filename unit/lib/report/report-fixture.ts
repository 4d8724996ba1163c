import type { Coil } from '../../../src/lib/data/coils';
import type { PlanPoint } from '../../../src/lib/data/plan-points';
import type { Plan } from '../../../src/lib/data/plans';
import type { Reading } from '../../../src/lib/data/readings';
import type { Setup } from '../../../src/lib/data/setups';
import type { PlanAxis } from '../../../src/lib/plans/axes';
import type { PlanPose } from '../../../src/lib/plans/points';
import { poseKey } from '../../../src/lib/plans/solve-job';
import type { PlanReport } from '../../../src/lib/report/types';
import type {
  AgreementSummary, FitResult, PlanComment, PlanDecision, PlanReview, ReviewObservation, ReviewPose, ReviewQuantity,
} from '../../../src/lib/review/types';
import { FORMULAS } from '../../../src/physics/measurement/formulas';

/**
 * A hand-built report (no database): a plan of 3 tilts x 2 distances with a reference revisit,
 * coupling and efficiency measured, M not. The renderers print the summaries as given, so each
 * summary here is written out rather than computed (src/lib/review/assemble.ts computes them and is
 * tested on its own).
 */

export const PLAN_NAME = 'Probe tilt × depth, "rig B" / Ω-load';
export const STUDY_NAME = 'Seed-tray pad to buried soil probes';
/** A comment that a spreadsheet would run as a formula if written as is. */
export const FORMULA_COMMENT = '=HYPERLINK("http://example.invalid","open")';
export const GENERATED_AT = '2026-12-02T09:31:00.000Z';

const WHEN = '2026-12-01T14:02:00.000Z';
const researcher = { id: 2, name: 'Ines Okafor' };
const supervisor = { id: 4, name: 'Maren Solberg' };
const L1 = 10e-6;
const L2 = 2e-6;

const axes: PlanAxis[] = [
  { quantity: 'tiltDeg', displayUnit: 'deg', mode: 'list', values: [0, 30, 60] },
  { quantity: 'distance', displayUnit: 'cm', mode: 'range', start: 0.05, stop: 0.1, step: 0.05 },
];

/** A made-up but smooth prediction: k falls with tilt and distance. */
const couplingAt = (pose: PlanPose) => 0.12 * Math.cos((pose.tiltDeg * Math.PI) / 180) * (0.05 / pose.distance) + 0.01;
const efficiencyAt = (pose: PlanPose) => 0.9 * couplingAt(pose) / (couplingAt(pose) + 0.02);

const poses: PlanPose[] = [0, 30, 60].flatMap((tiltDeg) => [0.05, 0.1].map((distance) => ({ distance, lateralOffset: 0, tiltDeg })));
/** Poses 1-6 in order, then the first pose again as a reference revisit. */
const pointPoses = [...poses, poses[0]];

const points: PlanPoint[] = pointPoses.map((pose, i) => {
  const k = couplingAt(pose);
  return {
    id: 100 + i,
    seq: i + 1,
    repeatIndex: 1,
    isReference: i === 6,
    pose,
    predicted: {
      coupling: k, mutualInductance: k * Math.sqrt(L1 * L2), txSelfInductance: L1, rxSelfInductance: L2, txResistance: 0.4, rxResistance: 0.2,
      efficiency: efficiencyAt(pose), loadPower: 1.5 * efficiencyAt(pose), fieldRatio: 0.2,
    },
    solverVersion: '1.0.0',
  };
});

/** Relative error of each point's reading (seq 6 is not measured; seq 4 is set aside; seq 5 is flagged). */
const RELATIVE: Record<number, number> = { 1: 0.02, 2: -0.03, 3: 0.04, 4: 0.25, 5: -0.06, 7: 0.01 };
const SET_ASIDE_SEQ = 4;
const FLAGGED_SEQ = 5;
const U_RELATIVE = 0.01;

function review(quantity: ReviewQuantity, measured: boolean, summary: AgreementSummary, fit: FitResult | null, decisions: PlanDecision[]): PlanReview {
  const predictedOf = (p: PlanPoint) => (p.predicted ? p.predicted[quantity] : null);
  const observations: ReviewObservation[] = measured
    ? points.filter((p) => RELATIVE[p.seq] !== undefined).map((p) => {
        const predicted = predictedOf(p)!;
        const value = predicted * (1 + RELATIVE[p.seq]);
        const uncertainty = Math.abs(value) * U_RELATIVE;
        return {
          readingId: 500 + p.seq, pointId: p.id, seq: p.seq, repeatIndex: 1, isReference: p.isReference, poseKey: poseKey(p.pose),
          method: 'open_circuit', value, uncertainty, residual: value - predicted, relative: RELATIVE[p.seq], normalized: (value - predicted) / uncertainty,
          autoOutlier: p.seq === FLAGGED_SEQ || p.seq === SET_ASIDE_SEQ, setAside: p.seq === SET_ASIDE_SEQ,
        };
      })
    : [];
  const reviewPoses: ReviewPose[] = poses.map((pose) => {
    const at = points.filter((p) => poseKey(p.pose) === poseKey(pose));
    const kept = observations.filter((o) => o.poseKey === poseKey(pose) && !o.setAside);
    const predicted = predictedOf(at[0]);
    const mean = kept.length ? kept.reduce((s, o) => s + o.value, 0) / kept.length : null;
    const u = kept.length ? Math.max(...kept.map((o) => o.uncertainty)) : null;
    const residual = mean !== null && predicted !== null ? mean - predicted : null;
    return {
      key: poseKey(pose), pose, pointIds: at.map((p) => p.id), seqs: at.map((p) => p.seq), predicted,
      measured: mean === null ? null : { mean, uncertainty: u!, n: kept.length },
      residual, relative: residual === null ? null : residual / predicted!, normalized: residual === null ? null : residual / u!,
      autoOutlier: kept.some((o) => o.autoOutlier),
      refit: fit ? predicted! * 1.01 : null,
    };
  });
  return {
    plan: { id: 7, studyId: 1, name: PLAN_NAME, state: 'in_review', axes, pointCount: points.length },
    quantity, tolerance: 0.05, poses: reviewPoses, observations, summary,
    marks: [{ pointId: 100 + SET_ASIDE_SEQ - 1, seq: SET_ASIDE_SEQ, reason: 'Scope left on the ×1 probe setting.', markedBy: researcher, createdAt: WHEN }],
    fit, decisions,
  };
}

export const COUPLING_SUMMARY: AgreementSummary = {
  compared: 5, observations: 6, rmsRelative: 0.0321, maxRelative: -0.06, bias: -0.004, tolerance: 0.05, outsideTolerance: 1, autoOutliers: 2, setAside: 1,
};
const EMPTY_SUMMARY: AgreementSummary = {
  compared: 0, observations: 0, rmsRelative: null, maxRelative: null, bias: null, tolerance: 0.05, outsideTolerance: 0, autoOutliers: 0, setAside: 1,
};

const fit: FitResult = {
  id: 1, model: 'tilt_offset', quantity: 'coupling', value: 4.1, uncertainty: 0.3, posesUsed: 5, chiSquare: 5.2, reducedChiSquare: 1.3,
  rmsRelativeAfter: 0.0102, repredicted: poses.map((p) => ({ poseKey: poseKey(p), value: couplingAt(p) * 1.01 })), solverVersion: '1.0.0',
  createdBy: researcher, createdAt: WHEN,
};

const decisions: PlanDecision[] = [
  { id: 1, decision: 'returned', reason: 'Point 4 looks like a range slip; please re-measure it.', reviewer: supervisor, createdAt: '2026-11-30T10:00:00.000Z', summary: COUPLING_SUMMARY },
];

function reading(p: PlanPoint, version: number, extra: Partial<Reading> = {}): Reading {
  const k = p.predicted!.coupling * (1 + RELATIVE[p.seq]);
  return {
    id: 500 + p.seq + (version - 1) * 1000, planId: 7, pointId: p.id, pointSeq: p.seq, repeatIndex: 1, version, supersedesId: null, correctionReason: null,
    current: true, method: 'open_circuit',
    raw: { frequency: 6.78e6, txCurrent: 0.25, rxVoltage: 2 * Math.PI * 6.78e6 * 0.25 * k * Math.sqrt(L1 * L2) },
    accuracy: { relative: 0.005, phaseDeg: 1 },
    derived: {
      formula: FORMULAS.open_circuit, mutualInductance: { value: k * Math.sqrt(L1 * L2), uncertainty: 1e-9 }, coupling: { value: k, uncertainty: k * U_RELATIVE },
      efficiency: null, selfInductanceSource: 'predicted', warnings: [],
    },
    achievedPose: null, instrument: 'Scope, 10:1 probe', calibration: 'in_date', temperatureC: 21.5, setupNotes: '', source: 'form',
    importId: null, attachmentId: null, createdBy: { id: 3, name: 'Tomasz Rehn' }, createdAt: WHEN, ...extra,
  };
}

const readings: Reading[] = points.filter((p) => RELATIVE[p.seq] !== undefined).flatMap((p) =>
  p.seq === 2
    ? [reading(p, 1, { current: false }), reading(p, 2, { supersedesId: 502, correctionReason: '-3 dB attenuator was not entered' })]
    : [reading(p, 1)],
);

const comments: PlanComment[] = [
  { id: 1, pointId: null, seq: null, body: 'Load was the 50 Ω dummy throughout.', author: { ...researcher, role: 'researcher' }, createdAt: WHEN },
  { id: 2, pointId: 104, seq: 5, body: FORMULA_COMMENT, author: { ...supervisor, role: 'supervisor' }, createdAt: WHEN },
  { id: 3, pointId: null, seq: null, body: 'Second line follows,\nwith a comma and "quotes".', author: { ...supervisor, role: 'supervisor' }, createdAt: WHEN },
];

const coil = (id: number, name: string, spec: Coil['spec']): Coil => ({
  id, studyId: 1, name, spec, wireLabel: 'AWG 22', measured: { inductance: null, resistance: null, qualityFactor: null, frequencyHz: null },
  notes: '', predicted: { frequencyHz: 6.78e6, selfInductance: id === 1 ? L1 : L2, dcResistance: 0.1, acResistance: 0.4 }, createdAt: WHEN, updatedAt: WHEN,
});

const setup: Setup = {
  id: 3, studyId: 1, name: 'Probe 10 cm deep, upright', transmitterCoilId: 1, receiverCoilId: 2,
  placement: { distance: 0.1, lateralOffset: 0, tiltDeg: 0 },
  circuit: { frequency: 6.78e6, topology: 'SS', sourceVoltage: 5, sourceResistance: 0.5, loadResistance: 50 },
  operatorPoint: [0.4, 0, 0.3], view: null, notes: '+ rig B on the north bench', createdAt: WHEN, updatedAt: WHEN,
};

const plan: Plan = {
  id: 7, studyId: 1, setupId: 3, name: PLAN_NAME, state: 'in_review', axes, repeats: 1, referenceEvery: 6, orderMode: 'as_listed', shuffleSeed: null,
  minutesPerPoint: 2, notes: 'Tilt jig on the bench rig.', pointCount: points.length, estimatedMinutes: 14,
  prediction: { status: 'done', done: points.length, total: points.length, error: null, solverVersion: '1.0.0' }, createdAt: WHEN, updatedAt: WHEN,
};

export function reportFixture(): PlanReport {
  return {
    generatedAt: GENERATED_AT,
    study: { id: 1, name: STUDY_NAME },
    plan,
    setup,
    transmitter: coil(1, 'Seed-tray pad', { kind: 'spiral', innerRadius: 0.03, outerRadius: 0.14, turns: 8, wireDiameter: 0.00129 }),
    receiver: coil(2, 'Soil probe', { kind: 'helix', radius: 0.012, turns: 12, length: 0.03, wireDiameter: 0.000644 }),
    points,
    reviews: {
      coupling: review('coupling', true, COUPLING_SUMMARY, fit, decisions),
      mutualInductance: review('mutualInductance', false, EMPTY_SUMMARY, null, decisions),
      efficiency: review('efficiency', true, { ...COUPLING_SUMMARY, rmsRelative: 0.0456 }, null, decisions),
    },
    comments,
    readings,
  };
}
