import { z } from 'zod';
import { STUDY_ROLES } from '../auth/permissions';
import { emailSchema } from './common';

/** Lowest and highest operating frequency a study may declare [Hz]: audio-band induction to VHF. */
export const STUDY_FREQUENCY_MIN_HZ = 1;
export const STUDY_FREQUENCY_MAX_HZ = 300e6;

/** Creating a study. The same schema runs in the browser form and again on the server. */
export const studyCreateSchema = z.object({
  name: z
    .string({ error: 'Enter a name for the study.' })
    .trim()
    .min(3, 'Use at least 3 characters.')
    .max(160, 'Use at most 160 characters.'),
  summary: z.string().trim().max(4000, 'Use at most 4,000 characters.').optional().default(''),
  frequencyHz: z
    .number({ error: 'Enter the operating frequency in hertz.' })
    .min(STUDY_FREQUENCY_MIN_HZ, 'The frequency must be at least 1 Hz.')
    .max(STUDY_FREQUENCY_MAX_HZ, 'The frequency must be at most 300 MHz.')
    .nullable()
    .optional()
    .default(null),
});
export type StudyCreateInput = z.input<typeof studyCreateSchema>;
export type StudyCreate = z.output<typeof studyCreateSchema>;

export const studyRoleSchema = z.enum(STUDY_ROLES, { error: 'Choose researcher, student or supervisor.' });

/** Inviting someone to a study with a role. */
export const invitationCreateSchema = z.object({
  email: emailSchema,
  role: studyRoleSchema,
});
export type InvitationCreateInput = z.input<typeof invitationCreateSchema>;

/** Changing a member's role on a study. */
export const memberRoleUpdateSchema = z.object({ role: studyRoleSchema });
