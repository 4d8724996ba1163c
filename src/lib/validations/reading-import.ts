import { z } from 'zod';
import { DEFAULT_ACCURACY, MEASUREMENT_METHODS } from '../../physics/measurement/methods';
import { csvRawField, unitFactor } from '../readings/csv-fields';
import { QUANTITIES } from '../units/quantity';
import { accuracySchema } from './reading';

/**
 * How the columns of a readings CSV map onto readings, and the import request. Column names are the
 * file's header cells as written; a field's `unit` is the unit of bare numbers in its column (empty:
 * the SI unit, degrees for phases). Every problem carries its field path ("fields.rxVoltage.unit").
 */

/** Largest CSV the import reads (the file's text, UTF-8). */
export const CSV_MAX_BYTES = 8 * 1024 * 1024;

const COLUMN_MAX = 200;
const column = (what: string) =>
  z.string({ error: `Choose the column of ${what}.` }).trim().min(1, `Choose the column of ${what}.`).max(COLUMN_MAX, `A column name has at most ${COLUMN_MAX} characters.`);
const optionalColumn = (what: string) => column(what).nullable().default(null);

const fieldColumnSchema = z.object({
  column: column('this value'),
  unit: z.string({ error: 'The unit is text, such as uH or mV.' }).trim().max(20, 'Use at most 20 characters.').default(''),
});

const circumstancesSchema = z.object({
  instrument: optionalColumn('the instrument'),
  calibration: optionalColumn('the calibration state'),
  temperatureC: optionalColumn('the temperature'),
  setupNotes: optionalColumn('the notes'),
  accuracy: accuracySchema.default(DEFAULT_ACCURACY),
});

export const csvColumnMapSchema = z
  .object({
    seqColumn: column('the point’s seq'),
    repeatColumn: optionalColumn('the repeat'),
    /** one method for every row ... */
    method: z.enum(MEASUREMENT_METHODS, { error: 'Choose a measurement method.' }).nullable().default(null),
    /** ... or the column whose cells name each row's method (its id or its label) */
    methodColumn: optionalColumn('the method'),
    fields: z.record(z.string(), fieldColumnSchema, { error: 'Map the fields to columns.' }).default({}),
    circumstances: circumstancesSchema.default({ instrument: null, calibration: null, temperatureC: null, setupNotes: null, accuracy: DEFAULT_ACCURACY }),
  })
  .superRefine((map, ctx) => {
    if (map.method === null && map.methodColumn === null) {
      ctx.addIssue({ code: 'custom', path: ['method'], message: 'Choose the method of every row, or the column that names it.' });
    }
    if (map.method !== null && map.methodColumn !== null) {
      ctx.addIssue({ code: 'custom', path: ['methodColumn'], message: 'Choose one method for the file or a method column, not both.' });
    }
    for (const [key, { unit }] of Object.entries(map.fields)) {
      const field = csvRawField(key);
      if (!field) {
        ctx.addIssue({ code: 'custom', path: ['fields', key], message: `No measurement method has an input “${key}”.` });
      } else if (unitFactor(field.kind, unit) === null) {
        const { noun, examples } = QUANTITIES[field.kind];
        ctx.addIssue({ code: 'custom', path: ['fields', key, 'unit'], message: `“${unit}” is not a unit of ${noun}; write one such as ${examples.replace(/[\d.]+ /g, '')}.` });
      }
      // A field no method of the file has is harmless (a remembered mapping may hold other methods'
      // columns): the import reads only each row's method's fields.
    }
  });

export type CsvColumnMap = z.output<typeof csvColumnMapSchema>;
export type CsvColumnMapInput = z.input<typeof csvColumnMapSchema>;

/** One CSV import request: the file's text and name, the mapping, and whether to store or only check. */
export const readingImportSchema = z.object({
  csv: z
    .string({ error: 'Send the file’s text.' })
    .min(1, 'The file is empty.')
    .refine((text) => new TextEncoder().encode(text).length <= CSV_MAX_BYTES, `The file is larger than ${CSV_MAX_BYTES / 1024 / 1024} MB; import it in parts.`),
  fileName: z.string({ error: 'The file name is text.' }).trim().max(200, 'Use at most 200 characters.').default(''),
  mapping: csvColumnMapSchema,
  commit: z.boolean({ error: 'Say whether to import or only check.' }).default(false),
});
export type ReadingImportRequest = z.output<typeof readingImportSchema>;
