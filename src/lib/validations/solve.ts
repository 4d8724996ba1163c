import { z } from 'zod';
import { MAX_TOLERANCE, MAX_TURNS, MIN_TOLERANCE } from '../../physics';
import { MAX_STRANDS } from '../../physics/validation';
import type { CircuitSpec, CoilSpec, Placement } from '../../physics/types';

/**
 * POST /api/solve (PRODUCT.md): the shape of a solve request in SI units, parsed in the browser form and
 * again on the server. Every refusal names its field; what only the solver can judge (coils that touch)
 * comes back from src/physics with its path too. Limits that keep one request from tying up the server
 * are refused here with a message saying so.
 */

/** Largest request body accepted [bytes]: a full request with 64 field points is about 4 kB. */
export const MAX_SOLVE_BODY_BYTES = 64 * 1024;
/** Most points at which the field may be asked for in one request. */
export const MAX_FIELD_POINTS = 64;
/** Most frequencies of one frequency response. */
export const MAX_BAND_POINTS = 401;
/** Operating frequencies accepted [Hz]; above ~300 MHz a bench coil is no longer small against the wavelength. */
export const MIN_FREQUENCY_HZ = 1;
export const MAX_FREQUENCY_HZ = 300e6;
/** Largest coordinate or dimension accepted [m]: beyond a bench, and far from any overflow. */
export const MAX_LENGTH_M = 100;
/** Lowest temperature of the resistivity model [deg C] (absolute zero). */
const ABSOLUTE_ZERO_C = -273.15;

const show = (input: unknown): string => {
  if (input === null) return 'null';
  if (typeof input === 'string') return `the text ${JSON.stringify(input.length > 24 ? `${input.slice(0, 24)}…` : input)}`;
  if (typeof input === 'number') return String(input); // NaN or Infinity from a JavaScript caller
  return Array.isArray(input) ? 'a list' : `a ${typeof input}`;
};

/** A finite number; the messages say which quantity and unit, and what arrived instead ("NaN", null). */
const quantity = (what: string, unit: string) =>
  z.number({
    error: (issue) => issue.input === undefined
      ? `Enter ${what} in ${unit}.`
      : `Expected ${what} as a number in ${unit}, not ${show(issue.input)}.`,
  });
const length = (what: string) => quantity(what, 'metres').max(MAX_LENGTH_M, `Use at most ${MAX_LENGTH_M} m.`);
const positiveLength = (what: string) => length(what).positive('Must be greater than 0 m.');
const coordinate = (what: string) => length(what).min(-MAX_LENGTH_M, `Use at least -${MAX_LENGTH_M} m.`);
const turns = quantity('the number of turns', 'turns')
  .positive('Must be greater than 0.')
  .max(MAX_TURNS, `More than ${MAX_TURNS.toLocaleString('en')} turns is too large a request for the solver.`);
const vector = (what: string) => z.tuple([coordinate(`${what} x`), coordinate(`${what} y`), coordinate(`${what} z`)], {
  error: (issue) => issue.input === undefined ? `Enter ${what} as [x, y, z] in metres.` : `Expected ${what} as three numbers [x, y, z].`,
});

const isNumber = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);

const conductor = {
  wireDiameter: positiveLength('the wire diameter'),
  material: z.enum(['copper', 'aluminium'], { error: 'Choose copper or aluminium.' }).optional(),
  temperatureC: quantity('the wire temperature', 'degrees Celsius')
    .gt(ABSOLUTE_ZERO_C, 'Must be above absolute zero.').max(1000, 'Use at most 1000 °C.').optional(),
  strands: quantity('the number of strands', 'strands')
    .int('Must be a whole number.').min(1, 'Use at least 1.').max(MAX_STRANDS, `Use at most ${MAX_STRANDS.toLocaleString('en')}.`).optional(),
  strandDiameter: positiveLength('the strand diameter').optional(),
  resistance: quantity('the measured resistance', 'ohms').positive('Must be greater than 0 Ω.').optional(),
};

