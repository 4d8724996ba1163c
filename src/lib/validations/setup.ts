import { z } from 'zod';
import { STUDY_FREQUENCY_MAX_HZ, STUDY_FREQUENCY_MIN_HZ } from './study';

/**
 * A saved setup: two coils of the study's library, the receiver's placement and the drive circuit, in
 * SI (metres, degrees, hertz, volts rms, ohms, farads), as the solver takes them (src/physics/types.ts).
 * The 3D bench converts centimetres and degrees from its inputs before sending.
 */

export const TOPOLOGIES = ['SS', 'SP', 'PS', 'PP'] as const;

/** Farthest a receiver, the operator point or the camera may sit from the transmitter [m]: room scale. */
export const MAX_BENCH_DISTANCE_M = 100;

const coordinate = (label: string) =>
  z
    .number({ error: `Enter the ${label} in metres.` })
    .min(-MAX_BENCH_DISTANCE_M, `The ${label} must be within ${MAX_BENCH_DISTANCE_M} m.`)
    .max(MAX_BENCH_DISTANCE_M, `The ${label} must be within ${MAX_BENCH_DISTANCE_M} m.`);

const point = (label: string) => z.tuple([coordinate(`${label} x`), coordinate(`${label} y`), coordinate(`${label} z`)], { error: `The ${label} is [x, y, z] in metres.` });

/** Receiver placement (PRODUCT.md): tilt about the local y axis, then centre at (lateralOffset, 0, distance). */
export const placementSchema = z.object(
  {
    distance: coordinate('distance'),
    lateralOffset: coordinate('lateral offset').default(0),
    tiltDeg: z
      .number({ error: 'Enter the tilt in degrees.' })
      .min(-180, 'The tilt must be between -180 and 180 degrees.')
      .max(180, 'The tilt must be between -180 and 180 degrees.')
      .default(0),
  },
  { error: 'Give the placement as distance, lateral offset and tilt.' },
);

const ohms = (label: string, allowZero: boolean) => {
  const base = z.number({ error: `Enter the ${label} in ohms.` });
  return allowZero ? base.min(0, `The ${label} must not be negative.`) : base.positive(`The ${label} must be greater than zero.`);
};

const farads = (label: string) =>
  z
    .number({ error: `Enter the ${label} in farads.` })
    .positive(`The ${label} must be greater than zero.`)
    .nullish()
    // Absent means "tuned to the frequency" (CircuitSpec); null is accepted and means the same.
    .transform((value) => value ?? undefined);

/** The drive circuit (CircuitSpec). */
export const circuitSchema = z.object(
  {
    frequency: z
      .number({ error: 'Enter the frequency in hertz.' })
      .min(STUDY_FREQUENCY_MIN_HZ, 'The frequency must be at least 1 Hz.')
      .max(STUDY_FREQUENCY_MAX_HZ, 'The frequency must be at most 300 MHz.'),
    topology: z.enum(TOPOLOGIES, { error: 'Choose SS, SP, PS or PP.' }),
    sourceVoltage: z.number({ error: 'Enter the source voltage in volts rms.' }).min(0, 'The source voltage must not be negative.'),
    sourceResistance: ohms('source resistance', true),
    loadResistance: ohms('load resistance', false),
    txCapacitance: farads('transmitter capacitance'),
    rxCapacitance: farads('receiver capacitance'),
  },
  { error: 'Give the circuit as frequency, topology, source and load.' },
);

/** Where the 3D view's camera stands and what it looks at, to restore the view exactly. */
export const viewSchema = z.object({ position: point('camera position'), target: point('camera target') }, { error: 'The view is { position, target }.' });

const coilId = (label: string) => z.number({ error: `Choose the ${label} coil.` }).int(`Choose the ${label} coil.`).positive(`Choose the ${label} coil.`);

export const setupNameSchema = z
  .string({ error: 'Enter a name for the setup.' })
  .trim()
  .min(1, 'Enter a name for the setup.')
  .max(120, 'Use at most 120 characters.');

const notesSchema = z.string({ error: 'Notes are text.' }).trim().max(4000, 'Use at most 4,000 characters.');

export const setupCreateSchema = z.object({
  name: setupNameSchema,
  transmitterCoilId: coilId('transmitter'),
  receiverCoilId: coilId('receiver'),
  placement: placementSchema,
  circuit: circuitSchema,
  operatorPoint: point('operator point').nullable().optional().default(null),
  view: viewSchema.nullable().optional().default(null),
  notes: notesSchema.optional().default(''),
});
export type SetupCreateInput = z.input<typeof setupCreateSchema>;
export type SetupCreate = z.output<typeof setupCreateSchema>;

/** Changing a setup: any subset; placement, circuit, operatorPoint and view are replaced whole. */
export const setupUpdateSchema = z
  .object({
    name: setupNameSchema.optional(),
    transmitterCoilId: coilId('transmitter').optional(),
    receiverCoilId: coilId('receiver').optional(),
    placement: placementSchema.optional(),
    circuit: circuitSchema.optional(),
    operatorPoint: point('operator point').nullable().optional(),
    view: viewSchema.nullable().optional(),
    notes: notesSchema.optional(),
  })
  .refine((value) => Object.values(value).some((field) => field !== undefined), { message: 'Nothing to change.' });
export type SetupUpdateInput = z.input<typeof setupUpdateSchema>;
export type SetupUpdate = z.output<typeof setupUpdateSchema>;
