/** Number formats the review shares between the page, the e-mails and the report. Pure. */

/** A fraction as a percentage: 0.03214 -> "3.21 %". */
export function formatPercent(fraction: number, digits = 2): string {
  return `${(fraction * 100).toFixed(digits)} %`;
}

/** A signed fraction as a percentage with its sign: -0.012 -> "−1.20 %", 0.012 -> "+1.20 %". */
export function formatSignedPercent(fraction: number, digits = 2): string {
  const text = (Math.abs(fraction) * 100).toFixed(digits);
  if (Number(text) === 0) return `${text} %`;
  return `${fraction < 0 ? '−' : '+'}${text} %`;
}
