import { CSV_RAW_FIELDS } from './csv-fields';

/**
 * What a header cell is taken to mean when a file is mapped for the first time: names people give
 * their columns ("V2", "rx_voltage", "Pin"), compared without case, spaces or punctuation. The unit
 * in a name ("_mV", "(uH)", "[kHz]", "/ V") is split off by the caller.
 */

export type CsvTarget = 'seq' | 'repeat' | 'method' | 'instrument' | 'calibration' | 'temperatureC' | 'setupNotes' | `raw:${string}`;

const zNames = (port: string) => ({
  [`z${port}Re`]: [`z${port}re`, `rez${port}`, `z${port}real`, `realz${port}`],
  [`z${port}Im`]: [`z${port}im`, `imz${port}`, `z${port}imag`, `imagz${port}`],
});

/** Spellings of each raw input, already normalised (lower case, letters and digits only). */
const RAW_NAMES: Record<string, string[]> = {
  frequency: ['frequency', 'freq', 'f', 'drivefrequency', 'fdrive'],
  txVoltage: ['v1', 'u1', 'vtx', 'txvoltage', 'transmittervoltage'],
  txCurrent: ['i1', 'itx', 'txcurrent', 'transmittercurrent'],
  rxVoltage: ['v2', 'u2', 'vrx', 'rxvoltage', 'receivervoltage', 'voc', 'opencircuitvoltage', 'loadvoltage'],
  rxCurrent: ['i2', 'irx', 'rxcurrent', 'receivercurrent', 'loadcurrent'],
  phaseDeg: ['phase', 'phi', 'phasev2'],
  txPhaseDeg: ['txphase', 'phi1', 'phase1', 'phasei1'],
  rxPhaseDeg: ['rxphase', 'phi2', 'phase2', 'phasei2'],
  txSelfInductance: ['l1', 'txinductance', 'txselfinductance', 'transmitterinductance'],
  rxSelfInductance: ['l2', 'rxinductance', 'rxselfinductance', 'receiverinductance'],
  aidingInductance: ['la', 'laiding', 'aiding', 'aidinginductance', 'seriesaiding'],
  opposingInductance: ['lo', 'lopposing', 'opposing', 'opposinginductance', 'seriesopposing'],
  shortInductance: ['lsc', 'lshort', 'lshorted', 'shortinductance'],
  openInductance: ['loc', 'lopen', 'openinductance'],
  ...zNames('11'),
  ...zNames('21'),
  ...zNames('22'),
  lowPeak: ['fl', 'flow', 'flower', 'lowpeak', 'lowerpeak'],
  highPeak: ['fh', 'fhigh', 'fupper', 'highpeak', 'upperpeak'],
  inputPower: ['pin', 'p1', 'inputpower', 'powerin'],
  outputPower: ['pout', 'p2', 'outputpower', 'powerout'],
};

const OTHER_NAMES: Record<Exclude<CsvTarget, `raw:${string}`>, string[]> = {
  seq: ['seq', 'sequence', 'seqno', 'point', 'pointseq', 'pointno', 'pointnumber'],
  repeat: ['repeat', 'repeatindex', 'rep', 'repetition'],
  method: ['method', 'measurementmethod'],
  instrument: ['instrument', 'instruments', 'meter'],
  calibration: ['calibration', 'cal', 'calibrationstate'],
  temperatureC: ['temperature', 'temp', 'temperaturec', 'tempc'],
  setupNotes: ['notes', 'note', 'setupnotes', 'remarks', 'comment', 'comments'],
};

/**
 * The run sheet's own columns (src/lib/data/plan-points.ts RUN_SHEET_COLUMNS) besides seq and repeat:
 * planned and predicted values, never readings, so a filled-in copy of the run sheet does not import
 * a predicted L1 as a measured one. Compared as written, without case.
 */
export const RUN_SHEET_PLANNED_COLUMNS = [
  'is_reference', 'distance_m', 'lateral_offset_m', 'tilt_deg', 'frequency_Hz', 'load_resistance_ohm', 'mutual_inductance_H', 'coupling',
  'tx_self_inductance_H', 'rx_self_inductance_H', 'tx_resistance_ohm', 'rx_resistance_ohm', 'efficiency', 'load_power_W', 'field_ratio', 'solver_version',
];

/** Lower case, letters and digits only, without the words that add nothing ("rms", "measured"). */
export const normaliseName = (name: string) =>
  name.toLowerCase().replace(/[^a-z0-9]+/g, ' ').replace(/\b(rms|measured|meas)\b/g, '').replace(/ /g, '');

function buildLookup(): Map<string, CsvTarget> {
  const lookup = new Map<string, CsvTarget>();
  for (const [target, names] of Object.entries(OTHER_NAMES)) for (const name of names) lookup.set(name, target as CsvTarget);
  for (const field of CSV_RAW_FIELDS) {
    for (const name of [...(RAW_NAMES[field.key] ?? []), field.key.toLowerCase()]) if (!lookup.has(name)) lookup.set(name, `raw:${field.key}`);
  }
  return lookup;
}

const LOOKUP = buildLookup();
const PLANNED = new Set(RUN_SHEET_PLANNED_COLUMNS.map((c) => c.toLowerCase()));

export const isPlannedColumn = (header: string) => PLANNED.has(header.trim().toLowerCase());
export const targetOfName = (name: string): CsvTarget | undefined => LOOKUP.get(normaliseName(name));

/** The ways to read a header as name and unit: as a whole, "name (unit)" / "name [unit]", "name_unit" / "name unit" / "name / unit". */
export function headerSplits(header: string): { name: string; unit: string }[] {
  const text = header.trim();
  const splits = [{ name: text, unit: '' }];
  const bracket = /^(.*?)\s*[([]\s*([^)\]]*?)\s*[)\]]$/.exec(text);
  if (bracket) splits.push({ name: bracket[1], unit: bracket[2] });
  const suffix = /^(.*?)\s*[_\s/]\s*([^\s_/]+)$/.exec(text);
  if (suffix) splits.push({ name: suffix[1], unit: suffix[2] });
  return splits;
}
