/**
 * Touchstone version 1 files of 2-port networks (.s2p) as network analysers export them, and their
 * Z-parameters at a frequency for the two-port measurement method.
 *
 * File syntax per the Touchstone File Format Specification (IBIS Open Forum, version 2.0, which also
 * defines the version 1.0 syntax):
 * - option line `# <unit> <parameter> <format> R <n>`, tokens in any order, case-insensitive, each
 *   defaulting to GHz, S, MA, R 50; only the first option line counts;
 * - `!` starts a comment, anywhere on a line;
 * - a 2-port data point is the frequency and 4 pairs, in the order N11 N21 N12 N22 (special to 2-port
 *   files); a point may wrap over several lines;
 * - in version 1 files Y- and Z-parameters are normalized to R (Z / R and Y R); S-parameters refer to R;
 * - noise parameters may follow the network data, starting with a frequency not above the last one;
 *   they are skipped.
 */
import { abs, add, cx, div, mul, scale, sub, ONE, type Complex } from './complex';
import type { RawReading } from './measurement/methods';

export type TouchstoneParameter = 'S' | 'Y' | 'Z';
export type TouchstoneFormat = 'MA' | 'DB' | 'RI';
export type TouchstoneFrequencyUnit = 'Hz' | 'kHz' | 'MHz' | 'GHz';

export interface TouchstonePoint {
  /** [Hz] */
  frequency: number;
  /** the file's values as complex numbers; Y and Z still normalized to the reference resistance */
  n11: Complex;
  n21: Complex;
  n12: Complex;
  n22: Complex;
}

export interface TouchstoneData {
  parameter: TouchstoneParameter;
  format: TouchstoneFormat;
  frequencyUnit: TouchstoneFrequencyUnit;
  /** R of the option line [ohm] */
  referenceResistance: number;
  /** strictly increasing in frequency */
  points: TouchstonePoint[];
  /** whether noise parameters followed the network data (they are not read) */
  hasNoiseData: boolean;
}

export class TouchstoneError extends Error {
  /** 1-based line of the file at fault, null for the file as a whole */
  readonly line: number | null;

  constructor(line: number | null, message: string) {
    super(line === null ? message : `Line ${line}: ${message}`);
    this.name = 'TouchstoneError';
    this.line = line;
  }
}

/** Guards the parser's memory: far above any analyser's sweep (commonly up to 100 001 points). */
export const MAX_TOUCHSTONE_POINTS = 100_000;
/** About 300 characters per point at the point limit. */
export const MAX_TOUCHSTONE_CHARS = 32 * 1024 * 1024;

const UNITS: Record<string, [TouchstoneFrequencyUnit, number]> = {
  hz: ['Hz', 1], khz: ['kHz', 1e3], mhz: ['MHz', 1e6], ghz: ['GHz', 1e9],
};
/** frequency and 4 complex parameters */
const NUMBERS_PER_POINT = 9;
/** a noise-parameter line: frequency, NFmin, |Gamma_opt|, angle, Rn */
const NUMBERS_PER_NOISE_LINE = 5;
/** strict decimal syntax: Number() alone would take "0x10", "" or "Infinity" */
const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const DEG = Math.PI / 180;

interface Options {
  frequencyUnit: TouchstoneFrequencyUnit;
  multiplier: number;
  parameter: TouchstoneParameter;
  format: TouchstoneFormat;
  referenceResistance: number;
}

