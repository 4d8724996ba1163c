import type { Reading } from '../data/readings';
import {
  FIT_MODEL_INFO, REVIEW_QUANTITIES, type FitResult, type OutlierMark, type PlanComment, type PlanDecision, type ReviewPose, type ReviewQuantity,
} from '../review/types';
import { OUTLIER_SIGMA } from '../../physics/review/outliers';
import { csvTable, type AnyCsvTable, type CsvColumn } from './csv';
import type { PlanReport } from './types';

/** What was measured and decided: readings, residuals, marks, decisions, comments and fits. */

/** The CSV unit of each reviewed quantity (k and the efficiency are fractions). */
const QUANTITY_UNIT: Record<ReviewQuantity, string> = { coupling: '-', mutualInductance: 'H', efficiency: '-' };
const QUANTITY_IDS = 'coupling (k), mutualInductance (M) or efficiency';
/** Fit parameter units as ASCII words, like the other files. */
const FIT_UNIT: Record<string, string> = { '\u00b0': 'degrees', m: 'm', '\u03a9': 'ohm' };

const measuredColumns = (key: ReviewQuantity, name: string, uName: string, unit: string, what: string): CsvColumn<Reading>[] => [
  { name, unit, meaning: `${what} derived from this reading by the server; empty when the method does not give it.`, value: (r) => r.derived[key]?.value ?? null },
  { name: uName, unit, meaning: `Standard uncertainty of ${name} (GUM, coverage factor 1).`, value: (r) => r.derived[key]?.uncertainty ?? null },
];

const READING_COLUMNS: readonly CsvColumn<Reading>[] = [
  { name: 'reading_id', unit: '-', meaning: 'The reading\u2019s id; every version of a reading has its own.', value: (r) => r.id },
  { name: 'point_id', unit: '-', meaning: 'The plan point measured (points.csv).', value: (r) => r.pointId },
  { name: 'seq', unit: '-', meaning: 'The point\u2019s measurement order.', value: (r) => r.pointSeq },
  { name: 'repeat', unit: '-', meaning: 'The point\u2019s repeat of its pose.', value: (r) => r.repeatIndex },
  { name: 'method', unit: 'text', meaning: 'Measurement method: open_circuit, aiding_opposing, short_open, two_port, split_peaks or direct_power.', value: (r) => r.method },
  { name: 'version', unit: '-', meaning: 'Version of this point and method\u2019s reading: 1, then one more for each correction.', value: (r) => r.version },
  { name: 'supersedes_id', unit: '-', meaning: 'The reading this version corrects; empty for a first version.', value: (r) => r.supersedesId },
  { name: 'current', unit: 'true/false', meaning: 'true for the latest version, the only one the review uses.', value: (r) => r.current },
  { name: 'correction_reason', unit: 'text', meaning: 'Why this version corrects the previous one; empty for a first version.', value: (r) => r.correctionReason },
  { name: 'formula_id', unit: 'text', meaning: 'The derivation used (src/physics/measurement).', value: (r) => r.derived.formula.id },
  { name: 'formula_version', unit: '-', meaning: 'Its version at the time of the reading.', value: (r) => r.derived.formula.version },
  ...measuredColumns('mutualInductance', 'mutual_inductance_H', 'mutual_inductance_u_H', 'H', 'Mutual inductance M'),
  ...measuredColumns('coupling', 'coupling', 'coupling_u', '-', 'Coupling coefficient k'),
  ...measuredColumns('efficiency', 'efficiency', 'efficiency_u', '-', 'Link efficiency (0 to 1)'),
  { name: 'self_inductance_source', unit: 'text', meaning: 'Where L1 and L2 for k = M / sqrt(L1 L2) came from: measured, predicted or none.', value: (r) => r.derived.selfInductanceSource },
  { name: 'raw_inputs', unit: 'JSON, SI', meaning: 'The values entered, as a JSON object in SI units (phases in degrees).', value: (r) => JSON.stringify(r.raw) },
  { name: 'warnings', unit: 'text', meaning: 'Warnings of the derivation, separated by " | ".', value: (r) => r.derived.warnings.join(' | ') },
  { name: 'instrument', unit: 'text', meaning: 'Instrument as entered.', value: (r) => r.instrument },
  { name: 'calibration', unit: 'text', meaning: 'Calibration state of the instrument: in_date, overdue or unknown.', value: (r) => r.calibration },
  { name: 'temperature_C', unit: 'degrees Celsius', meaning: 'Room temperature, if recorded.', value: (r) => r.temperatureC },
  { name: 'source', unit: 'text', meaning: 'How it was entered: form, csv or touchstone.', value: (r) => r.source },
  { name: 'notes', unit: 'text', meaning: 'Setup notes entered with the reading.', value: (r) => r.setupNotes },
  { name: 'author', unit: 'text', meaning: 'Who entered this version.', value: (r) => r.createdBy.name },
  { name: 'created_at', unit: 'ISO 8601 UTC', meaning: 'When this version was entered.', value: (r) => r.createdAt },
];

