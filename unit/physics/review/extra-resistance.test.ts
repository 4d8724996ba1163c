/**
 * Efficiency with an extra receiver resistance (src/physics/review/extra-resistance.ts), against the
 * series-series closed form and fitted back with fitOneParameter.
 */
import { solveLink, tuningCapacitance, type LinkParameters } from '../../../src/physics/link-circuit';
import { efficiencyWithExtraReceiverResistance } from '../../../src/physics/review/extra-resistance';
import { fitOneParameter } from '../../../src/physics/review/least-squares';

const relErr = (x: number, ref: number) => Math.abs(x - ref) / Math.abs(ref);
/** Closed form and phasor solution differ by rounding only. */
const CLOSED_FORM_TOL = 1e-12;
/** Exact synthetic data: the fit is limited by its convergence test. */
const FIT_RECOVERY_TOL = 1e-7;

const f = 6.78e6;
const w = 2 * Math.PI * f;
const L1 = 12e-6;
const L2 = 8e-6;
const link = (M: number): LinkParameters => ({
  frequencyHz: f, topology: 'SS', L1, L2, M, R1: 0.4, R2: 0.6,
  C1: tuningCapacitance(L1, f), C2: tuningCapacitance(L2, f),
  // a source resistance that would change the answer if it were counted
  sourceVoltage: 5, sourceResistance: 2, loadResistance: 10,
});

/**
 * SS at resonance: Z22 = R2 + RL, reflected (wM)^2 / (R2 + RL), so
 * eta = (wM)^2 RL / ((R2 + RL) ((R2 + RL) R1 + (wM)^2)) at the transmitter terminals
 * (C.-S. Wang, G. A. Covic, O. H. Stielau, IEEE Trans. Ind. Electron. 51(1), 2004).
 */
const closedForm = (p: LinkParameters, R2: number) => {
  const X2 = (w * p.M) ** 2;
  const RL = p.loadResistance;
  return (X2 * RL) / ((R2 + RL) * ((R2 + RL) * p.R1 + X2));
};

describe('efficiencyWithExtraReceiverResistance', () => {
  test.each([[0, 0.03], [0.35, 0.03], [1.2, 0.1], [0.35, 0.25]])('extra %p ohm, k %p: SS closed form with R2 + extra (Wang, Covic & Stielau 2004)', (extra, k) => {
    const p = link(k * Math.sqrt(L1 * L2));
    expect(relErr(efficiencyWithExtraReceiverResistance(p, extra), closedForm(p, p.R2 + extra))).toBeLessThan(CLOSED_FORM_TOL);
  });
  test('extra 0 is the plain link; more loss means less efficiency', () => {
    const p = link(0.05 * Math.sqrt(L1 * L2));
    expect(efficiencyWithExtraReceiverResistance(p, 0)).toBe(solveLink(p).efficiency);
    expect(efficiencyWithExtraReceiverResistance(p, 0.5)).toBeLessThan(efficiencyWithExtraReceiverResistance(p, 0.1));
  });
  test('non-finite extra, or one that makes R2 negative, throws RangeError', () => {
    const p = link(1e-6);
    expect(() => efficiencyWithExtraReceiverResistance(p, NaN)).toThrow(RangeError);
    expect(() => efficiencyWithExtraReceiverResistance(p, -0.7)).toThrow(RangeError);
  });
  test('synthetic efficiencies made with 0.35 ohm extra fit back to 0.35 ohm', async () => {
    const Ms = [0.02, 0.05, 0.1, 0.15, 0.2, 0.3].map((k) => k * Math.sqrt(L1 * L2));
    const fit = await fitOneParameter({
      evaluate: async (extra) => Ms.map((M) => efficiencyWithExtraReceiverResistance(link(M), extra)),
      measured: Ms.map((M) => efficiencyWithExtraReceiverResistance(link(M), 0.35)),
      uncertainties: Ms.map(() => 0.002), start: 0, step: 0.01, lower: 0, upper: 5,
    });
    expect(relErr(fit.value, 0.35)).toBeLessThan(FIT_RECOVERY_TOL);
    expect(fit.converged).toBe(true);
    expect(fit.atBound).toBe(false);
  });
});
