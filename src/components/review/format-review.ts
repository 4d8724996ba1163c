import { NO_VALUE } from '@/components/bench/format-quantity';
import { formatMeasured, formatQuantityValue } from '@/components/readings/format-measured';
import { FIT_MODEL_INFO, REVIEW_QUANTITY_LABELS, type FitModel, type ReviewQuantity } from '@/lib/review/types';

/**
 * How the review writes its numbers. Relative errors are fractions in the API (0.0123) and percentages
 * with two decimals on the page ("1.23 %"), so a tolerance of 5 % and an error of 4.99 % read apart.
 */

/** Decimals of a percentage on the review page. */
export const PERCENT_DECIMALS = 2;
/** Significant digits of a standard uncertainty (two, as the GUM suggests for a reported uncertainty). */
export const UNCERTAINTY_DIGITS = 2;

const MINUS = '\u2212';
/** toFixed writes a hyphen; the page writes a true minus sign, as elsewhere in Couplet. */
const signed = (text: string) => text.replace(/^-/, MINUS);
const missing = (v: number | null | undefined): v is null | undefined => v === null || v === undefined || !Number.isFinite(v);

/** 0.012345 -> "1.23 %"; the sign is kept for negatives ("−1.23 %"). */
export function formatPercentValue(fraction: number | null | undefined, decimals = PERCENT_DECIMALS): string {
  if (missing(fraction)) return NO_VALUE;
  const text = Math.abs(fraction * 100).toFixed(decimals);
  return `${fraction < 0 && Number(text) !== 0 ? MINUS : ''}${text} %`;
}

/** A signed relative error, always with its sign: 0.0123 -> "+1.23 %", -0.05 -> "−5.00 %". */
export function formatSignedPercent(fraction: number | null | undefined): string {
  if (missing(fraction)) return NO_VALUE;
  const text = Math.abs(fraction * 100).toFixed(PERCENT_DECIMALS);
  if (Number(text) === 0) return `${text} %`;
  return `${fraction < 0 ? MINUS : '+'}${text} %`;
}

/** A residual in standard uncertainties: 2.345 -> "+2.35 u". */
export function formatNormalized(normalized: number | null | undefined): string {
  if (missing(normalized)) return NO_VALUE;
  const text = Math.abs(normalized).toFixed(2);
  if (Number(text) === 0) return `${text} u`;
  return `${normalized < 0 ? MINUS : '+'}${text} u`;
}

/** A value of the reviewed quantity: k as 4 significant digits, M with an SI prefix, η in percent. */
export const formatReviewValue = (value: number | null | undefined, quantity: ReviewQuantity): string => formatQuantityValue(value, quantity);

/** "1.234 µH ± 12 nH": a value and its standard uncertainty. */
export function formatReviewMeasured(value: number, uncertainty: number, quantity: ReviewQuantity): string {
  return formatMeasured({ value, uncertainty }, quantity);
}

/** "k", "M [H]", "η": the quantity's symbol with its unit for axis names. */
export function quantityAxisName(quantity: ReviewQuantity, prefix: string): string {
  const info = REVIEW_QUANTITY_LABELS[quantity];
  const unit = quantity === 'efficiency' ? ' [%]' : info.unit ? ` [${info.unit}]` : '';
  return `${prefix} ${info.symbol}${unit}`;
}

/** A tick label of the quantity's axis: M with a prefix, η in percent, k as a plain number. */
export function formatAxisTick(value: number, quantity: ReviewQuantity): string {
  if (quantity === 'coupling') return String(Number(value.toPrecision(4)));
  // trailing zeros after the point only: "150.0 nH" -> "150 nH", "1.200 µH" -> "1.2 µH"
  return formatQuantityValue(value, quantity).replace(/(\.\d*?)0+(?= )/, '$1').replace(/\.(?= )/, '');
}

const PREFIXES: Record<number, string> = { [-12]: 'p', [-9]: 'n', [-6]: '\u00b5', [-3]: 'm', 0: '', 3: 'k', 6: 'M' };

/** Decimal places that show `uncertainty` with UNCERTAINTY_DIGITS significant digits. */
function decimalsFor(uncertainty: number): number {
  if (!(uncertainty > 0) || !Number.isFinite(uncertainty)) return 3;
  return Math.max(0, UNCERTAINTY_DIGITS - 1 - Math.floor(Math.log10(uncertainty)));
}

/**
 * A fitted parameter with its uncertainty, both rounded at the uncertainty's second significant digit:
 * "1.23° ± 0.45°", "2.31 mm ± 0.42 mm", "184 mΩ ± 21 mΩ". Lengths and resistances take the engineering
 * prefix of the larger of the two magnitudes, so value and uncertainty share one unit.
 */
export function formatFitValue(value: number, uncertainty: number, model: FitModel): string {
  if (missing(value)) return NO_VALUE;
  const unit = FIT_MODEL_INFO[model].unit;
  if (unit === '\u00b0') {
    const decimals = decimalsFor(uncertainty);
    const u = missing(uncertainty) ? NO_VALUE : `${uncertainty.toFixed(decimals)}\u00b0`;
    return `${signed(value.toFixed(decimals))}\u00b0 \u00b1 ${u}`;
  }
  const magnitude = Math.max(Math.abs(value), missing(uncertainty) ? 0 : Math.abs(uncertainty));
  const exponent = magnitude > 0 ? Math.min(6, Math.max(-12, Math.floor(Math.log10(magnitude) / 3) * 3)) : 0;
  const scale = 10 ** exponent;
  const decimals = decimalsFor(uncertainty / scale);
  const symbol = `${PREFIXES[exponent]}${unit}`;
  const u = missing(uncertainty) ? NO_VALUE : `${(uncertainty / scale).toFixed(decimals)} ${symbol}`;
  return `${signed((value / scale).toFixed(decimals))} ${symbol} \u00b1 ${u}`;
}

/** The tolerance the API accepts, as fractions (0.1 % to 100 %). */
export const TOLERANCE_MIN = 0.001;
export const TOLERANCE_MAX = 1;

/** Parses "5", "5 %" or "2.5%" as a fraction; null when it is not a tolerance the API accepts. */
export function parseTolerancePercent(text: string): number | null {
  const match = /^\s*(\d+(?:\.\d*)?|\.\d+)\s*%?\s*$/.exec(text);
  if (!match) return null;
  const fraction = Number(match[1]) / 100;
  return fraction >= TOLERANCE_MIN && fraction <= TOLERANCE_MAX ? fraction : null;
}
