/**
 * The direct-power method's efficiency: eta = Pout / Pin from two power meters when both are given,
 * else from the real power P = V I cos(phi) of rms phasors at each port.
 */
import { METHOD_SPECS } from './methods';
import { ReadingInputError } from './types';
import type { FieldReader } from './read-fields';
import type { MeasurementInputs } from './uncertainty';

const DEG = Math.PI / 180;

/** eta = Pout / Pin from the two powers when both are given, else from P = V I cos(phase) at each port. */
export function directPowerPlan(read: FieldReader): { inputs: MeasurementInputs; efficiency: (x: MeasurementInputs) => number } {
  const inputPower = read.optional('inputPower');
  const outputPower = read.optional('outputPower');
  if (inputPower !== undefined && outputPower !== undefined) {
    if (!(inputPower > 0)) throw new ReadingInputError('inputPower', `${read.label('inputPower')} must be above zero: \u03b7 = Pout / Pin divides by it (got ${inputPower}).`);
    if (outputPower < 0) throw new ReadingInputError('outputPower', `${read.label('outputPower')} must not be negative (got ${outputPower}).`);
    return { inputs: { inputPower, outputPower }, efficiency: (x) => x.outputPower / x.inputPower };
  }
  const group = METHOD_SPECS.direct_power.alternatives?.[1] ?? [];
  const missing = group.find((key) => read.optional(key) === undefined);
  if (missing) {
    const field = group.some((key) => read.optional(key) !== undefined) ? missing : inputPower === undefined ? 'inputPower' : 'outputPower';
    throw new ReadingInputError(field, 'Direct power needs both powers (Pin and Pout), or the voltage and current at both ports.');
  }
  const inputs: MeasurementInputs = {
    txVoltage: read.nonNegative('txVoltage'),
    txCurrent: read.nonNegative('txCurrent'),
    rxVoltage: read.nonNegative('rxVoltage'),
    rxCurrent: read.nonNegative('rxCurrent'),
  };
  // An empty phase is in phase (0 degrees) and, not having been read, carries no uncertainty.
  const txPhase = read.optional('txPhaseDeg');
  const rxPhase = read.optional('rxPhaseDeg');
  if (txPhase !== undefined) inputs.txPhaseDeg = txPhase;
  if (rxPhase !== undefined) inputs.rxPhaseDeg = rxPhase;
  for (const key of ['txVoltage', 'txCurrent'] as const) {
    if (inputs[key] === 0) throw new ReadingInputError(key, `${read.label(key)} must not be zero: Pin = V1 I1 cos \u03c6 is the divisor of \u03b7.`);
  }
  // Compare angles, not cosines: cos 90 degrees is 6e-17 in floating point, not zero.
  if (Math.abs(wrapDegrees(txPhase ?? 0)) >= 90) {
    throw new ReadingInputError('txPhaseDeg', `At ${txPhase}\u00b0 between V1 and I1 no real power flows into the transmitter (cos \u03c6 \u2264 0).`);
  }
  if (Math.abs(wrapDegrees(rxPhase ?? 0)) > 90) {
    throw new ReadingInputError('rxPhaseDeg', `At ${rxPhase}\u00b0 between V2 and I2 the load would deliver power (cos \u03c6 < 0).`);
  }
  const power = (v: number, i: number, phaseDeg: number | undefined) => v * i * Math.cos((phaseDeg ?? 0) * DEG);
  const efficiency = (x: MeasurementInputs) => power(x.rxVoltage, x.rxCurrent, x.rxPhaseDeg) / power(x.txVoltage, x.txCurrent, x.txPhaseDeg);
  return { inputs, efficiency };
}

/** The angle in (-180, 180] degrees. */
const wrapDegrees = (deg: number) => 180 - ((((180 - deg) % 360) + 360) % 360);
