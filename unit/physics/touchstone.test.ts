/**
 * Touchstone version 1 .s2p files (src/physics/touchstone.ts). The test files are written here from a
 * known Z-matrix, converted to S with mathjs complex matrices, S = (Z - Z0 I)(Z + Z0 I)^-1 (D. M. Pozar,
 * Microwave Engineering, 4th ed., sec. 4.3), independently of the parser's own S -> Z algebra.
 * Syntax per the Touchstone File Format Specification 2.0 (IBIS), which defines version 1.0 files too.
 */
import { add, complex, identity, inv, matrix, multiply, subtract, type Complex as MathComplex, type Matrix } from 'mathjs';
import { deriveReading } from '../../src/physics/measurement/derive';
import {
  MAX_TOUCHSTONE_POINTS,
  TouchstoneError,
  parseTouchstone,
  twoPortRawFromTouchstone,
  zParametersAt,
} from '../../src/physics/touchstone';
import type { Complex } from '../../src/physics/complex';

/** Writing 17 significant digits and converting MA / DB back loses a few ulps; the S -> Z inversion
 * is well conditioned for these coils at 50 ohm. */
const ROUND_TRIP_TOL = 1e-9;

// Two coupled coils as a series-coupled-inductor network: Z11 = R1 + j w L1, Z21 = Z12 = j w M, Z22 = R2 + j w L2.
const R1 = 0.5;
const R2 = 0.7;
const L1 = 10e-6;
const L2 = 12e-6;
const M = 0.6e-6;
const FREQS = [1e6, 6.78e6, 13.56e6];

type C = MathComplex;
/**
 * The coupled coils, or (reciprocal = false) the same with Z12 made different from Z21 so that a swap of
 * N21 and N12 anywhere in the parser shows.
 */
const zMatrix = (f: number, reciprocal = true): Matrix => {
  const w = 2 * Math.PI * f;
  return matrix([
    [complex(R1, w * L1), reciprocal ? complex(0, w * M) : complex(0.3, 0.8 * w * M)],
    [complex(0, w * M), complex(R2, w * L2)],
  ]);
};
const sMatrix = (f: number, z0: number, reciprocal = false): Matrix => {
  const z = zMatrix(f, reciprocal);
  const z0I = multiply(z0, identity(2)) as Matrix;
  return multiply(subtract(z, z0I), inv(add(z, z0I) as Matrix)) as Matrix;
};
const entry = (m: Matrix, i: number, j: number): C => complex(m.get([i, j]) as C);

type Format = 'MA' | 'DB' | 'RI';
const pairText = (c: C, format: Format): string => {
  const magnitude = Math.hypot(c.re, c.im);
  const angle = (Math.atan2(c.im, c.re) * 180) / Math.PI;
  if (format === 'RI') return `${c.re} ${c.im}`;
  if (format === 'MA') return `${magnitude} ${angle}`;
  return `${20 * Math.log10(magnitude)} ${angle}`;
};
const UNIT_SCALE: Record<string, number> = { Hz: 1, kHz: 1e3, MHz: 1e6, GHz: 1e9 };

/** A .s2p text; `values(f)` gives the matrix to write, in the 2-port order N11 N21 N12 N22. */
function s2p(unit: string, parameter: string, format: Format, r: number, values: (f: number) => Matrix): string {
  const lines = ['! written by the test', `# ${unit} ${parameter} ${format} R ${r}`];
  for (const f of FREQS) {
    const m = values(f);
    const pairs = [entry(m, 0, 0), entry(m, 1, 0), entry(m, 0, 1), entry(m, 1, 1)].map((c) => pairText(c, format));
    lines.push(`${f / UNIT_SCALE[unit]} ${pairs.join(' ')}`);
  }
  return lines.join('\n') + '\n';
}

function expectZ(actual: Complex, expected: C, scale: number) {
  expect(Math.hypot(actual.re - expected.re, actual.im - expected.im) / scale).toBeLessThan(ROUND_TRIP_TOL);
}
function expectNetwork(text: string, f = 6.78e6) {
  const z = zParametersAt(parseTouchstone(text), f);
  const ref = zMatrix(f, false);
  const scale = Math.hypot(...[0, 1].flatMap((i) => [0, 1].map((j) => Math.hypot(entry(ref, i, j).re, entry(ref, i, j).im))));
  expectZ(z.z11, entry(ref, 0, 0), scale);
  expectZ(z.z21, entry(ref, 1, 0), scale);
  expectZ(z.z12, entry(ref, 0, 1), scale);
  expectZ(z.z22, entry(ref, 1, 1), scale);
  return z;
}