type CoilInput = Record<string, unknown>;
type Ctx = z.RefinementCtx;

/** Cross-field checks of a coil; run even when another field failed, so every problem is listed at once. */
function checkCoil(c: CoilInput, ctx: Ctx): void {
  if (typeof c !== 'object' || c === null) return; // already refused as a whole
  const add = (path: string, message: string) => ctx.addIssue({ code: 'custom', path: [path], message });
  const wire = c.wireDiameter;
  if (!isNumber(wire)) return;
  if ((c.kind === 'loop' || c.kind === 'helix') && isNumber(c.radius) && c.radius > 0 && wire / 2 >= c.radius) {
    add('wireDiameter', 'The wire is too thick for the coil radius.');
  }
  if (c.kind === 'helix' && isNumber(c.turns) && isNumber(c.length) && c.turns > 1 && c.length / c.turns < wire) {
    add('length', 'The wire is thicker than the pitch (length / turns): the turns would overlap. Lengthen the coil or use fewer turns.');
  }
  if (c.kind === 'spiral' && isNumber(c.innerRadius) && isNumber(c.outerRadius)) {
    if (c.outerRadius <= c.innerRadius) add('outerRadius', 'Must be larger than the inner radius.');
    else if (isNumber(c.turns) && (c.outerRadius - c.innerRadius) / c.turns < wire) {
      add('turns', 'The wire is thicker than the radial pitch: the turns would overlap. Use fewer turns or a wider spiral.');
    }
    if (c.innerRadius > 0 && c.innerRadius < wire / 2) add('innerRadius', 'Must be at least the wire radius.');
  }
  if (isNumber(c.strandDiameter) && c.strandDiameter > wire) add('strandDiameter', 'A strand cannot be thicker than the wire.');
  if (isNumber(c.strands) && c.strands > 1 && c.strandDiameter === undefined) add('strandDiameter', 'Enter the strand diameter of stranded wire.');
}

const always = { when: () => true };

const loopSchema = z.object({ kind: z.literal('loop'), radius: positiveLength('the loop radius'), ...conductor })
  .superRefine(checkCoil, always);
const helixSchema = z.object({
  kind: z.literal('helix'), radius: positiveLength('the helix radius'), turns,
  length: length('the helix length').min(0, 'Must not be negative.'), ...conductor,
}).superRefine(checkCoil, always);
const spiralSchema = z.object({
  kind: z.literal('spiral'), innerRadius: positiveLength('the inner radius'), outerRadius: positiveLength('the outer radius'),
  turns, ...conductor,
}).superRefine(checkCoil, always);

export const coilSchema = z.discriminatedUnion('kind', [loopSchema, helixSchema, spiralSchema], {
  error: (issue) => issue.input === undefined || issue.input === null || typeof issue.input !== 'object'
    ? 'Describe the coil: kind "loop", "helix" or "spiral" with its dimensions in metres.'
    : 'Choose kind "loop", "helix" or "spiral".',
}) satisfies z.ZodType<CoilSpec>;

/**
 * Placement of the receiver: a tilt placement (distance, lateralOffset, tiltDeg) or a pose (center,
 * normal). One object with every key optional, so a mistake is reported at its own field.
 */
