import bcrypt from 'bcryptjs';
import type { Knex } from 'knex';
import { SOLVER_VERSION } from '../../src/physics';
import { buildPlanPoints, type PlanLayout } from '../../src/lib/plans/points';
import { pointPrediction, pointSolveJob, poseKey, type PlanSetupGeometry } from '../../src/lib/plans/solve-job';
import { runSolveJob } from '../../src/lib/solver-pool/job';
import { awgDiameter } from '../../src/lib/units/awg';
import { BENCH_CAUTIONS_VERSION } from '../../src/lib/readings/bench-cautions';
import { deriveReading } from '../../src/physics/measurement/derive';
import { seedReviewPlan } from './support/review-demo';

/**
 * Demo data: an invented lab, the "Fernbrook Soil Robotics group", charging buried soil-moisture
 * probes from a pad under greenhouse seed trays. `npm start` runs this only on an empty database,
 * `npm test` on its fresh test database. Passwords are listed in the README.
 */
export const DEMO_ACCOUNTS = {
  admin: { email: 'admin@couplet.test', name: 'Rafaela Duarte', siteRole: 'admin', password: 'bench-admin-2026' },
  researcher: { email: 'ines.okafor@couplet.test', name: 'Ines Okafor', siteRole: 'researcher', password: 'bench-ines-2026' },
  student: { email: 'tomasz.rehn@couplet.test', name: 'Tomasz Rehn', siteRole: 'member', password: 'bench-tomasz-2026' },
  supervisor: { email: 'maren.solberg@couplet.test', name: 'Maren Solberg', siteRole: 'member', password: 'bench-maren-2026' },
  // Runs the second study, which the student and supervisor above are not on.
  otherResearcher: { email: 'kofi.mensah@couplet.test', name: 'Kofi Mensah', siteRole: 'researcher', password: 'bench-kofi-2026' },
} as const;

/** Lower than the app's cost: seeding speed matters in tests, and these passwords are public anyway. */
const SEED_BCRYPT_COST = 10;

/** A moment `days` before the seeding, for the demo's history. */
const daysAgo = (days: number) => new Date(Date.now() - days * 86_400_000);

