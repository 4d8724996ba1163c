import { z } from 'zod';
import { MAX_STRANDS, MAX_TURNS } from '../../physics/validation';
import type { CoilSpec } from '../../physics/types';

/**
 * A coil as the solver takes it (src/physics/types.ts, PRODUCT.md "Geometry conventions"), in SI:
 * metres, degrees Celsius. Forms convert "12 cm" or "AWG 18" to these numbers before this runs; the
 * server runs it again. At least as strict as the solver's own validation, so a stored coil always solves.
 */

export const COIL_KINDS = ['loop', 'helix', 'spiral'] as const;
export type CoilKind = (typeof COIL_KINDS)[number];
export const MATERIALS = ['copper', 'aluminium'] as const;

/** Conductor temperatures the linear resistivity model is offered for [deg C]: a cold store to hot enamel. */
export const MIN_TEMPERATURE_C = -50;
export const MAX_TEMPERATURE_C = 250;

/**
 * Densest packing of equal circles in the plane, pi / sqrt(12) (Thue 1910; L. Fejes Toth 1940). No
 * bundle of two or more round strands can fill more of its circle than this, so more is refused.
 */
export const HEXAGONAL_PACKING_DENSITY = Math.PI / Math.sqrt(12);

/** Largest dimension accepted [m], the same ceiling as the solve API's lengths: beyond any bench. */
export const MAX_COIL_DIMENSION_M = 100;

/** Readable length for messages, in millimetres (this file must not depend on the form's formatter). */
const mm = (metres: number) => `${Number((metres * 1000).toPrecision(4))} mm`;

const metres = (label: string) =>
  z
    .number({ error: `Enter the ${label} in metres.` })
    .positive(`The ${label} must be greater than zero.`)
    .max(MAX_COIL_DIMENSION_M, `The ${label} must be at most ${MAX_COIL_DIMENSION_M} m.`);

const turns = z
  .number({ error: 'Enter the number of turns.' })
  .positive('The number of turns must be greater than zero.')
  .max(MAX_TURNS, `At most ${MAX_TURNS.toLocaleString('en')} turns.`);

const common = {
  wireDiameter: metres('wire diameter'),
  material: z.enum(MATERIALS, { error: 'Choose copper or aluminium.' }).optional(),
  temperatureC: z
    .number({ error: 'Enter the wire temperature in degrees Celsius.' })
    .min(MIN_TEMPERATURE_C, `The temperature must be at least ${MIN_TEMPERATURE_C} °C.`)
    .max(MAX_TEMPERATURE_C, `The temperature must be at most ${MAX_TEMPERATURE_C} °C.`)
    .optional(),
  strands: z
    .number({ error: 'Enter the number of strands.' })
    .int('The number of strands is a whole number.')
    .min(1, 'At least one strand.')
    .max(MAX_STRANDS, `At most ${MAX_STRANDS.toLocaleString('en')} strands.`)
    .optional(),
  strandDiameter: metres('strand diameter').optional(),
};

// Unknown keys are refused rather than dropped: a measured `resistance` belongs in the coil's
// measured values, with the frequency it was measured at, not in the spec.
const strict = {
  error: (issue: { code?: string; keys?: string[] }) =>
    issue.code === 'unrecognized_keys' ? `A coil spec has no field ${(issue.keys ?? []).join(', ')}.` : undefined,
};

/** Cross-field rules run only on a spec whose fields are each valid, so their messages make sense. */
export const whenFieldsValid = { when: (payload: { issues: readonly unknown[] }) => payload.issues.length === 0 };

const loop = z.strictObject({ kind: z.literal('loop'), radius: metres('radius'), ...common }, strict);
const helix = z.strictObject(
  {
    kind: z.literal('helix'),
    radius: metres('radius'),
    turns,
    length: z
      .number({ error: 'Enter the length in metres.' })
      .min(0, 'The length must not be negative.')
      .max(MAX_COIL_DIMENSION_M, `The length must be at most ${MAX_COIL_DIMENSION_M} m.`),
    ...common,
  },
  strict,
);
const spiral = z.strictObject(
  { kind: z.literal('spiral'), innerRadius: metres('inner radius'), outerRadius: metres('outer radius'), turns, ...common },
  strict,
);

type Issue = { path: string[]; message: string };

/** Rules across fields of one spec; each issue names the field to change. */
export function coilSpecIssues(spec: CoilSpec): Issue[] {
  const issues: Issue[] = [];
  const add = (field: string, message: string) => issues.push({ path: [field], message });
  const d = spec.wireDiameter;
  if ((spec.kind === 'loop' || spec.kind === 'helix') && d >= spec.radius) {
    add('wireDiameter', `The wire diameter (${mm(d)}) must be smaller than the coil radius (${mm(spec.radius)}).`);
  }
  if (spec.kind === 'helix' && spec.turns > 1 && spec.length / spec.turns < d) {
    add('length', `Turns overlap: the pitch (length / turns = ${mm(spec.length / spec.turns)}) is less than the wire diameter (${mm(d)}).`);
  }
  if (spec.kind === 'spiral') {
    if (spec.innerRadius >= spec.outerRadius) {
      add('innerRadius', `The inner radius (${mm(spec.innerRadius)}) must be smaller than the outer radius (${mm(spec.outerRadius)}).`);
    } else {
      const pitch = (spec.outerRadius - spec.innerRadius) / spec.turns;
      if (pitch < d) add('turns', `Turns overlap: the radial pitch (${mm(pitch)}) is less than the wire diameter (${mm(d)}).`);
      if (spec.innerRadius < d / 2) add('innerRadius', `The inner radius must be at least half the wire diameter (${mm(d / 2)}).`);
    }
  }
  const strands = spec.strands ?? 1;
  const sd = spec.strandDiameter;
  if (strands > 1 && sd === undefined) add('strandDiameter', 'Enter the diameter of one strand.');
  if (sd !== undefined) {
    if (sd > d) add('strandDiameter', `A strand (${mm(sd)}) cannot be thicker than the whole wire (${mm(d)}).`);
    else if (strands > 1 && (sd > d / 2 || strands * (sd / d) ** 2 > HEXAGONAL_PACKING_DENSITY)) {
      add('strands', `${strands} strands of ${mm(sd)} do not fit in a wire of ${mm(d)}.`);
    }
  }
  return issues;
}

/** A coil spec in SI with every rule; issue paths are the spec's field names. */
export const coilSpecSchema = z
  .discriminatedUnion('kind', [loop, helix, spiral], { error: 'Choose loop, helix or spiral.' })
  .superRefine((spec, context) => {
    for (const issue of coilSpecIssues(spec)) context.addIssue({ code: 'custom', ...issue });
  }, whenFieldsValid);
