import type { Coil } from '@/lib/data/coils';
import { formatFrequency, formatInductance, formatLength, formatResistance, gaugeOfLabel } from '@/lib/units';

/** Digits shown in the table: enough to tell coils apart, few enough to scan a column. */
export const TABLE_DIGITS = 4;

const len = (metres: number) => formatLength(metres, TABLE_DIGITS);

/** The sizes that define a coil, normalised: ["radius 5 cm", "length 4 cm"]. */
export function describeDimensions(coil: Coil): string[] {
  const s = coil.spec;
  if (s.kind === 'loop') return [`radius ${len(s.radius)}`];
  if (s.kind === 'helix') return [`radius ${len(s.radius)}`, `length ${len(s.length)}`];
  return [`radius ${len(s.innerRadius)} to ${len(s.outerRadius)}`];
}

/** Turns as a number; a loop is one turn by definition. */
export const turnsOf = (coil: Coil) => (coil.spec.kind === 'loop' ? 1 : coil.spec.turns);

/** The wire in two lines: the gauge or diameter, then diameter, strands and material when they add something. */
export function describeWire(coil: Coil): { main: string; detail: string | null } {
  const s = coil.spec;
  const gauge = coil.wireLabel !== null && gaugeOfLabel(coil.wireLabel) !== null;
  const detail = gauge ? [len(s.wireDiameter)] : [];
  if (s.strands !== undefined && s.strands > 1 && s.strandDiameter !== undefined) detail.push(`${s.strands} × ${len(s.strandDiameter)} strands`);
  if (s.material === 'aluminium') detail.push('aluminium');
  return { main: gauge ? coil.wireLabel! : len(s.wireDiameter), detail: detail.length > 0 ? detail.join(', ') : null };
}

/** Measured values (["L 10.2 µH", "R 820 mΩ", "Q 310"]) and where ("at 6.78 MHz"), or null when nothing was measured. */
export function describeMeasured(coil: Coil): { values: string[]; at: string | null } | null {
  const m = coil.measured;
  const parts: string[] = [];
  if (m.inductance !== null) parts.push(`L ${formatInductance(m.inductance, TABLE_DIGITS)}`);
  if (m.resistance !== null) parts.push(`R ${formatResistance(m.resistance, TABLE_DIGITS)}`);
  if (m.qualityFactor !== null) parts.push(`Q ${Number(m.qualityFactor.toPrecision(TABLE_DIGITS))}`);
  if (parts.length === 0) return null;
  return { values: parts, at: m.frequencyHz === null ? null : `at ${formatFrequency(m.frequencyHz)}` };
}

/** The largest size of a coil [m], for sorting by size. */
export const sizeOf = (coil: Coil) => (coil.spec.kind === 'spiral' ? coil.spec.outerRadius : coil.spec.radius);
