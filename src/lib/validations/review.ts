import { z } from 'zod';
import { FIT_MODELS, REVIEW_QUANTITIES } from '../review/types';

/** ?quantity= of the review; coupling when absent. */
export const reviewQuerySchema = z.object({
  quantity: z.enum(REVIEW_QUANTITIES, { error: 'Choose coupling, mutualInductance or efficiency.' }).default('coupling'),
});

/** The tolerance the summary counts against, as a fraction (0.1 = 10 %). */
export const reviewToleranceSchema = z.object({
  tolerance: z
    .number({ error: 'The tolerance is a number (a fraction: 0.1 for 10 %).' })
    .finite('The tolerance is a finite number.')
    .min(0.001, 'Use at least 0.001 (0.1 %).')
    .max(1, 'Use at most 1 (100 %).'),
});

const pointId = z.number({ error: 'Choose a point of this plan.' }).int('Choose a point of this plan.').positive('Choose a point of this plan.');

export const outlierMarkSchema = z.object({
  pointId,
  reason: z.string({ error: 'Say why the point is set aside.' }).trim().min(1, 'Say why the point is set aside.').max(500, 'Use at most 500 characters.'),
});
export type OutlierMarkInput = z.infer<typeof outlierMarkSchema>;

export const fitRequestSchema = z.object({
  model: z.enum(FIT_MODELS, { error: 'Choose a parameter to fit.' }),
  quantity: z.enum(REVIEW_QUANTITIES, { error: 'Choose coupling, mutualInductance or efficiency.' }),
});

export const commentCreateSchema = z.object({
  pointId: pointId.nullable().default(null),
  body: z.string({ error: 'Write the comment.' }).trim().min(1, 'Write the comment.').max(4000, 'Use at most 4,000 characters.'),
});
export type CommentCreate = z.infer<typeof commentCreateSchema>;