export async function seed(knex: Knex): Promise<void> {
  // Children first, so foreign keys never block the reset. A correction references the version it
  // supersedes, so readings go newest version first.
  await knex.raw('DELETE FROM readings ORDER BY version DESC');
  for (const table of ['mail_outbox', 'plan_reviews', 'plan_fits', 'outlier_marks', 'plan_comments', 'attachments', 'caution_acknowledgements', 'reading_column_maps', 'audit_events', 'invitations', 'sweep_points', 'sweep_plans', 'setups', 'coils', 'study_members', 'studies', 'sign_in_limits', 'user_sessions', 'users']) {
    await knex(table).del();
  }

  const ids: Record<keyof typeof DEMO_ACCOUNTS, number> = {} as Record<keyof typeof DEMO_ACCOUNTS, number>;
  for (const [key, account] of Object.entries(DEMO_ACCOUNTS) as [keyof typeof DEMO_ACCOUNTS, (typeof DEMO_ACCOUNTS)[keyof typeof DEMO_ACCOUNTS]][]) {
    const [id] = await knex('users').insert({
      email: account.email,
      name: account.name,
      site_role: account.siteRole,
      password_hash: await bcrypt.hash(account.password, SEED_BCRYPT_COST),
    });
    ids[key] = id;
  }

  const [padStudy] = await knex('studies').insert({
    name: 'Seed-tray pad to buried soil probes',
    summary:
      'A flat spiral pad under the greenhouse benches charges soil-moisture probes buried 5-20 cm deep in compost. ' +
      'How much does probe tilt after watering cost us, and does the tuned probe coil hold up at the deepest position?',
    frequency_hz: 6.78e6,
    created_by: ids.researcher,
  });
  await knex('study_members').insert([
    { study_id: padStudy, user_id: ids.researcher, role: 'researcher' },
    { study_id: padStudy, user_id: ids.student, role: 'student' },
    { study_id: padStudy, user_id: ids.supervisor, role: 'supervisor' },
  ]);

  const [railStudy] = await knex('studies').insert({
    name: 'Irrigation-rail cart docking coil',
    summary: 'A helical coil on the irrigation cart docks against a loop on the rail end stop; lateral play of the cart is the concern.',
    frequency_hz: 85e3,
    created_by: ids.otherResearcher,
  });
  await knex('study_members').insert([{ study_id: railStudy, user_id: ids.otherResearcher, role: 'researcher' }]);

  // The pad study's coil library (invented, plausible sizes; SI units as the solver takes them) and one
  // saved setup. Gauge diameters come from the same ASTM B258 formula the forms use.
  const coil = (name: string, spec: Record<string, unknown>, wireLabel: string, extra: Record<string, unknown> = {}) => ({
    study_id: padStudy, name, kind: spec.kind, spec: JSON.stringify(spec), wire_label: wireLabel, created_by: ids.researcher, ...extra,
  });
  const [padCoil] = await knex('coils').insert(
    coil('Bench pad, flat spiral', { kind: 'spiral', innerRadius: 0.03, outerRadius: 0.14, turns: 8, wireDiameter: awgDiameter(16) }, 'AWG 16', {
      measured_inductance_h: 11.6e-6, measured_resistance_ohm: 0.94, measured_q: 526, measured_at_hz: 6.78e6,
      notes: 'Wound on a 3 mm PVC sheet under tray row B.',
    }),
  );
  const [probeCoil] = await knex('coils').insert(
    coil('Probe helix, 12 turns', { kind: 'helix', radius: 0.012, turns: 12, length: 0.03, wireDiameter: awgDiameter(22) }, 'AWG 22', {
      measured_inductance_h: 2.21e-6, measured_resistance_ohm: 0.41, measured_q: 230, measured_at_hz: 6.78e6,
      notes: 'Inside the probe cap; the probe body is the former.',
    }),
  );
  await knex('coils').insert(coil('Probe loop, single turn', { kind: 'loop', radius: 0.015, wireDiameter: awgDiameter(18) }, 'AWG 18'));
  const [deepSetup] = await knex('setups').insert({
    study_id: padStudy,
    name: 'Probe 10 cm deep, upright',
    transmitter_coil_id: padCoil,
    receiver_coil_id: probeCoil,
    placement: JSON.stringify({ distance: 0.1, lateralOffset: 0, tiltDeg: 0 }),
    circuit: JSON.stringify({ frequency: 6.78e6, topology: 'SS', sourceVoltage: 5, sourceResistance: 0.5, loadResistance: 50 }),
    operator_point: JSON.stringify([0.4, 0, 0.3]),
    view: JSON.stringify({ position: [0.35, -0.45, 0.3], target: [0, 0, 0.05] }),
    notes: 'The deepest planned probe position, probe standing straight.',
    created_by: ids.researcher,
  });

  // A plan the student can take to the bench: tilt 0-90 degrees by 15 x depth 5-20 cm by 5 on the setup
  // above. Its predicted values are computed here with the solver, exactly as the server computes them.
  const padSpec = { kind: 'spiral', innerRadius: 0.03, outerRadius: 0.14, turns: 8, wireDiameter: awgDiameter(16) } as const;
  const probeSpec = { kind: 'helix', radius: 0.012, turns: 12, length: 0.03, wireDiameter: awgDiameter(22) } as const;
  const geometry: PlanSetupGeometry = {
    transmitter: padSpec, receiver: probeSpec, operatorPoint: [0.4, 0, 0.3],
    circuit: { frequency: 6.78e6, topology: 'SS', sourceVoltage: 5, sourceResistance: 0.5, loadResistance: 50 },
  };
  const layout: PlanLayout = {
    axes: [
      { quantity: 'tiltDeg', displayUnit: 'deg', mode: 'range', start: 0, stop: 90, step: 15 },
      { quantity: 'distance', displayUnit: 'cm', mode: 'range', start: 0.05, stop: 0.2, step: 0.05 },
    ],
    repeats: 1, referenceEvery: 10, orderMode: 'serpentine', shuffleSeed: null,
  };
  const planPoints = buildPlanPoints(layout, { distance: 0.1, lateralOffset: 0, tiltDeg: 0 });
  const solved = new Map<string, string>();
  for (const point of planPoints) {
    const key = poseKey(point.pose);
    if (!solved.has(key)) solved.set(key, JSON.stringify(pointPrediction(runSolveJob(pointSolveJob(geometry, point.pose)))));
  }
  const [tiltPlan] = await knex('sweep_plans').insert({
    study_id: padStudy, setup_id: deepSetup, name: 'Probe tilt x depth', state: 'on_bench',
    axes: JSON.stringify(layout.axes), repeats: layout.repeats, reference_every: layout.referenceEvery, order_mode: layout.orderMode,
    shuffle_seed: null, minutes_per_point: 3, notes: 'Upright probe re-measured every 10 points to catch drift as the compost dries.',
    prediction_status: 'done', prediction_progress: planPoints.length, prediction_total: planPoints.length, solver_version: SOLVER_VERSION,
    created_by: ids.researcher,
  });
  await knex('sweep_points').insert(planPoints.map((p) => ({
    plan_id: tiltPlan, seq: p.seq, repeat_index: p.repeatIndex, is_reference: p.isReference, pose: JSON.stringify(p.pose),
    predicted: solved.get(poseKey(p.pose)), solver_version: SOLVER_VERSION,
  })));

  await seedBenchReadings(knex, { planId: tiltPlan, studentId: ids.student, frequency: geometry.circuit.frequency });

  // The history reads as the lab lived it: studies and setup first, then the plans, days apart.
  await knex('audit_events').insert([
    { study_id: padStudy, actor_id: ids.researcher, action: 'study.create', target_table: 'studies', target_id: String(padStudy), details: JSON.stringify({ seeded: true }), created_at: daysAgo(20) },
    { study_id: railStudy, actor_id: ids.otherResearcher, action: 'study.create', target_table: 'studies', target_id: String(railStudy), details: JSON.stringify({ seeded: true }), created_at: daysAgo(18) },
    { study_id: padStudy, actor_id: ids.researcher, action: 'setup.create', target_table: 'setups', target_id: String(deepSetup), details: JSON.stringify({ seeded: true }), created_at: daysAgo(16) },
    { study_id: padStudy, actor_id: ids.researcher, action: 'plan.create', target_table: 'sweep_plans', target_id: String(tiltPlan), details: JSON.stringify({ seeded: true }), created_at: daysAgo(12) },
  ]);
  await seedReviewPlan(knex, { studyId: padStudy, setupId: deepSetup, geometry, ids, daysAgo });
}

