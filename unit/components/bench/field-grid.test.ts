import { boundsOfPoints, FIELD_DECADES, fieldGridAround, fieldGridPoints, fieldPixels, fieldScale, niceCeil, rampColour, scalePosition } from '@/components/bench/field-grid';

describe('the field map grid', () => {
  const bounds = boundsOfPoints(Float64Array.of(-0.14, 0, 0, 0.14, 0, 0), Float64Array.of(0.01, 0, 0.085, -0.01, 0, 0.115));

  test('bounds of xyz-interleaved paths', () => {
    expect(bounds).toEqual({ min: [-0.14, 0, 0], max: [0.14, 0, 0.115] });
  });

  test('niceCeil rounds up to a round size', () => {
    expect(niceCeil(0.13)).toBe(0.15);
    expect(niceCeil(0.2)).toBe(0.2);
    expect(niceCeil(0.21)).toBe(0.25);
    expect(niceCeil(0.61)).toBe(0.8);
    expect(niceCeil(0.81)).toBe(1);
    expect(niceCeil(0.0011)).toBe(0.0015);
  });

  test('the grid is square, covers the coils with a margin, and has 41 points per side', () => {
    const g = fieldGridAround(bounds);
    expect(g.n).toBe(41);
    expect(g.xMax - g.xMin).toBeCloseTo(g.zMax - g.zMin, 12);
    expect(g.xMin).toBeLessThan(-0.14);
    expect(g.xMax).toBeGreaterThan(0.14);
    expect(g.zMin).toBeLessThan(0);
    expect(g.zMax).toBeGreaterThan(0.115);
  });

  test('a small move of the receiver keeps the same grid (a calm map while exploring)', () => {
    const moved = { min: bounds.min, max: [0.14, 0, 0.117] as [number, number, number] };
    expect(fieldGridAround(moved)).toEqual(fieldGridAround(bounds));
  });

  test('points run x fastest, then z, all on y = 0', () => {
    const g = { xMin: -1, xMax: 1, zMin: 0, zMax: 2, n: 3 };
    expect(fieldGridPoints(g)).toEqual([
      [-1, 0, 0], [0, 0, 0], [1, 0, 0],
      [-1, 0, 1], [0, 0, 1], [1, 0, 1],
      [-1, 0, 2], [0, 0, 2], [1, 0, 2],
    ]);
  });
});

describe('colours of the map', () => {
  test('the scale spans three decades up to a high quantile, ignoring points on a wire (Infinity)', () => {
    const values = [...Array.from({ length: 200 }, (_, i) => 1e-7 * (1 + i / 20)), Infinity, Number.NaN];
    const s = fieldScale(values);
    expect(s.logMax - s.logMin).toBe(FIELD_DECADES);
    expect(10 ** s.logMax).toBeGreaterThanOrEqual(1e-6);
    expect(10 ** s.logMax).toBeLessThan(2e-6);
  });

  test('the ramp runs dark to light and clamps', () => {
    const lightness = (c: number[]) => c[0] + c[1] + c[2];
    const samples = [0, 0.2, 0.4, 0.6, 0.8, 1].map((t) => lightness(rampColour(t)));
    for (let i = 1; i < samples.length; i++) expect(samples[i]).toBeGreaterThan(samples[i - 1]);
    expect(rampColour(-1)).toEqual(rampColour(0));
    expect(rampColour(7)).toEqual(rampColour(1));
  });

  test('position on the log bar; a point on the wire is at the top', () => {
    const s = { logMin: -7, logMax: -4 };
    expect(scalePosition(1e-7, s)).toBeCloseTo(0, 12);
    expect(scalePosition(1e-4, s)).toBeCloseTo(1, 12);
    expect(scalePosition(Infinity, s)).toBe(1);
    expect(scalePosition(0, s)).toBe(0);
  });

  test('pixels: the image puts the largest z on top, the texture the smallest first', () => {
    // 2 x 2 grid: bottom row (j = 0) dark, top row (j = 1) light
    const values = [1e-7, 1e-7, 1e-4, 1e-4];
    const s = { logMin: -7, logMax: -4 };
    const image = fieldPixels(values, 2, s, true);
    const texture = fieldPixels(values, 2, s, false);
    expect(Array.from(image.slice(0, 3))).toEqual(rampColour(1));
    expect(Array.from(texture.slice(0, 3))).toEqual(rampColour(0));
    expect(image[3]).toBe(255);
  });
});
