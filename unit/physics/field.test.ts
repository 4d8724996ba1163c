/**
 * Biot-Savart field (src/physics/field.ts) and the exposure table (src/physics/exposure-limits.ts).
 */
import { cx } from '../../src/physics/complex';
import { assessExposure, DEFAULT_EXPOSURE_TABLE } from '../../src/physics/exposure-limits';
import { fieldPerAmpere, fluxDensityRms } from '../../src/physics/field';
import { helixPath } from '../../src/physics/geometry/helix';
import { loopPath } from '../../src/physics/geometry/loop';
import { IDENTITY_POSE, poseFromPlacement } from '../../src/physics/geometry/pose';

const MU0 = 4e-7 * Math.PI;
const relErr = (x: number, ref: number) => Math.abs(x - ref) / Math.abs(ref);
const FIELD_REL_TOL = 1e-9;

describe('Biot-Savart (Jackson, Classical Electrodynamics, 3rd ed., eq. 5.14)', () => {
  test('on the axis of a loop: B = mu0 I a^2 / (2 (a^2 + z^2)^(3/2)) (Jackson problem 5.1)', () => {
    const out = new Float64Array(3);
    for (const z of [0, 0.03, 0.2, 1.5]) {
      fieldPerAmpere(loopPath(0.1, 1e-3, IDENTITY_POSE), 0, 0, z, 1e-10, out);
      expect(relErr(out[2], (MU0 * 0.01) / (2 * (0.01 + z * z) ** 1.5))).toBeLessThan(FIELD_REL_TOL);
    }
  });
  test('inside a long solenoid B -> mu0 N I / l (Ampere) with the finite-length correction l / sqrt(l^2 + 4a^2)', () => {
    const out = new Float64Array(3);
    const a = 0.01, n = 400, l = 0.4;
    fieldPerAmpere(helixPath(a, n, l, 1e-4, IDENTITY_POSE), 0, 0, 0, 1e-8, out);
    // centre of a finite current sheet; a helix differs by O(pitch / a)^2 ripple on the axis
    expect(relErr(out[2], ((MU0 * n) / l) * (l / Math.sqrt(l * l + 4 * a * a)))).toBeLessThan(1e-4);
  });
  test('rms of two phasor currents: in phase add, in quadrature add in quadrature (no source needed)', () => {
    const tx = loopPath(0.1, 1e-3, IDENTITY_POSE);
    const rx = loopPath(0.1, 1e-3, poseFromPlacement({ distance: 0.2 }));
    const point = [0, 0, 0.1];
    const one = fluxDensityRms(point, [tx], [cx(1)])[0];
    expect(relErr(fluxDensityRms(point, [tx, rx], [cx(1), cx(1)])[0], 2 * one)).toBeLessThan(1e-9);
    expect(relErr(fluxDensityRms(point, [tx, rx], [cx(1), cx(0, 1)])[0], Math.SQRT2 * one)).toBeLessThan(1e-9);
  });
});

describe('exposure reference levels', () => {
  test('ICNIRP 2010, 3 kHz - 10 MHz: 27 uT general public, 100 uT occupational', () => {
    expect(assessExposure(1e-6, 50e3, 'general').limiting?.limitTesla).toBe(27e-6);
    expect(assessExposure(1e-6, 50e3, 'occupational').limiting?.limitTesla).toBe(100e-6);
  });
  test('ICNIRP 2020 (memory), whole body, general public H = 2.2 / f[MHz] A/m; limiting at 6.78 MHz', () => {
    const a = assessExposure(1e-7, 6.78e6, 'general');
    expect(a.limiting?.row.id).toBe('icnirp-2020-whole-body-general');
    expect(a.limiting?.row.memory).toBe(true);
    expect(relErr(a.limiting!.limitTesla, MU0 * (2.2 / 6.78))).toBeLessThan(1e-12);
    expect(relErr(a.limiting!.ratio, 1e-7 / (MU0 * (2.2 / 6.78)))).toBeLessThan(1e-12);
    expect(a.applicable.map((r) => r.row.version).sort()).toEqual(['2010', '2020', '2020']);
  });
  test('occupational 4.9 / f[MHz] A/m (memory); no row outside every band', () => {
    expect(relErr(assessExposure(1e-6, 1e6, 'occupational').applicable.find((r) => r.row.version === '2020')!.limitTesla, MU0 * 4.9)).toBeLessThan(1e-12);
    expect(assessExposure(1e-6, 1e3, 'general').limiting).toBeNull();
  });
  test('every row names its source and version', () => {
    for (const row of DEFAULT_EXPOSURE_TABLE) {
      expect(row.source).toMatch(/ICNIRP/);
      expect(row.version).toMatch(/^\d{4}$/);
    }
  });
});
