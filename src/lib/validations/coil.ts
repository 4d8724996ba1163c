import { z } from 'zod';
import { awgDiameter, formatAwg, gaugeOfLabel } from '../units';
import { coilSpecSchema, whenFieldsValid } from './coil-spec';
import { STUDY_FREQUENCY_MAX_HZ, STUDY_FREQUENCY_MIN_HZ } from './study';

export { COIL_KINDS, MATERIALS, coilSpecSchema, type CoilKind } from './coil-spec';

/** A wire label that names a gauge must agree with the diameter to this relative difference. */
const LABEL_DIAMETER_TOLERANCE = 1e-6;

export const coilNameSchema = z
  .string({ error: 'Enter a name for the coil.' })
  .trim()
  .min(1, 'Enter a name for the coil.')
  .max(120, 'Use at most 120 characters.');

const notesSchema = z.string({ error: 'Notes are text.' }).trim().max(4000, 'Use at most 4,000 characters.');

/** The wire as written on the reel ("AWG 18"), kept for people; the spec's wireDiameter is what counts. */
const wireLabelSchema = z
  .string({ error: 'The wire label is text.' })
  .trim()
  .max(60, 'Use at most 60 characters.')
  .nullable()
  .transform((label) => (label === '' ? null : label));

const measuredValue = (label: string, unit: string) =>
  z
    .number({ error: `Enter the measured ${label} in ${unit}, or null.` })
    .positive(`The measured ${label} must be greater than zero.`)
    .nullable()
    .default(null);

/** Values measured on the bench, all optional, each meaningful only with the frequency it was measured at. */
export const coilMeasuredSchema = z
  .object({
    inductance: measuredValue('inductance', 'henries'),
    resistance: measuredValue('resistance', 'ohms'),
    qualityFactor: measuredValue('Q', 'plain numbers'),
    frequencyHz: z
      .number({ error: 'Enter the measurement frequency in hertz, or null.' })
      .min(STUDY_FREQUENCY_MIN_HZ, 'The frequency must be at least 1 Hz.')
      .max(STUDY_FREQUENCY_MAX_HZ, 'The frequency must be at most 300 MHz.')
      .nullable()
      .default(null),
  })
  .refine((m) => m.frequencyHz !== null || (m.inductance === null && m.resistance === null && m.qualityFactor === null), {
    path: ['frequencyHz'],
    message: 'Enter the frequency the values were measured at.',
  });
export type CoilMeasured = z.output<typeof coilMeasuredSchema>;

const NOTHING_MEASURED: CoilMeasured = { inductance: null, resistance: null, qualityFactor: null, frequencyHz: null };

/** Why a gauge label and a diameter disagree, or null when they agree (or the label names no gauge). */
export function wireLabelMismatch(label: string | null, wireDiameter: number): string | null {
  const gauge = label === null ? null : gaugeOfLabel(label);
  if (gauge === null) return null;
  const expected = awgDiameter(gauge);
  if (Math.abs(wireDiameter - expected) <= LABEL_DIAMETER_TOLERANCE * expected) return null;
  return `${formatAwg(gauge)} is ${Number((expected * 1000).toPrecision(4))} mm, but the wire diameter is ${Number((wireDiameter * 1000).toPrecision(4))} mm.`;
}

const checkLabel = (value: { wireLabel?: string | null; spec?: { wireDiameter: number } }, context: z.RefinementCtx) => {
  if (value.wireLabel === undefined || value.spec === undefined) return;
  const mismatch = wireLabelMismatch(value.wireLabel, value.spec.wireDiameter);
  if (mismatch) context.addIssue({ code: 'custom', path: ['wireLabel'], message: mismatch });
};

/** A new coil for a study's library. */
export const coilCreateSchema = z
  .object({
    name: coilNameSchema,
    spec: coilSpecSchema,
    wireLabel: wireLabelSchema.optional().default(null),
    measured: coilMeasuredSchema.optional().default(NOTHING_MEASURED),
    notes: notesSchema.optional().default(''),
  })
  .superRefine(checkLabel, whenFieldsValid);
export type CoilCreateInput = z.input<typeof coilCreateSchema>;
export type CoilCreate = z.output<typeof coilCreateSchema>;

/** Changing a coil: any subset; spec and measured are replaced whole. */
export const coilUpdateSchema = z
  .object({
    name: coilNameSchema.optional(),
    spec: coilSpecSchema.optional(),
    wireLabel: wireLabelSchema.optional(),
    measured: coilMeasuredSchema.optional(),
    notes: notesSchema.optional(),
  })
  .refine((value) => Object.values(value).some((field) => field !== undefined), { message: 'Nothing to change.' })
  .superRefine(checkLabel, whenFieldsValid);
export type CoilUpdateInput = z.input<typeof coilUpdateSchema>;
export type CoilUpdate = z.output<typeof coilUpdateSchema>;
