/**
 * The cautions a person acknowledges before logging the first reading on a plan. The stored
 * acknowledgement names BENCH_CAUTIONS_VERSION, so changing the wording below (bump the version) asks
 * everyone again. The text defers every decision to the institution's rules, local codes and
 * qualified, licensed staff; it never calls a setup acceptable. Pure: the server and the UI share it.
 */

export const BENCH_CAUTIONS_VERSION = '2026-12-a';

export interface BenchCaution {
  id: 'capacitor-voltage' | 'operator-field' | 'stray-metal' | 'implants';
  title: string;
  text: string;
}

export const BENCH_CAUTIONS: readonly BenchCaution[] = [
  {
    id: 'capacitor-voltage',
    title: 'High voltage on resonant capacitors',
    text:
      'At resonance the capacitor voltage is the current times its reactance, easily hundreds of volts, and tank capacitors keep ' +
      'their charge after the source is off. Use rated parts and insulated probes, and discharge the tanks before touching them.',
  },
  {
    id: 'operator-field',
    title: 'Magnetic field at the operator position',
    text:
      'The field near the coils can exceed published reference levels for the frequency. Keep to the positions your exposure ' +
      'assessment allows and do not lean over energised coils.',
  },
  {
    id: 'stray-metal',
    title: 'Hot stray metal',
    text: 'Rings, watches, coins, tools and fixtures heat up in the field. Remove them from the bench before powering it.',
  },
  {
    id: 'implants',
    title: 'Implanted medical devices',
    text:
      'The field can affect pacemakers, defibrillators, neurostimulators and other implants. People with an implant should not ' +
      'work at or near the energised bench without medical and safety advice.',
  },
];

export const BENCH_CAUTIONS_DEFERRAL =
  'These reminders do not replace your institution\u2019s safety rules, local codes or the approval of qualified, licensed staff, ' +
  'who decide whether and how this bench may be powered.';