describe('the same network in every format and unit parses to the same Z (S = (Z - Z0)(Z + Z0)^-1 by mathjs)', () => {
  const cases: [string, Format][] = [];
  for (const unit of ['Hz', 'kHz', 'MHz', 'GHz']) for (const format of ['MA', 'DB', 'RI'] as Format[]) cases.push([unit, format]);
  test.each(cases)('S-parameters, %s, %s', (unit, format) => {
    const z = expectNetwork(s2p(unit, 'S', format, 50, (f) => sMatrix(f, 50)));
    expect(Math.abs(z.frequency - 6.78e6) / 6.78e6).toBeLessThan(1e-15);
  });
  test('reference resistance 75 ohm', () => {
    expectNetwork(s2p('MHz', 'S', 'RI', 75, (f) => sMatrix(f, 75)));
  });
  test('Y-parameters, normalized to R in version 1 files (y = Y R)', () => {
    expectNetwork(s2p('MHz', 'Y', 'RI', 50, (f) => multiply(inv(zMatrix(f, false)), 50) as Matrix));
    expectNetwork(s2p('GHz', 'y', 'MA', 25, (f) => multiply(inv(zMatrix(f, false)), 25) as Matrix));
  });
  test('Z-parameters, normalized to R in version 1 files (z = Z / R)', () => {
    expectNetwork(s2p('kHz', 'Z', 'DB', 50, (f) => multiply(zMatrix(f, false), 1 / 50) as Matrix));
  });
  test('header fields are reported, the unit and format normalized in case', () => {
    const data = parseTouchstone(s2p('MHz', 'S', 'RI', 50, (f) => sMatrix(f, 50)).replace('# MHz S RI', '# mhz s ri'));
    expect(data).toMatchObject({ parameter: 'S', format: 'RI', frequencyUnit: 'MHz', referenceResistance: 50, hasNoiseData: false });
    expect(data.points.map((p) => p.frequency)).toEqual(FREQS);
  });
});

describe('series-coupled inductors recover M (Keysight Impedance Measurement Handbook: M = Im(Z21) / omega)', () => {
  test('through twoPortRawFromTouchstone and the two-port derivation', () => {
    const data = parseTouchstone(s2p('MHz', 'S', 'MA', 50, (f) => sMatrix(f, 50, true)));
    const raw = twoPortRawFromTouchstone(data, 6.78e6);
    expect(Object.keys(raw).sort()).toEqual(['frequency', 'z11Im', 'z11Re', 'z21Im', 'z21Re', 'z22Im', 'z22Re']);
    const d = deriveReading('two_port', raw, { relative: 0, phaseDeg: 0 }, { predicted: null });
    expect(Math.abs(d.mutualInductance!.value - M) / M).toBeLessThan(ROUND_TRIP_TOL);
    expect(Math.abs(d.coupling!.value - M / Math.sqrt(L1 * L2)) / (M / Math.sqrt(L1 * L2))).toBeLessThan(ROUND_TRIP_TOL);
  });
  test('the nearest data frequency is used and reported', () => {
    const data = parseTouchstone(s2p('MHz', 'S', 'RI', 50, (f) => sMatrix(f, 50)));
    const z = zParametersAt(data, 5e6);
    expect(z.frequency).toBe(6.78e6);
    expect(z.requestedFrequency).toBe(5e6);
    expect(zParametersAt(data, 1e12).frequency).toBe(13.56e6);
    expect(zParametersAt(data, 0).frequency).toBe(1e6);
    expect(twoPortRawFromTouchstone(data, 2e6).frequency).toBe(1e6);
  });
});

