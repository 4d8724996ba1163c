/**
 * American Wire Gauge (ASTM B258): d = 0.005 in x 92^((36 - n) / 39), so that AWG 36 is 0.005 in and
 * AWG 0000 (n = -3) is 0.46 in, 39 steps apart in a geometric series. Gauges 0000, 000 and 00 are
 * n = -3, -2, -1; they are also written 4/0, 3/0 and 2/0.
 */

/** One inch [m] (exact by the 1959 international yard and pound agreement). */
export const INCH_M = 0.0254;

/** Largest and smallest gauge number accepted: 0000 (-3) to 56, the range of ASTM B258's table. */
export const AWG_MIN = -3;
export const AWG_MAX = 56;

/** Diameter of a solid round wire of gauge n [m] (ASTM B258 formula). */
export function awgDiameter(gauge: number): number {
  return 0.005 * INCH_M * 92 ** ((36 - gauge) / 39);
}

/** "18", "0", "00" / "2/0", "000" / "3/0", "0000" / "4/0" as the gauge number n, else null. */
function gaugeNumber(text: string): number | null {
  const slash = /^([234])\/0$/.exec(text);
  if (slash) return 1 - Number(slash[1]);
  if (/^0{2,4}$/.test(text)) return 1 - text.length;
  if (/^\d{1,2}$/.test(text)) return Number(text);
  return null;
}

export type AwgParse = { kind: 'awg'; gauge: number } | { kind: 'not-awg' } | { kind: 'out-of-range'; text: string };

/**
 * Reads a gauge as people write it: "AWG 18", "18 AWG", "awg18", "#18 AWG", "AWG 4/0", "0000 AWG".
 * Text that does not mention AWG is `not-awg`; an unknown number with AWG is `out-of-range`.
 */
export function parseAwg(text: string): AwgParse {
  const compact = text.trim().replace(/\s+/g, ' ');
  const match = /^(?:awg ?#?([\d/]+)|#?([\d/]+) ?awg)$/i.exec(compact);
  if (!match) return { kind: 'not-awg' };
  const gauge = gaugeNumber(match[1] ?? match[2]);
  if (gauge === null || gauge < AWG_MIN || gauge > AWG_MAX) return { kind: 'out-of-range', text: compact };
  return { kind: 'awg', gauge };
}

/** A gauge number as written on a reel: 18 -> "AWG 18", -3 -> "AWG 0000". */
export function formatAwg(gauge: number): string {
  return `AWG ${gauge >= 0 ? String(gauge) : '0'.repeat(1 - gauge)}`;
}
