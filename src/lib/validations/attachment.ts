import { z } from 'zod';
import { ATTACHMENT_KINDS } from '../storage/content-type';

/** Longest caption [characters]; the attachments.caption column holds 500. */
export const MAX_CAPTION_LENGTH = 500;

const emptyToNull = (value: unknown) => (value === undefined || value === null || value === '' ? null : value);

/**
 * The form fields sent with an uploaded file (multipart/form-data, so every value arrives as a
 * string): its kind, the point it belongs to (none for the whole plan) and a caption. The file itself
 * is checked by its content on the server (src/lib/storage/content-type.ts).
 */
export const attachmentFieldsSchema = z.object({
  kind: z.enum(ATTACHMENT_KINDS, { error: 'Choose photo or instrument file.' }),
  // Form text must be plain decimal digits: Number() would also read " 12 ", "1.2e1" and "0xc" as
  // point 12. Callers inside the server pass numbers.
  pointId: z.preprocess(
    (value) => {
      if (emptyToNull(value) === null) return null;
      if (typeof value === 'number') return value;
      return typeof value === 'string' && /^[0-9]{1,15}$/.test(value) ? Number(value) : NaN;
    },
    z.number({ error: 'Choose a point of this plan.' }).int('Choose a point of this plan.').positive('Choose a point of this plan.').nullable(),
  ),
  caption: z.preprocess(
    emptyToNull,
    z
      .string()
      .trim()
      .max(MAX_CAPTION_LENGTH, `Use at most ${MAX_CAPTION_LENGTH} characters.`)
      .nullable()
      .transform((value) => value || null),
  ),
});
export type AttachmentFieldsInput = z.input<typeof attachmentFieldsSchema>;
export type AttachmentFields = z.output<typeof attachmentFieldsSchema>;