/** Parse the text of a Touchstone version 1 .s2p file; throws TouchstoneError with the line at fault. */
export function parseTouchstone(text: string): TouchstoneData {
  if (text.length > MAX_TOUCHSTONE_CHARS) {
    throw new TouchstoneError(null, `The file is larger than ${MAX_TOUCHSTONE_CHARS / 1024 / 1024} MiB.`);
  }
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/);
  let options: Options | null = null;
  const points: TouchstonePoint[] = [];
  let pending: number[] = [];
  let pendingLine = 0;
  let hasNoiseData = false;

  for (let index = 0; index < lines.length && !hasNoiseData; index++) {
    const lineNo = index + 1;
    const content = lines[index].split('!', 1)[0].trim();
    if (content === '') continue;
    if (content.startsWith('[')) {
      throw new TouchstoneError(lineNo, `"${content.split(/\s/, 1)[0]}" is a Touchstone version 2 keyword; export the data as a version 1 .s2p file.`);
    }
    if (content.startsWith('#')) {
      if (points.length > 0 || pending.length > 0) throw new TouchstoneError(lineNo, 'The option line (#) must come before the data.');
      options ??= parseOptionLine(content, lineNo);
      continue;
    }
    options ??= parseOptionLine('#', lineNo);
    const numbers = content.split(/\s+/).map((token) => {
      if (!NUMBER.test(token)) throw new TouchstoneError(lineNo, `"${token}" is not a number.`);
      return Number(token);
    });
    const previous = points.at(-1)?.frequency;
    if (pending.length === 0 && previous !== undefined && numbers[0] * options.multiplier <= previous) {
      if (numbers.length === NUMBERS_PER_NOISE_LINE) {
        hasNoiseData = true;
        break;
      }
      throw new TouchstoneError(
        lineNo,
        `Frequency ${numbers[0]} ${options.frequencyUnit} is not above the previous one (${previous / options.multiplier} ${options.frequencyUnit}): frequencies must increase strictly.`,
      );
    }
    if (pending.length === 0) pendingLine = lineNo;
    pending.push(...numbers);
    if (pending.length > NUMBERS_PER_POINT) {
      throw new TouchstoneError(lineNo, `A 2-port data point has ${NUMBERS_PER_POINT} numbers (frequency, then N11 N21 N12 N22 as pairs); this one has ${pending.length}.`);
    }
    if (pending.length === NUMBERS_PER_POINT) {
      if (points.length >= MAX_TOUCHSTONE_POINTS) throw new TouchstoneError(lineNo, `More than ${MAX_TOUCHSTONE_POINTS} frequency points.`);
      points.push(toPoint(pending, options, pendingLine));
      pending = [];
    }
  }
  if (pending.length > 0) {
    throw new TouchstoneError(pendingLine, `The last data point is incomplete: ${pending.length} of ${NUMBERS_PER_POINT} numbers (frequency, then N11 N21 N12 N22 as pairs).`);
  }
  if (!options || points.length === 0) throw new TouchstoneError(null, 'The file has no data points.');
  const { frequencyUnit, parameter, format, referenceResistance } = options;
  return { parameter, format, frequencyUnit, referenceResistance, points, hasNoiseData };
}

function parseOptionLine(content: string, lineNo: number): Options {
  const options: Options = { frequencyUnit: 'GHz', multiplier: 1e9, parameter: 'S', format: 'MA', referenceResistance: 50 };
  const tokens = content.slice(1).trim().split(/\s+/).filter(Boolean);
  for (let i = 0; i < tokens.length; i++) {
    const token = tokens[i].toLowerCase();
    if (token in UNITS) {
      [options.frequencyUnit, options.multiplier] = UNITS[token];
    } else if (token === 's' || token === 'y' || token === 'z') {
      options.parameter = token.toUpperCase() as TouchstoneParameter;
    } else if (token === 'g' || token === 'h') {
      throw new TouchstoneError(lineNo, `${token.toUpperCase()}-parameters are not supported; export S-, Y- or Z-parameters.`);
    } else if (token === 'ma' || token === 'db' || token === 'ri') {
      options.format = token.toUpperCase() as TouchstoneFormat;
    } else if (token === 'r') {
      const value = tokens[i + 1];
      if (value === undefined || !NUMBER.test(value) || !(Number(value) > 0)) {
        throw new TouchstoneError(lineNo, 'R must be followed by the reference resistance in ohms, above zero.');
      }
      if (tokens[i + 2] !== undefined && NUMBER.test(tokens[i + 2])) {
        throw new TouchstoneError(lineNo, 'Per-port reference resistances are not supported; give one R for both ports.');
      }
      options.referenceResistance = Number(value);
      i++;
    } else {
      throw new TouchstoneError(lineNo, `"${tokens[i]}" is not an option: expected a unit (Hz, kHz, MHz, GHz), a parameter (S, Y, Z), a format (MA, DB, RI) or R <ohms>.`);
    }
  }
  return options;
}

function toPoint(numbers: number[], options: Options, lineNo: number): TouchstonePoint {
  const frequency = numbers[0] * options.multiplier;
  if (frequency < 0) throw new TouchstoneError(lineNo, `The frequency ${numbers[0]} ${options.frequencyUnit} is negative.`);
  const pair = (i: number): Complex => {
    const a = numbers[1 + 2 * i];
    const b = numbers[2 + 2 * i];
    if (options.format === 'RI') return cx(a, b);
    if (options.format === 'MA' && a < 0) {
      throw new TouchstoneError(lineNo, `The magnitude ${a} is negative: is this real/imaginary data under an MA option line?`);
    }
    const magnitude = options.format === 'DB' ? 10 ** (a / 20) : a;
    return cx(magnitude * Math.cos(b * DEG), magnitude * Math.sin(b * DEG));
  };
  // 2-port files order the pairs N11 N21 N12 N22.
  return { frequency, n11: pair(0), n21: pair(1), n12: pair(2), n22: pair(3) };
}