/**
 * The student's first morning at the bench: cautions acknowledged, then the first eight points by
 * open-circuit voltage, with a fixture that leans a little more the further the probe tilts (so the
 * demo review shows an error growing with tilt), and the efficiency by direct power at four of them.
 * Raw values are made up from the predictions; the derived values are computed as the server does.
 */
async function seedBenchReadings(knex: Knex, { planId, studentId, frequency }: { planId: number; studentId: number; frequency: number }): Promise<void> {
  await knex('caution_acknowledgements').insert({ plan_id: planId, user_id: studentId, cautions_version: BENCH_CAUTIONS_VERSION });
  const points: { id: number; seq: number; pose: unknown; predicted: unknown }[] = await knex('sweep_points')
    .where({ plan_id: planId }).where('seq', '<=', 8).orderBy('seq').select('id', 'seq', 'pose', 'predicted');
  const accuracy = { relative: 0.005, phaseDeg: 1 };
  const rows = [];
  for (const point of points) {
    const pose = typeof point.pose === 'string' ? JSON.parse(point.pose) : point.pose;
    const predicted = typeof point.predicted === 'string' ? JSON.parse(point.predicted) : point.predicted;
    const context = { predicted };
    // a repeatable scatter of about 2 % plus a bias that grows with tilt
    const deviation = 0.02 * Math.sin(point.seq * 2.1) - 0.004 * (pose.tiltDeg / 15);
    const txCurrent = 0.25;
    const rxVoltage = 2 * Math.PI * frequency * Math.abs(predicted.mutualInductance) * txCurrent * (1 + deviation);
    const openCircuit = { frequency, txCurrent, rxVoltage: Number(rxVoltage.toPrecision(4)), phaseDeg: predicted.mutualInductance >= 0 ? 89.2 : -89.2 };
    rows.push(benchRow(planId, point.id, studentId, 'open_circuit', openCircuit, accuracy, deriveReading('open_circuit', openCircuit, accuracy, context), 'Scope probe 10:1 on the probe coil; current probe on the pad lead.'));
    if (point.seq % 2 === 0) {
      const inputPower = 1.2;
      const outputPower = Number((inputPower * predicted.efficiency * (1 + deviation - 0.03)).toPrecision(4));
      const power = { inputPower, outputPower };
      rows.push(benchRow(planId, point.id, studentId, 'direct_power', power, accuracy, deriveReading('direct_power', power, accuracy, context), 'Two RF power meters; 50 ohm dummy load on the probe.'));
    }
  }
  await knex('readings').insert(rows);
}

function benchRow(planId: number, pointId: number, studentId: number, method: string, raw: object, accuracy: object, derived: object, notes: string) {
  return {
    plan_id: planId, point_id: pointId, version: 1, method, raw: JSON.stringify(raw), accuracy: JSON.stringify(accuracy),
    derived: JSON.stringify(derived), instrument: 'Bench kit B (scope, current probe, RF power meters)', calibration: 'in_date',
    temperature_c: 21.5, setup_notes: notes, source: 'form', created_by: studentId,
  };
}
