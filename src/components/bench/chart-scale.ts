/**
 * Axis arithmetic for the small inline-SVG chart (no chart library): round tick values and a linear
 * map from data to pixels.
 */

/** About `count` round tick values (1, 2, 5 x 10^k steps) covering [min, max]. */
export function niceTicks(min: number, max: number, count = 4): number[] {
  if (!Number.isFinite(min) || !Number.isFinite(max)) return [];
  if (min === max) {
    const pad = min === 0 ? 1 : Math.abs(min) * 0.5;
    min -= pad;
    max += pad;
  }
  const raw = (max - min) / Math.max(1, count);
  const decade = 10 ** Math.floor(Math.log10(raw));
  const m = raw / decade;
  const step = (m <= 1 ? 1 : m <= 2 ? 2 : m <= 5 ? 5 : 10) * decade;
  const first = Math.floor(min / step + 1e-9) * step;
  const last = Math.ceil(max / step - 1e-9) * step;
  const ticks: number[] = [];
  for (let v = first; v <= last + step * 1e-9; v += step) ticks.push(Number(v.toPrecision(12)) + 0);
  return ticks;
}

/** Linear map of [d0, d1] onto [p0, p1]. */
export function linearScale(d0: number, d1: number, p0: number, p1: number): (v: number) => number {
  const span = d1 - d0 || 1;
  return (v: number) => p0 + ((v - d0) / span) * (p1 - p0);
}

/** k at a tilt from the sweep's points by linear interpolation; null outside the swept range or at a gap. */
export function interpolateAt(points: readonly { tiltDeg: number; coupling: number | null }[], tiltDeg: number): number | null {
  for (let i = 0; i + 1 < points.length; i++) {
    const a = points[i];
    const b = points[i + 1];
    if (tiltDeg >= a.tiltDeg && tiltDeg <= b.tiltDeg) {
      if (a.coupling === null || b.coupling === null) return null;
      const f = (tiltDeg - a.tiltDeg) / (b.tiltDeg - a.tiltDeg || 1);
      return a.coupling + f * (b.coupling - a.coupling);
    }
  }
  return null;
}