export const placementSchema = z.object({
  distance: coordinate('the distance along the axis').optional(),
  lateralOffset: coordinate('the lateral offset').optional(),
  tiltDeg: quantity('the tilt', 'degrees').min(-360, 'Use -360 to 360 degrees.').max(360, 'Use -360 to 360 degrees.').optional(),
  center: vector('the receiver centre').optional(),
  normal: vector('the receiver normal').optional(),
}, { error: 'Place the receiver: distance (with lateralOffset and tiltDeg) or center and normal, in metres.' })
  .superRefine((p, ctx) => {
    if (typeof p !== 'object' || p === null) return; // already refused as a whole
    const add = (path: string[], message: string) => ctx.addIssue({ code: 'custom', path, message });
    const pose = p.center !== undefined || p.normal !== undefined;
    const tilt = p.distance !== undefined || p.lateralOffset !== undefined || p.tiltDeg !== undefined;
    if (pose && tilt) add([], 'Give either distance, lateralOffset and tiltDeg, or center and normal, not both.');
    else if (pose) {
      if (p.center === undefined) add(['center'], 'Enter the receiver centre as [x, y, z] in metres.');
      if (p.normal === undefined) add(['normal'], 'Enter the receiver normal as [x, y, z].');
      else if (p.normal.every(isNumber) && Math.hypot(...p.normal) === 0) add(['normal'], 'The normal must not be the zero vector.');
    } else if (p.distance === undefined) add(['distance'], 'Enter the distance in metres (or a pose: center and normal).');
  }, always)
  .transform((p): Placement => (p.center && p.normal
    ? { center: p.center, normal: p.normal }
    : { distance: p.distance!, ...(p.lateralOffset !== undefined && { lateralOffset: p.lateralOffset }), ...(p.tiltDeg !== undefined && { tiltDeg: p.tiltDeg }) }));

const frequency = (what: string) => quantity(what, 'hertz')
  .min(MIN_FREQUENCY_HZ, `Use at least ${MIN_FREQUENCY_HZ} Hz.`).max(MAX_FREQUENCY_HZ, 'Use at most 300 MHz.');
const ohms = (what: string) => quantity(what, 'ohms');

export const circuitSchema = z.object({
  frequency: frequency('the operating frequency'),
  topology: z.enum(['SS', 'SP', 'PS', 'PP'], { error: 'Choose the topology SS, SP, PS or PP.' }),
  sourceVoltage: quantity('the source voltage', 'volts rms').min(0, 'Must not be negative.').max(1e6, 'Use at most 1 MV.'),
  sourceResistance: ohms('the source resistance').min(0, 'Must not be negative.'),
  loadResistance: ohms('the load resistance').positive('Must be greater than 0 Ω.'),
  txCapacitance: quantity('the transmitter capacitance', 'farads').positive('Must be greater than 0 F.').optional(),
  rxCapacitance: quantity('the receiver capacitance', 'farads').positive('Must be greater than 0 F.').optional(),
}, { error: 'Describe the circuit: frequency, topology, sourceVoltage, sourceResistance and loadResistance.' }) satisfies z.ZodType<CircuitSpec>;

const toleranceRange = `Use a tolerance from ${MIN_TOLERANCE.toExponential()} to ${MAX_TOLERANCE.toExponential()}`;

export const solveRequestSchema = z.object({
  transmitter: coilSchema,
  receiver: coilSchema,
  placement: placementSchema,
  circuit: circuitSchema,
  tolerance: z.number({ error: (i) => `Expected the tolerance as a number, not ${show(i.input)}.` })
    .min(MIN_TOLERANCE, `${toleranceRange}: a tighter one is too costly to compute.`)
    .max(MAX_TOLERANCE, `${toleranceRange}: a looser one is not a useful prediction.`)
    .default(1e-6),
  fieldPoints: z.array(vector('the field point'), { error: 'Expected a list of [x, y, z] points in metres.' })
    .max(MAX_FIELD_POINTS, `At most ${MAX_FIELD_POINTS} field points per request.`).optional(),
  band: z.object({
    startHz: frequency('the start frequency'),
    stopHz: frequency('the stop frequency'),
    points: quantity('the number of frequencies', 'points').int('Must be a whole number.')
      .min(2, 'Use at least 2.').max(MAX_BAND_POINTS, `At most ${MAX_BAND_POINTS} frequencies per request.`).default(101),
  }, { error: 'Expected the band as { startHz, stopHz, points }.' })
    .refine((b) => b.stopHz > b.startHz, { path: ['stopHz'], message: 'Must be above the start frequency.' })
    .optional(),
}, { error: 'Expected a JSON object with transmitter, receiver, placement and circuit.' });

export type SolveRequestInput = z.input<typeof solveRequestSchema>;
export type SolveRequestData = z.output<typeof solveRequestSchema>;