export interface ZParameters {
  /** the data frequency the values belong to, nearest to the one requested [Hz] */
  frequency: number;
  /** [Hz] */
  requestedFrequency: number;
  /** [ohm] */
  z11: Complex;
  z21: Complex;
  z12: Complex;
  z22: Complex;
}

/** Bound on |det| relative to its terms, below which the matrix to invert counts as singular. */
const SINGULAR_RELATIVE = 1e-12;

/**
 * Z-parameters [ohm] at the data point nearest to frequencyHz (no interpolation: a measured point is
 * what the reading records, and `frequency` says which one was used). From S with a real reference
 * R: Z = R (I + S)(I - S)^-1 (D. M. Pozar, Microwave Engineering, 4th ed., sec. 4.3); from Y: Z = Y^-1;
 * Y and Z data denormalized from R first (version 1 files). Throws TouchstoneError where I - S or Y is
 * singular (an open port has no Z-parameters).
 */
export function zParametersAt(data: TouchstoneData, frequencyHz: number): ZParameters {
  if (!Number.isFinite(frequencyHz)) throw new TouchstoneError(null, `The requested frequency ${frequencyHz} is not a finite number.`);
  const p = nearestPoint(data.points, frequencyHz);
  const R = data.referenceResistance;
  const hz = (f: number) => `${f} Hz`;
  let z: [Complex, Complex, Complex, Complex];
  if (data.parameter === 'Z') {
    z = [scale(p.n11, R), scale(p.n21, R), scale(p.n12, R), scale(p.n22, R)];
  } else if (data.parameter === 'Y') {
    const [y11, y21, y12, y22] = [p.n11, p.n21, p.n12, p.n22].map((y) => scale(y, 1 / R));
    const det = sub(mul(y11, y22), mul(y12, y21));
    if (isSingular(det, abs(y11) * abs(y22) + abs(y12) * abs(y21))) {
      throw new TouchstoneError(null, `The Y-matrix at ${hz(p.frequency)} is singular: the network has no Z-parameters there.`);
    }
    z = [div(y22, det), div(scale(y21, -1), det), div(scale(y12, -1), det), div(y11, det)];
  } else {
    const { n11: s11, n21: s21, n12: s12, n22: s22 } = p;
    const a11 = sub(ONE, s11);
    const a22 = sub(ONE, s22);
    const det = sub(mul(a11, a22), mul(s12, s21));
    if (isSingular(det, abs(a11) * abs(a22) + abs(s12) * abs(s21))) {
      throw new TouchstoneError(null, `I \u2212 S is singular at ${hz(p.frequency)}: the network has no Z-parameters there (an open port?).`);
    }
    const k = div(cx(R), det);
    z = [
      mul(k, add(mul(add(ONE, s11), a22), mul(s12, s21))),
      mul(k, scale(s21, 2)),
      mul(k, scale(s12, 2)),
      mul(k, add(mul(add(ONE, s22), a11), mul(s12, s21))),
    ];
  }
  return { frequency: p.frequency, requestedFrequency: frequencyHz, z11: z[0], z21: z[1], z12: z[2], z22: z[3] };
}

const isSingular = (det: Complex, termSize: number) => !(abs(det) > SINGULAR_RELATIVE * termSize);

/** Binary search on the increasing frequencies; a tie goes to the lower point. */
function nearestPoint(points: TouchstonePoint[], frequencyHz: number): TouchstonePoint {
  if (points.length === 0) throw new TouchstoneError(null, 'The data has no frequency points.');
  let lo = 0;
  let hi = points.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (points[mid].frequency <= frequencyHz) lo = mid;
    else hi = mid;
  }
  return Math.abs(points[hi].frequency - frequencyHz) < Math.abs(points[lo].frequency - frequencyHz) ? points[hi] : points[lo];
}

/**
 * The two-port method's raw fields (METHOD_SPECS.two_port) from a Touchstone file at the data point
 * nearest to frequencyHz; `frequency` is that point's, so the reading records what was measured.
 */
export function twoPortRawFromTouchstone(data: TouchstoneData, frequencyHz: number): RawReading {
  const z = zParametersAt(data, frequencyHz);
  return {
    frequency: z.frequency,
    z11Re: z.z11.re,
    z11Im: z.z11.im,
    z21Re: z.z21.re,
    z21Im: z.z21.im,
    z22Re: z.z22.re,
    z22Im: z.z22.im,
  };
}
