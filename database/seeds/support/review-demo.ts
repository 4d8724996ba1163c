import type { Knex } from 'knex';
import { SOLVER_VERSION } from '../../../src/physics';
import { deriveReading } from '../../../src/physics/measurement/derive';
import { efficiencyWithExtraReceiverResistance } from '../../../src/physics/review/extra-resistance';
import { buildPlanPoints, type PlanLayout } from '../../../src/lib/plans/points';
import type { PointPrediction } from '../../../src/lib/plans/prediction';
import { pointPrediction, pointSolveJob, poseKey, type PlanSetupGeometry } from '../../../src/lib/plans/solve-job';
import { BENCH_CAUTIONS_VERSION } from '../../../src/lib/readings/bench-cautions';
import { predictedLink } from '../../../src/lib/review/fit-models';
import { runSolveJob } from '../../../src/lib/solver-pool/job';

/**
 * A plan already sent for review, so the supervisor has something to judge on a fresh start: the probe
 * at 10 cm tilted 0-60 degrees, each pose measured twice. The invented bench story behind the numbers:
 * the tilt jig sits about 4 degrees further over than its scale says, the probe's crimped leads add
 * some 0.3 ohm of loss, and at point 7 the scope was left on the wrong probe attenuation.
 */
export const REVIEW_DEMO_PLAN = 'Probe tilt at 10 cm';
const JIG_TILT_ERROR_DEG = 4;
const LEAD_RESISTANCE_OHM = 0.3;
const WRONG_RANGE_SEQ = 7;

interface Context {
  studyId: number;
  setupId: number;
  geometry: PlanSetupGeometry;
  ids: { researcher: number; student: number };
  daysAgo: (days: number) => Date;
}

const solveAt = (geometry: PlanSetupGeometry, pose: Parameters<typeof pointSolveJob>[1]): PointPrediction =>
  pointPrediction(runSolveJob(pointSolveJob(geometry, pose)));

export async function seedReviewPlan(knex: Knex, { studyId, setupId, geometry, ids, daysAgo }: Context): Promise<number> {
  const layout: PlanLayout = {
    axes: [{ quantity: 'tiltDeg', displayUnit: 'deg', mode: 'range', start: 0, stop: 60, step: 10 }],
    repeats: 2, referenceEvery: null, orderMode: 'as_listed', shuffleSeed: null,
  };
  const planPoints = buildPlanPoints(layout, { distance: 0.1, lateralOffset: 0, tiltDeg: 0 });
  const predicted = new Map(planPoints.map((p) => [poseKey(p.pose), solveAt(geometry, p.pose)]));
  const [planId] = await knex('sweep_plans').insert({
    study_id: studyId, setup_id: setupId, name: REVIEW_DEMO_PLAN, state: 'in_review',
    axes: JSON.stringify(layout.axes), repeats: layout.repeats, reference_every: null, order_mode: layout.orderMode,
    shuffle_seed: null, minutes_per_point: 2, notes: 'Tilt jig on the bench rig; probe centre held on the pad axis at 10 cm.',
    prediction_status: 'done', prediction_progress: planPoints.length, prediction_total: planPoints.length, solver_version: SOLVER_VERSION,
    created_by: ids.researcher, created_at: daysAgo(9), updated_at: daysAgo(2),
  });
  const pointIds: number[] = [];
  for (const p of planPoints) {
    const [id] = await knex('sweep_points').insert({
      plan_id: planId, seq: p.seq, repeat_index: p.repeatIndex, is_reference: p.isReference, pose: JSON.stringify(p.pose),
      predicted: JSON.stringify(predicted.get(poseKey(p.pose))), solver_version: SOLVER_VERSION,
    });
    pointIds.push(id);
  }

  await knex('caution_acknowledgements').insert({ plan_id: planId, user_id: ids.student, cautions_version: BENCH_CAUTIONS_VERSION });
  const accuracy = { relative: 0.005, phaseDeg: 1 };
  const frequency = geometry.circuit.frequency;
  const rows = planPoints.flatMap((p, i) => {
    const context = { predicted: predicted.get(poseKey(p.pose))! };
    // what the bench really had: the jig's extra tilt, then a small repeatable scatter
    const actual = solveAt(geometry, { ...p.pose, tiltDeg: p.pose.tiltDeg + JIG_TILT_ERROR_DEG });
    const scatter = 1 + 0.004 * Math.sin(p.seq * 2.3) * (p.repeatIndex === 1 ? 1 : -1);
    const rangeSlip = p.seq === WRONG_RANGE_SEQ ? 1.15 : 1;
    const txCurrent = 0.25;
    const rxVoltage = 2 * Math.PI * frequency * Math.abs(actual.mutualInductance) * txCurrent * scatter * rangeSlip;
    const openCircuit = { frequency, txCurrent, rxVoltage: Number(rxVoltage.toPrecision(4)), phaseDeg: 89.4 };
    const efficiency = efficiencyWithExtraReceiverResistance(predictedLink(geometry.circuit, p.pose, actual), LEAD_RESISTANCE_OHM);
    const inputPower = 1.5;
    const power = { inputPower, outputPower: Number((inputPower * efficiency * scatter).toPrecision(4)) };
    return [
      row(planId, pointIds[i], ids.student, 'open_circuit', openCircuit, accuracy, deriveReading('open_circuit', openCircuit, accuracy, context), daysAgo(3)),
      row(planId, pointIds[i], ids.student, 'direct_power', power, accuracy, deriveReading('direct_power', power, accuracy, context), daysAgo(3)),
    ];
  });
  await knex('readings').insert(rows);

  await knex('plan_comments').insert([
    { plan_id: planId, point_id: null, author_id: ids.student, body: 'All fourteen points logged twice round. The jig scale is hard to read past 40 degrees.', created_at: daysAgo(2) },
    { plan_id: planId, point_id: pointIds[WRONG_RANGE_SEQ - 1], author_id: ids.student, body: 'Point 7 read high on the scope; I did not catch why before the next point.', created_at: daysAgo(2) },
  ]);
  const audit = (actorId: number, action: string, details: Record<string, unknown>, at: Date) => ({
    study_id: studyId, actor_id: actorId, action, target_table: 'sweep_plans', target_id: String(planId),
    details: JSON.stringify({ seeded: true, ...details }), created_at: at,
  });
  await knex('audit_events').insert([
    audit(ids.researcher, 'plan.create', { name: REVIEW_DEMO_PLAN }, daysAgo(9)),
    audit(ids.researcher, 'plan.transition', { name: REVIEW_DEMO_PLAN, from: 'draft', to: 'on_bench' }, daysAgo(8)),
    audit(ids.student, 'plan.transition', { name: REVIEW_DEMO_PLAN, from: 'on_bench', to: 'in_review' }, daysAgo(1.9)),
  ]);
  return planId;
}

function row(planId: number, pointId: number, studentId: number, method: string, raw: object, accuracy: object, derived: object, at: Date) {
  return {
    plan_id: planId, point_id: pointId, version: 1, method, raw: JSON.stringify(raw), accuracy: JSON.stringify(accuracy),
    derived: JSON.stringify(derived), instrument: 'Bench kit B (scope, current probe, RF power meters)', calibration: 'in_date',
    temperature_c: 21, setup_notes: method === 'open_circuit' ? 'Scope probe 10:1 on the probe coil; current probe on the pad lead.' : 'Two RF power meters; 50 ohm dummy load on the probe.',
    source: 'form', created_by: studentId, created_at: at,
  };
}
