import { FIT_MODEL_INFO, FIT_MODELS, type FitModel, type ReviewQuantity } from '@/lib/review/types';

/** The effective parameters a fit of this quantity can estimate. */
export const modelsFor = (quantity: ReviewQuantity): FitModel[] => FIT_MODELS.filter((m) => FIT_MODEL_INFO[m].quantities.includes(quantity));
