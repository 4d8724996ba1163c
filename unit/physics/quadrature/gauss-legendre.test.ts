/**
 * Gauss-Legendre rule (src/physics/quadrature/gauss-legendre.ts).
 */
import { gaussLegendre } from '../../../src/physics/quadrature/gauss-legendre';

describe('Gauss-Legendre (Abramowitz & Stegun 25.4.29, table 25.4)', () => {
  test('n = 2: nodes +-1/sqrt(3), weights 1; n = 3: 0, +-sqrt(3/5), weights 8/9, 5/9', () => {
    const two = gaussLegendre(2);
    expect(two.nodes[1]).toBeCloseTo(1 / Math.sqrt(3), 15);
    expect(two.weights[0]).toBeCloseTo(1, 15);
    const three = gaussLegendre(3);
    expect(three.nodes[2]).toBeCloseTo(Math.sqrt(0.6), 15);
    expect(three.weights[1]).toBeCloseTo(8 / 9, 15);
    expect(three.weights[0]).toBeCloseTo(5 / 9, 15);
  });
  test.each([1, 4, 7, 16, 64, 200])('n = %p integrates x^k exactly for k <= 2n - 1', (n) => {
    const { nodes, weights } = gaussLegendre(n);
    for (let k = 0; k <= Math.min(2 * n - 1, 60); k++) {
      let s = 0;
      for (let i = 0; i < n; i++) s += weights[i] * nodes[i] ** k;
      const exact = k % 2 === 1 ? 0 : 2 / (k + 1);
      expect(Math.abs(s - exact)).toBeLessThan(1e-13);
    }
  });
  test('rejects orders outside 1..1024', () => {
    expect(() => gaussLegendre(0)).toThrow(RangeError);
    expect(() => gaussLegendre(2.5)).toThrow(RangeError);
  });
});