interface ResidualRow {
  quantity: ReviewQuantity;
  pose: ReviewPose;
  setAside: boolean;
}

const RESIDUAL_COLUMNS: readonly CsvColumn<ResidualRow>[] = [
  { name: 'quantity', unit: 'text', meaning: `The quantity compared: ${QUANTITY_IDS}.`, value: (r) => r.quantity },
  { name: 'unit', unit: 'text', meaning: 'Unit of predicted, measured_mean, measured_u, residual and refit on this row ("-" for a number without unit).', value: (r) => QUANTITY_UNIT[r.quantity] },
  { name: 'seqs', unit: '-', meaning: 'The points measured at this pose (repeats and reference revisits), separated by semicolons.', value: (r) => r.pose.seqs.join(';') },
  { name: 'distance_m', unit: 'm', meaning: 'The pose: receiver height above the transmitter.', value: (r) => r.pose.pose.distance },
  { name: 'lateral_offset_m', unit: 'm', meaning: 'The pose: offset along x.', value: (r) => r.pose.pose.lateralOffset },
  { name: 'tilt_deg', unit: 'degrees', meaning: 'The pose: tilt.', value: (r) => r.pose.pose.tiltDeg },
  { name: 'frequency_Hz', unit: 'Hz', meaning: 'The pose: frequency when an axis sets it; empty means the setup\u2019s.', value: (r) => r.pose.pose.frequencyHz ?? null },
  { name: 'load_resistance_ohm', unit: 'ohm', meaning: 'The pose: load when an axis sets it; empty means the setup\u2019s.', value: (r) => r.pose.pose.loadResistance ?? null },
  { name: 'predicted', unit: 'see unit', meaning: 'The published prediction at this pose.', value: (r) => r.pose.predicted },
  { name: 'measured_mean', unit: 'see unit', meaning: 'Mean of the current readings here that are not set aside (repeats, revisits and methods together).', value: (r) => r.pose.measured?.mean ?? null },
  { name: 'measured_u', unit: 'see unit', meaning: 'Standard uncertainty of the mean: sqrt(u_B^2 + s^2/n), instrument part and scatter.', value: (r) => r.pose.measured?.uncertainty ?? null },
  { name: 'n', unit: '-', meaning: 'Readings averaged.', value: (r) => r.pose.measured?.n ?? 0 },
  { name: 'residual', unit: 'see unit', meaning: 'measured_mean - predicted.', value: (r) => r.pose.residual },
  { name: 'relative', unit: '-', meaning: 'residual / predicted, a fraction (0.05 is 5 %).', value: (r) => r.pose.relative },
  { name: 'normalized', unit: '-', meaning: 'residual / measured_u.', value: (r) => r.pose.normalized },
  { name: 'auto_outlier', unit: 'true/false', meaning: `true when |normalized| > ${OUTLIER_SIGMA} (the automatic outlier rule).`, value: (r) => r.pose.autoOutlier },
  { name: 'set_aside', unit: 'true/false', meaning: 'true when a point at this pose was set aside by hand (set-aside.csv); its readings are left out of the mean.', value: (r) => r.setAside },
  { name: 'refit', unit: 'see unit', meaning: 'The latest fit\u2019s re-predicted value here (fits.csv); empty without a fit.', value: (r) => r.pose.refit },
];

