import type { Coil } from '../data/coils';
import { RUN_SHEET_COLUMNS, type PlanPoint } from '../data/plan-points';
import type { Setup } from '../data/setups';
import { expandAxis, type AxisQuantity, type PlanAxis } from '../plans/axes';
import type { CoilSpec } from '../../physics/types';
import { csvTable, type AnyCsvTable, type CsvColumn } from './csv';
import type { PlanReport } from './types';

/** The plan's design as CSV: the setup, its two coils, the plan's axes and every point. SI throughout. */

const SETUP_COLUMNS: readonly CsvColumn<Setup>[] = [
  { name: 'setup_id', unit: '-', meaning: 'The setup\u2019s id in Couplet.', value: (s) => s.id },
  { name: 'name', unit: 'text', meaning: 'The setup\u2019s name.', value: (s) => s.name },
  { name: 'transmitter_coil_id', unit: '-', meaning: 'Id of the transmitter coil (coils.csv, role transmitter).', value: (s) => s.transmitterCoilId },
  { name: 'receiver_coil_id', unit: '-', meaning: 'Id of the receiver coil (coils.csv, role receiver).', value: (s) => s.receiverCoilId },
  { name: 'distance_m', unit: 'm', meaning: 'Receiver centre height above the transmitter centre, where no plan axis sets it.', value: (s) => s.placement.distance },
  { name: 'lateral_offset_m', unit: 'm', meaning: 'Receiver centre offset along x, where no plan axis sets it.', value: (s) => s.placement.lateralOffset ?? 0 },
  { name: 'tilt_deg', unit: 'degrees', meaning: 'Receiver tilt about its local y axis, where no plan axis sets it.', value: (s) => s.placement.tiltDeg ?? 0 },
  { name: 'frequency_Hz', unit: 'Hz', meaning: 'Operating frequency, where no plan axis sets it.', value: (s) => s.circuit.frequency },
  { name: 'topology', unit: 'text', meaning: 'Compensation: transmitter then receiver capacitor, S in series or P in parallel (SS, SP, PS, PP).', value: (s) => s.circuit.topology },
  { name: 'source_voltage_V', unit: 'V', meaning: 'Source open-circuit voltage, rms.', value: (s) => s.circuit.sourceVoltage },
  { name: 'source_resistance_ohm', unit: 'ohm', meaning: 'Source internal resistance.', value: (s) => s.circuit.sourceResistance },
  { name: 'load_resistance_ohm', unit: 'ohm', meaning: 'Load resistance, where no plan axis sets it.', value: (s) => s.circuit.loadResistance },
  { name: 'tx_capacitance_F', unit: 'F', meaning: 'Transmitter capacitor; empty when tuned to the frequency.', value: (s) => s.circuit.txCapacitance ?? null },
  { name: 'rx_capacitance_F', unit: 'F', meaning: 'Receiver capacitor; empty when tuned to the frequency.', value: (s) => s.circuit.rxCapacitance ?? null },
  { name: 'operator_x_m', unit: 'm', meaning: 'Operator position x, where the field is checked; empty without one.', value: (s) => s.operatorPoint?.[0] ?? null },
  { name: 'operator_y_m', unit: 'm', meaning: 'Operator position y.', value: (s) => s.operatorPoint?.[1] ?? null },
  { name: 'operator_z_m', unit: 'm', meaning: 'Operator position z.', value: (s) => s.operatorPoint?.[2] ?? null },
  { name: 'notes', unit: 'text', meaning: 'The setup\u2019s notes.', value: (s) => s.notes },
];

interface CoilRow {
  role: 'transmitter' | 'receiver';
  coil: Coil;
}

const specField = (spec: CoilSpec, key: 'radius' | 'innerRadius' | 'outerRadius' | 'turns' | 'length'): number | null =>
  key in spec ? (spec as unknown as Record<string, number>)[key] : null;

