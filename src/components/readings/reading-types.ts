/**
 * The readings API's JSON as the browser sees it (src/app/api/studies/[studyId]/plans/[planId]/readings).
 * Values are SI; phases in degrees.
 */
import type { CautionAcknowledgement as ApiAcknowledgement, Reading as ApiReading } from '@/lib/data/readings';

export type Reading = ApiReading;
export type CautionAcknowledgement = ApiAcknowledgement;
export type { Derivation, MeasuredValue } from '@/physics/measurement/types';
export { METHOD_SPECS, MEASUREMENT_METHODS, DEFAULT_ACCURACY, type MeasurementMethod, type RawFieldSpec } from '@/physics/measurement/methods';
