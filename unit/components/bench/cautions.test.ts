import { CAPACITOR_VOLTAGE_CAUTION_V, raisedCautions } from '@/components/bench/cautions';

const none = { txCapacitorVoltage: null, rxCapacitorVoltage: null, operatorRatio: null, noApplicableLevel: false };

describe('cautions the bench raises', () => {
  test('nothing known, nothing raised (the standing caution is always shown by the panel)', () => {
    expect(raisedCautions(none)).toEqual([]);
  });

  test('capacitor voltage above the threshold on either side', () => {
    expect(raisedCautions({ ...none, txCapacitorVoltage: CAPACITOR_VOLTAGE_CAUTION_V })).toEqual([]);
    expect(raisedCautions({ ...none, txCapacitorVoltage: CAPACITOR_VOLTAGE_CAUTION_V + 0.1 })).toEqual(['capacitor-voltage']);
    expect(raisedCautions({ ...none, rxCapacitorVoltage: 400 })).toEqual(['capacitor-voltage']);
  });

  test('field at or above the reference level, and a frequency no level covers', () => {
    expect(raisedCautions({ ...none, operatorRatio: 0.99 })).toEqual([]);
    expect(raisedCautions({ ...none, operatorRatio: 1 })).toEqual(['field-ratio']);
    expect(raisedCautions({ ...none, noApplicableLevel: true })).toEqual(['field-unassessed']);
  });
});
