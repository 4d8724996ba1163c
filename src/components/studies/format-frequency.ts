/** Engineering prefixes for frequency, largest first. */
const FREQUENCY_STEPS = [
  { factor: 1e9, unit: 'GHz' },
  { factor: 1e6, unit: 'MHz' },
  { factor: 1e3, unit: 'kHz' },
] as const;

/** Significant digits shown: enough for 13.56 MHz or 6.780 MHz, without float noise. */
const SIGNIFICANT_DIGITS = 6;

/** A frequency in hertz as people write it: 6780000 -> "6.78 MHz", 85000 -> "85 kHz", 50 -> "50 Hz". */
export function formatFrequency(frequencyHz: number): string {
  const step = FREQUENCY_STEPS.find(({ factor }) => Math.abs(frequencyHz) >= factor);
  const value = step ? frequencyHz / step.factor : frequencyHz;
  return `${Number(value.toPrecision(SIGNIFICANT_DIGITS))} ${step ? step.unit : 'Hz'}`;
}