const COIL_COLUMNS: readonly CsvColumn<CoilRow>[] = [
  { name: 'role', unit: 'text', meaning: 'transmitter or receiver in this setup.', value: (r) => r.role },
  { name: 'coil_id', unit: '-', meaning: 'The coil\u2019s id in Couplet.', value: (r) => r.coil.id },
  { name: 'name', unit: 'text', meaning: 'The coil\u2019s name.', value: (r) => r.coil.name },
  { name: 'kind', unit: 'text', meaning: 'loop (one circle), helix (solenoid) or spiral (flat Archimedean spiral).', value: (r) => r.coil.spec.kind },
  { name: 'radius_m', unit: 'm', meaning: 'Loop or helix radius, to the wire centre; empty for a spiral.', value: (r) => specField(r.coil.spec, 'radius') },
  { name: 'inner_radius_m', unit: 'm', meaning: 'Spiral inner radius; empty otherwise.', value: (r) => specField(r.coil.spec, 'innerRadius') },
  { name: 'outer_radius_m', unit: 'm', meaning: 'Spiral outer radius; empty otherwise.', value: (r) => specField(r.coil.spec, 'outerRadius') },
  { name: 'turns', unit: '-', meaning: 'Turns of a helix or spiral; empty for a loop.', value: (r) => specField(r.coil.spec, 'turns') },
  { name: 'length_m', unit: 'm', meaning: 'Helix length along its axis; empty otherwise.', value: (r) => specField(r.coil.spec, 'length') },
  { name: 'wire_diameter_m', unit: 'm', meaning: 'Overall wire or bundle diameter.', value: (r) => r.coil.spec.wireDiameter },
  { name: 'wire_label', unit: 'text', meaning: 'The wire as bought (a gauge such as AWG 22), if given.', value: (r) => r.coil.wireLabel },
  { name: 'material', unit: 'text', meaning: 'Conductor material (copper when not given).', value: (r) => r.coil.spec.material ?? 'copper' },
  { name: 'strands', unit: '-', meaning: 'Strands of a stranded or litz conductor; empty for solid wire.', value: (r) => r.coil.spec.strands ?? null },
  { name: 'strand_diameter_m', unit: 'm', meaning: 'Diameter of one strand; empty for solid wire.', value: (r) => r.coil.spec.strandDiameter ?? null },
  { name: 'temperature_C', unit: 'degrees Celsius', meaning: 'Conductor temperature the model uses (20 when not given).', value: (r) => r.coil.spec.temperatureC ?? 20 },
  { name: 'measured_inductance_H', unit: 'H', meaning: 'Self-inductance measured alone, if recorded.', value: (r) => r.coil.measured.inductance },
  { name: 'measured_resistance_ohm', unit: 'ohm', meaning: 'Series resistance measured alone, if recorded.', value: (r) => r.coil.measured.resistance },
  { name: 'measured_q', unit: '-', meaning: 'Quality factor measured alone, if recorded.', value: (r) => r.coil.measured.qualityFactor },
  { name: 'measured_at_Hz', unit: 'Hz', meaning: 'Frequency of those measurements.', value: (r) => r.coil.measured.frequencyHz },
  { name: 'predicted_inductance_H', unit: 'H', meaning: 'Self-inductance from the model at the study frequency; empty without one.', value: (r) => r.coil.predicted?.selfInductance ?? null },
  { name: 'predicted_ac_resistance_ohm', unit: 'ohm', meaning: 'AC resistance from the model at the study frequency.', value: (r) => r.coil.predicted?.acResistance ?? null },
  { name: 'notes', unit: 'text', meaning: 'The coil\u2019s notes.', value: (r) => r.coil.notes },
];

const SI_UNIT: Record<AxisQuantity, string> = { distance: 'm', lateralOffset: 'm', tiltDeg: 'degrees', frequencyHz: 'Hz', loadResistance: 'ohm' };

interface AxisRow {
  index: number;
  axis: PlanAxis;
}

const AXIS_COLUMNS: readonly CsvColumn<AxisRow>[] = [
  { name: 'axis', unit: '-', meaning: 'Position of the axis: 1 is outermost (changes slowest in the grid), as in the plan.', value: (r) => r.index },
  { name: 'quantity', unit: 'text', meaning: 'What the axis varies: distance, lateralOffset, tiltDeg, frequencyHz or loadResistance (points.csv has one column each).', value: (r) => r.axis.quantity },
  { name: 'si_unit', unit: 'text', meaning: 'Unit of start, stop, step and values on this row.', value: (r) => SI_UNIT[r.axis.quantity] },
  { name: 'display_unit', unit: 'text', meaning: 'Unit the values were typed in (shown back in that unit in the app).', value: (r) => r.axis.displayUnit },
  { name: 'mode', unit: 'text', meaning: 'range (start, stop, step), count (start, stop, count, spacing) or list (values).', value: (r) => r.axis.mode },
  { name: 'start', unit: 'see si_unit', meaning: 'First value of a range or count axis.', value: (r) => (r.axis.mode === 'list' ? null : r.axis.start) },
  { name: 'stop', unit: 'see si_unit', meaning: 'Last value of a range or count axis.', value: (r) => (r.axis.mode === 'list' ? null : r.axis.stop) },
  { name: 'step', unit: 'see si_unit', meaning: 'Step of a range axis.', value: (r) => (r.axis.mode === 'range' ? r.axis.step : null) },
  { name: 'count', unit: '-', meaning: 'Number of values of a count axis.', value: (r) => (r.axis.mode === 'count' ? r.axis.count : null) },
  { name: 'spacing', unit: 'text', meaning: 'linear or log spacing of a count axis.', value: (r) => (r.axis.mode === 'count' ? r.axis.spacing : null) },
  { name: 'values', unit: 'see si_unit', meaning: 'Every value of the axis in order, separated by semicolons.', value: (r) => expandAxis(r.axis).join(';') },
];

const POINT_COLUMNS: readonly CsvColumn<PlanPoint>[] = [
  { name: 'point_id', unit: '-', meaning: 'The point\u2019s id in Couplet (readings.csv and comments.csv refer to it).', value: (p) => p.id },
  ...RUN_SHEET_COLUMNS,
];

export function planTables(report: PlanReport): AnyCsvTable[] {
  const coils: CoilRow[] = [{ role: 'transmitter', coil: report.transmitter }, { role: 'receiver', coil: report.receiver }];
  return [
    csvTable({ file: 'setup.csv', about: 'The setup: placement the poses start from, circuit and operator position (one row).', columns: SETUP_COLUMNS, rows: [report.setup] }),
    csvTable({ file: 'coils.csv', about: 'The two coils: shape, wire, measured and modelled values (one row each).', columns: COIL_COLUMNS, rows: coils }),
    csvTable({ file: 'axes.csv', about: 'The plan\u2019s swept axes, each with all of its values.', columns: AXIS_COLUMNS, rows: report.plan.axes.map((axis, i) => ({ index: i + 1, axis })) }),
    csvTable({ file: 'points.csv', about: 'Every plan point in measurement order: its pose and the published prediction (the run sheet).', columns: POINT_COLUMNS, rows: report.points }),
  ];
}
