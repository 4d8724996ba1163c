import { z } from 'zod';
import { studyCreateSchema } from '@/lib/validations/study';
import { parseQuantity } from '@/lib/units';

/**
 * The create-study form: the server's studyCreateSchema, except that the frequency is typed as text
 * with a unit. The text is converted to hertz here and then checked by the very same frequencyHz
 * rule the server applies, so browser and server agree on the limits.
 */
export const studyFormSchema = studyCreateSchema.omit({ frequencyHz: true }).extend({
  frequency: z
    .string()
    .transform((text, context) => {
      const parsed = parseQuantity(text, 'frequency', { field: 'Operating frequency' });
      if (!parsed.ok) {
        context.addIssue({ code: 'custom', message: parsed.message });
        return z.NEVER;
      }
      return parsed.value;
    })
    // The server's rule without its "missing means null" default: the text was already read above.
    .pipe(studyCreateSchema.shape.frequencyHz.unwrap().unwrap()),
});

export type StudyFormInput = z.input<typeof studyFormSchema>;
export type StudyFormOutput = z.output<typeof studyFormSchema>;

/** Server issue paths map to form fields; the server knows the frequency only in hertz. */
export function formFieldFor(path: string): keyof StudyFormInput | undefined {
  if (path === 'name' || path === 'summary') return path;
  if (path === 'frequencyHz') return 'frequency';
  return undefined;
}
