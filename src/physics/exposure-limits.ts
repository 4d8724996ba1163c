/**
 * Default reference levels for magnetic-field exposure. Each row names its source and version; rows whose
 * numbers were recalled rather than re-read from the publication are marked `memory: true` (REFERENCES.md).
 * The product keeps an admin-editable, versioned copy of this table; these are only its default rows.
 */
import { MU0 } from './constants';

export type Population = 'general' | 'occupational';

export interface ExposureRow {
  id: string;
  source: string;
  version: string;
  population: Population;
  /** applicable band [Hz], inclusive */
  minFrequencyHz: number;
  maxFrequencyHz: number;
  /** what the level limits, in words */
  basis: string;
  /** the published formula, as printed */
  formula: string;
  /** the value was recalled, not re-read from the source */
  memory: boolean;
  /** reference level as flux density [T rms] at a frequency [Hz] */
  limitTesla(frequencyHz: number): number;
}

const MHZ = 1e6;

/** H [A/m] = a / f[MHz] expressed as B = mu0 H [T]. */
const perMegahertz = (amperesPerMetre: number) => (f: number) => MU0 * (amperesPerMetre / (f / MHZ));

export const DEFAULT_EXPOSURE_TABLE: readonly ExposureRow[] = [
  {
    id: 'icnirp-2010-general', source: 'ICNIRP 2010, Health Phys. 99:818-836, table 4', version: '2010',
    population: 'general', minFrequencyHz: 3e3, maxFrequencyHz: 10e6, basis: 'nerve stimulation (instantaneous)',
    formula: 'B = 27 uT', memory: false, limitTesla: () => 27e-6,
  },
  {
    id: 'icnirp-2010-occupational', source: 'ICNIRP 2010, Health Phys. 99:818-836, table 3', version: '2010',
    population: 'occupational', minFrequencyHz: 3e3, maxFrequencyHz: 10e6, basis: 'nerve stimulation (instantaneous)',
    formula: 'B = 100 uT', memory: false, limitTesla: () => 100e-6,
  },
  {
    // the 1/f formula holds from 0.1 to 30 MHz; other formulas cover 30 MHz-300 GHz (not modelled here)
    id: 'icnirp-2020-whole-body-general', source: 'ICNIRP 2020, Health Phys. 118:483-524, table 5', version: '2020',
    population: 'general', minFrequencyHz: 100e3, maxFrequencyHz: 30e6, basis: 'heating, whole-body average over 30 min',
    formula: 'H = 2.2 / f[MHz] A/m', memory: true, limitTesla: perMegahertz(2.2),
  },
  {
    id: 'icnirp-2020-whole-body-occupational', source: 'ICNIRP 2020, Health Phys. 118:483-524, table 5', version: '2020',
    population: 'occupational', minFrequencyHz: 100e3, maxFrequencyHz: 30e6, basis: 'heating, whole-body average over 30 min',
    formula: 'H = 4.9 / f[MHz] A/m', memory: true, limitTesla: perMegahertz(4.9),
  },
  {
    id: 'icnirp-2020-local-general', source: 'ICNIRP 2020, Health Phys. 118:483-524, table 6', version: '2020',
    population: 'general', minFrequencyHz: 100e3, maxFrequencyHz: 30e6, basis: 'heating, local, 6-minute average',
    formula: 'H = 4.9 / f[MHz] A/m', memory: true, limitTesla: perMegahertz(4.9),
  },
];

export interface ExposureAssessment {
  /** most restrictive applicable row, or null when no row covers the frequency */
  limiting: { row: ExposureRow; limitTesla: number; ratio: number } | null;
  /** every applicable row with its limit [T] and the field's ratio to it */
  applicable: { row: ExposureRow; limitTesla: number; ratio: number }[];
}

/**
 * Compare a flux density [T rms] with every row that covers the frequency for a population; the
 * limiting row is the one with the smallest level (all applicable rows must be met).
 */
export function assessExposure(
  fluxDensityRms: number, frequencyHz: number, population: Population = 'general',
  table: readonly ExposureRow[] = DEFAULT_EXPOSURE_TABLE,
): ExposureAssessment {
  const applicable = table
    .filter((r) => r.population === population && frequencyHz >= r.minFrequencyHz && frequencyHz <= r.maxFrequencyHz)
    .map((row) => {
      const limitTesla = row.limitTesla(frequencyHz);
      return { row, limitTesla, ratio: fluxDensityRms / limitTesla };
    })
    .sort((a, b) => a.limitTesla - b.limitTesla);
  return { limiting: applicable[0] ?? null, applicable };
}
