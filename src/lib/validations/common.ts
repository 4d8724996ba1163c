import { z } from 'zod';

/** Trimmed, lower-cased e-mail address (addresses are compared case-insensitively). */
export const emailSchema = z
  .string({ error: 'Enter an e-mail address.' })
  .trim()
  .min(3, 'Enter an e-mail address.')
  .max(254, 'An e-mail address has at most 254 characters.')
  .pipe(z.email({ error: 'Enter a valid e-mail address.' }))
  .transform((value) => value.toLowerCase());

/** bcrypt reads at most 72 bytes; longer passwords would be silently truncated, so refuse them. */
const BCRYPT_MAX_BYTES = 72;

export const newPasswordSchema = z
  .string({ error: 'Enter a password.' })
  .min(10, 'Use at least 10 characters.')
  .refine((value) => new TextEncoder().encode(value).length <= BCRYPT_MAX_BYTES, {
    message: `Use at most ${BCRYPT_MAX_BYTES} bytes.`,
  });

export const personNameSchema = z
  .string({ error: 'Enter a name.' })
  .trim()
  .min(1, 'Enter a name.')
  .max(120, 'A name has at most 120 characters.');