const MARK_COLUMNS: readonly CsvColumn<OutlierMark>[] = [
  { name: 'point_id', unit: '-', meaning: 'The point set aside (points.csv).', value: (m) => m.pointId },
  { name: 'seq', unit: '-', meaning: 'Its measurement order.', value: (m) => m.seq },
  { name: 'reason', unit: 'text', meaning: 'Why it was set aside.', value: (m) => m.reason },
  { name: 'marked_by', unit: 'text', meaning: 'Who set it aside.', value: (m) => m.markedBy.name },
  { name: 'created_at', unit: 'ISO 8601 UTC', meaning: 'When.', value: (m) => m.createdAt },
];

const summaryColumn = (name: string, unit: string, meaning: string, value: (d: PlanDecision) => number | null | undefined): CsvColumn<PlanDecision> => ({
  name, unit, meaning: `${meaning} (coupling, at the time of the decision; empty when nothing was compared).`, value,
});

const DECISION_COLUMNS: readonly CsvColumn<PlanDecision>[] = [
  { name: 'decision_id', unit: '-', meaning: 'The decision\u2019s id.', value: (d) => d.id },
  { name: 'decision', unit: 'text', meaning: 'accepted or returned (to the bench).', value: (d) => d.decision },
  { name: 'reviewer', unit: 'text', meaning: 'Who decided.', value: (d) => d.reviewer.name },
  { name: 'created_at', unit: 'ISO 8601 UTC', meaning: 'When.', value: (d) => d.createdAt },
  { name: 'reason', unit: 'text', meaning: 'The reason given.', value: (d) => d.reason },
  summaryColumn('compared', '-', 'Poses compared', (d) => d.summary?.compared),
  summaryColumn('rms_relative', '-', 'RMS relative error, a fraction', (d) => d.summary?.rmsRelative),
  summaryColumn('max_relative', '-', 'Relative error of largest magnitude, signed', (d) => d.summary?.maxRelative),
  summaryColumn('bias', '-', 'Mean relative error, signed', (d) => d.summary?.bias),
  summaryColumn('tolerance', '-', 'Tolerance, a fraction', (d) => d.summary?.tolerance),
  summaryColumn('outside_tolerance', '-', 'Poses outside the tolerance', (d) => d.summary?.outsideTolerance),
  summaryColumn('auto_outliers', '-', 'Readings flagged by the automatic rule', (d) => d.summary?.autoOutliers),
  summaryColumn('set_aside', '-', 'Points set aside by hand', (d) => d.summary?.setAside),
];

const COMMENT_COLUMNS: readonly CsvColumn<PlanComment>[] = [
  { name: 'comment_id', unit: '-', meaning: 'The comment\u2019s id.', value: (c) => c.id },
  { name: 'point_id', unit: '-', meaning: 'The point it is about (points.csv); empty for a comment on the whole plan.', value: (c) => c.pointId },
  { name: 'seq', unit: '-', meaning: 'That point\u2019s measurement order.', value: (c) => c.seq },
  { name: 'author', unit: 'text', meaning: 'Who wrote it.', value: (c) => c.author.name },
  { name: 'author_role', unit: 'text', meaning: 'Their role on the study (researcher, student, supervisor) or admin.', value: (c) => c.author.role },
  { name: 'created_at', unit: 'ISO 8601 UTC', meaning: 'When.', value: (c) => c.createdAt },
  { name: 'body', unit: 'text', meaning: 'The comment.', value: (c) => c.body },
];

