/**
 * Numbers as an instrument shows them: engineering prefixes (steps of 10^3) with a fixed count of
 * significant digits, so a value keeps its width while it changes.
 */

const PREFIXES = [
  { exponent: -15, symbol: 'f' },
  { exponent: -12, symbol: 'p' },
  { exponent: -9, symbol: 'n' },
  { exponent: -6, symbol: 'µ' },
  { exponent: -3, symbol: 'm' },
  { exponent: 0, symbol: '' },
  { exponent: 3, symbol: 'k' },
  { exponent: 6, symbol: 'M' },
  { exponent: 9, symbol: 'G' },
] as const;

/** Shown for a value that is missing or not a finite number. */
export const NO_VALUE = '—';

/**
 * 1.2345e-6, 'H' -> "1.235 µH"; 0 -> "0 H"; keeps `digits` significant digits (trailing zeros too).
 * Values outside the prefix range fall back to exponent notation.
 */
export function formatEngineering(value: number | null | undefined, unit: string, digits = 4, trimZeros = false): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return NO_VALUE;
  if (value === 0) return `0 ${unit}`.trim();
  const magnitude = Math.abs(value);
  let exponent = Math.floor(Math.log10(magnitude) / 3) * 3;
  // rounding can carry into the next step: 999.96 -> "1000" must become "1.000 k"
  if (Number((magnitude / 10 ** exponent).toPrecision(digits)) >= 1000) exponent += 3;
  const prefix = PREFIXES.find((p) => p.exponent === exponent);
  if (!prefix) return `${value.toExponential(digits - 1)} ${unit}`.trim();
  const fixed = (value / 10 ** exponent).toPrecision(digits);
  // toPrecision may answer "1e+2" for 100 at one digit; Number() writes it plainly
  const scaled = trimZeros || fixed.includes('e') ? String(Number(fixed)) : fixed;
  return `${scaled} ${prefix.symbol}${unit}`.trim();
}

/** A fraction as a percentage with `digits` significant digits: 0.8734 -> "87.34 %". */
export function formatPercent(fraction: number | null | undefined, digits = 4): string {
  if (fraction === null || fraction === undefined || !Number.isFinite(fraction)) return NO_VALUE;
  const pct = fraction * 100;
  if (pct === 0) return '0 %';
  return `${Math.abs(pct) >= 10 ** digits ? pct.toExponential(digits - 1) : pct.toPrecision(digits)} %`;
}

const SUPERSCRIPT: Record<string, string> = {
  '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹',
};

/** 7.2e-9 -> "7.2×10⁻⁹"; numbers from 0.001 to 1000 are written plainly. */
export function formatScientific(value: number, digits = 2): string {
  if (!Number.isFinite(value)) return NO_VALUE;
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  if (magnitude >= 1e-3 && magnitude < 1e3) return String(Number(value.toPrecision(digits)));
  const [mantissa, exponent] = value.toExponential(digits - 1).split('e');
  const exp = String(Number(exponent)).replace(/./g, (c) => SUPERSCRIPT[c] ?? c);
  return `${mantissa}×10${exp}`;
}

/** The estimated relative error of a solve as "±7.2×10⁻⁷ %". */
export function formatRelativeError(relativeError: number): string {
  return `±${formatScientific(relativeError * 100)} %`;
}

/** A plain decimal number for an input box: at most `decimals` decimals, no trailing zeros or float noise. */
export function formatInputNumber(value: number, decimals = 3): string {
  if (!Number.isFinite(value)) return '';
  return String(Number(value.toFixed(decimals)));
}

/** metres -> centimetres without binary tails (0.1 m -> 10, not 10.000000000000002). */
export const metresToCm = (m: number) => Number((m * 100).toPrecision(12));
/** centimetres -> metres without binary tails. */
export const cmToMetres = (cm: number) => Number((cm / 100).toPrecision(12));