describe('file syntax', () => {
  const rows = (f: number) => {
    const m = sMatrix(f, 50);
    return [entry(m, 0, 0), entry(m, 1, 0), entry(m, 0, 1), entry(m, 1, 1)].map((c) => pairText(c, 'RI'));
  };
  test('comments anywhere, blank lines, CRLF endings and data wrapped over lines', () => {
    const text = [
      '! header comment',
      '',
      '# MHz S RI R 50 ! trailing comment',
      ...FREQS.flatMap((f) => {
        const p = rows(f);
        return [`  ${f / 1e6} ${p[0]} ! N11`, `   ${p[1]}`, `${p[2]} ${p[3]}`, '! between points'];
      }),
    ].join('\r\n');
    expectNetwork(text);
  });
  test('no option line: GHz, S, MA, R 50 by default', () => {
    const text = s2p('GHz', 'S', 'MA', 50, (f) => sMatrix(f, 50)).replace(/^#.*$/m, '');
    const data = parseTouchstone(text);
    expect(data).toMatchObject({ parameter: 'S', format: 'MA', frequencyUnit: 'GHz', referenceResistance: 50 });
    expectNetwork(text);
  });
  test('options in any order; a second option line is ignored', () => {
    const text = s2p('MHz', 'S', 'RI', 50, (f) => sMatrix(f, 50)).replace('# MHz S RI R 50', '# R 50 RI MHz\n# GHz Z MA R 1');
    expect(parseTouchstone(text)).toMatchObject({ format: 'RI', frequencyUnit: 'MHz', parameter: 'S' });
    expectNetwork(text);
  });
  test('2-port files order the pairs N11 N21 N12 N22 (special to 2-port files)', () => {
    const [p] = parseTouchstone('# Hz S RI\n1  0.11 0  0.21 0  0.12 0  0.22 0\n').points;
    expect([p.n11.re, p.n21.re, p.n12.re, p.n22.re]).toEqual([0.11, 0.21, 0.12, 0.22]);
  });
  test('2-port noise parameters after the network data are skipped', () => {
    const text = s2p('MHz', 'S', 'RI', 50, (f) => sMatrix(f, 50)) + '! noise\n1 0.5 0.3 20 0.2\n6.78 0.6 0.3 25 0.2\n';
    const data = parseTouchstone(text);
    expect(data.points).toHaveLength(3);
    expect(data.hasNoiseData).toBe(true);
  });
});

describe('bad files fail with TouchstoneError and the line at fault', () => {
  const good = s2p('MHz', 'S', 'RI', 50, (f) => sMatrix(f, 50));
  const lines = good.split('\n');
  function fault(text: string): TouchstoneError {
    try {
      parseTouchstone(text);
    } catch (error) {
      if (error instanceof TouchstoneError) return error;
      throw error;
    }
    throw new Error('parsed');
  }
  test.each<[string, string, number | null, RegExp]>([
    ['a word among the numbers', [...lines.slice(0, 3), lines[3].replace(/ \S+$/, ' abc')].join('\n'), 4, /"abc" is not a number/],
    ['decreasing frequency', [lines[0], lines[1], lines[3], lines[2]].join('\n'), 4, /must increase strictly/],
    ['a repeated frequency', [lines[0], lines[1], lines[2], lines[2]].join('\n'), 4, /not above the previous one/],
    ['an incomplete last point', [lines[0], lines[1], lines[2], '13.56 0.1 0.2 0.3'].join('\n'), 4, /incomplete: 4 of 9/],
    ['too many numbers', [lines[0], lines[1], `${lines[2]} 0.5`].join('\n'), 3, /has 10/],
    ['G-parameters', good.replace('# MHz S RI', '# MHz G RI'), 2, /G-parameters are not supported/],
    ['H-parameters', good.replace('# MHz S RI', '# MHz H RI'), 2, /H-parameters are not supported/],
    ['an unknown option', good.replace('# MHz S RI', '# THz S RI'), 2, /"THz" is not an option/],
    ['R without a value', good.replace('R 50', 'R'), 2, /reference resistance/],
    ['R of zero', good.replace('R 50', 'R 0'), 2, /above zero/],
    ['per-port R', good.replace('R 50', 'R 50 75'), 2, /Per-port/],
    ['a version 2 keyword', `[Version] 2.0\n${good}`, 1, /version 2 keyword/],
    ['an option line after the data', `${good}# MHz S RI R 50\n`, 6, /before the data/],
    ['a negative MA magnitude', `# MHz S MA\n1 -0.5 0 1 0 1 0 1 0\n`, 2, /magnitude -0.5 is negative/],
    ['a negative frequency', `# MHz S RI\n-1 0 0 0 0 0 0 0 0\n`, 2, /negative/],
    ['no data', '! nothing\n# MHz S RI R 50\n', null, /no data points/],
  ])('%s', (_, text, line, message) => {
    const error = fault(text);
    expect(error.line).toBe(line);
    expect(error.message).toMatch(message);
    if (line !== null) expect(error.message).toMatch(new RegExp(`^Line ${line}: `));
  });
  test('I - S singular (both ports open, S = I): no Z-parameters', () => {
    const data = parseTouchstone('# MHz S RI R 50\n1 1 0 0 0 0 0 1 0\n');
    expect(() => zParametersAt(data, 1e6)).toThrow(/I \u2212 S is singular at 1000000 Hz/);
  });
  test('a series element alone, Y = [[y, -y], [-y, y]], is singular: no Z-parameters', () => {
    const data = parseTouchstone('# MHz Y RI R 50\n1 1 0 -1 0 -1 0 1 0\n');
    expect(() => zParametersAt(data, 1e6)).toThrow(/Y-matrix at 1000000 Hz is singular/);
  });
  test(`more than ${MAX_TOUCHSTONE_POINTS} frequency points are refused`, () => {
    const text = '# Hz S RI\n' + Array.from({ length: MAX_TOUCHSTONE_POINTS + 1 }, (_, i) => `${i + 1} 0 0 0 0 0 0 0 0`).join('\n');
    const error = fault(text);
    expect(error.line).toBe(MAX_TOUCHSTONE_POINTS + 2);
    expect(error.message).toMatch(/More than 100000 frequency points/);
  });
});