const FIT_COLUMNS: readonly CsvColumn<FitResult>[] = [
  { name: 'quantity', unit: 'text', meaning: `The quantity fitted: ${QUANTITY_IDS}.`, value: (f) => f.quantity },
  { name: 'model', unit: 'text', meaning: 'The effective parameter estimated: tilt_offset, lateral_offset, distance_offset or extra_rx_resistance.', value: (f) => f.model },
  { name: 'value', unit: 'see unit', meaning: 'Least-squares estimate of the parameter.', value: (f) => f.value },
  { name: 'uncertainty', unit: 'see unit', meaning: 'Its standard uncertainty, scaled by sqrt(reduced chi-square) when that exceeds 1.', value: (f) => f.uncertainty },
  { name: 'unit', unit: 'text', meaning: 'Unit of value and uncertainty.', value: (f) => FIT_UNIT[FIT_MODEL_INFO[f.model].unit] ?? FIT_MODEL_INFO[f.model].unit },
  { name: 'poses_used', unit: '-', meaning: 'Poses fitted (not set aside, with a measured mean and a prediction).', value: (f) => f.posesUsed },
  { name: 'chi_square', unit: '-', meaning: 'Sum of squared normalized residuals at the estimate.', value: (f) => f.chiSquare },
  { name: 'reduced_chi_square', unit: '-', meaning: 'chi_square / (poses_used - 1); empty with one pose.', value: (f) => f.reducedChiSquare },
  { name: 'rms_relative_after', unit: '-', meaning: 'RMS relative error of the measured means against the re-predicted values, a fraction.', value: (f) => f.rmsRelativeAfter },
  { name: 'solver_version', unit: 'text', meaning: 'Solver version that re-predicted the values.', value: (f) => f.solverVersion },
  { name: 'created_by', unit: 'text', meaning: 'Who ran the fit.', value: (f) => f.createdBy.name },
  { name: 'created_at', unit: 'ISO 8601 UTC', meaning: 'When.', value: (f) => f.createdAt },
];

export function reviewTables(report: PlanReport): AnyCsvTable[] {
  const { coupling } = report.reviews;
  const marked = new Set(coupling.marks.map((m) => m.pointId));
  const residuals: ResidualRow[] = REVIEW_QUANTITIES.flatMap((quantity) =>
    report.reviews[quantity].poses.map((pose) => ({ quantity, pose, setAside: pose.pointIds.some((id) => marked.has(id)) })),
  );
  const fits = REVIEW_QUANTITIES.map((q) => report.reviews[q].fit).filter((f): f is FitResult => f !== null);
  return [
    csvTable({ file: 'readings.csv', about: 'Every version of every reading, with what the server derived from it.', columns: READING_COLUMNS, rows: report.readings }),
    csvTable({ file: 'residuals.csv', about: 'Each distinct pose and quantity: prediction, mean of the current readings, residuals and flags.', columns: RESIDUAL_COLUMNS, rows: residuals }),
    csvTable({ file: 'set-aside.csv', about: 'Points set aside by hand as outliers, with the reason.', columns: MARK_COLUMNS, rows: coupling.marks }),
    csvTable({ file: 'decisions.csv', about: 'The supervisors\u2019 decisions on the plan, oldest first, with the coupling summary each was made on.', columns: DECISION_COLUMNS, rows: coupling.decisions }),
    csvTable({ file: 'comments.csv', about: 'Comments on the plan and its points, oldest first.', columns: COMMENT_COLUMNS, rows: report.comments }),
    csvTable({ file: 'fits.csv', about: 'The latest fit of each quantity, if any; its re-predicted values are the refit column of residuals.csv.', columns: FIT_COLUMNS, rows: fits }),
  ];
}
