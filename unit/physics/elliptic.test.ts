/**
 * AGM elliptic integrals (src/physics/elliptic.ts) and the coaxial-loop formula built on them.
 */
import ellipe from '@stdlib/math-base-special-ellipe';
import ellipk from '@stdlib/math-base-special-ellipk';
import { coaxialLoopsMutual } from '../../src/physics/coaxial-loops';
import { ellipticKE } from '../../src/physics/elliptic';

const relErr = (x: number, ref: number) => Math.abs(x - ref) / Math.abs(ref);

describe('K(m), E(m) by the AGM (A&S 17.6) against @stdlib (parameter m = k^2)', () => {
  test.each([0, 1e-10, 0.01, 0.3, 0.5, 0.9, 0.999, 1 - 1e-9])('m = %p', (m) => {
    const { K, E } = ellipticKE(m);
    expect(relErr(K, ellipk(m))).toBeLessThan(1e-14);
    expect(relErr(E, ellipe(m))).toBeLessThan(1e-14);
  });
  test('K(1/2) = Gamma(1/4)^2 / (4 sqrt(pi)) = 1.8540746773013719 (DLMF 19.20.2)', () => {
    expect(relErr(ellipticKE(0.5).K, 1.8540746773013719)).toBeLessThan(1e-15);
  });
});

describe('coaxial circles in closed form (Maxwell art. 701; REFERENCES.md COMP rows)', () => {
  test.each([[0.1, 0.1, 0.1, 49.40784630798268], [0.2, 0.1, 0.1, 69.87324633639456], [0.05, 0.15, 0, 34.37310823323893], [0.1, 0.1, 1.0, 0.1916495325405899]])(
    'a=%p b=%p d=%p -> %p nH', (a, b, d, nH) => {
      // 1e-11: the far row loses digits to cancellation in (2/k - k) K - (2/k) E
      expect(relErr(coaxialLoopsMutual(a, b, d) * 1e9, nH)).toBeLessThan(1e-11);
    });
});
