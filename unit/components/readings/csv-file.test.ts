import { csvHeaders, mappableFields, methodsInColumn } from '../../../src/components/readings/csv-file';
import { issueProblems } from '../../../src/components/readings/csv-import-report';

describe('reading a chosen CSV in the browser', () => {
  it('takes the first non-empty row as the header, trimmed and without a byte-order mark', () => {
    expect(csvHeaders('\uFEFF\n\n seq , V2_mV ,method\n1,2,open_circuit\n')).toEqual(['seq', 'V2_mV', 'method']);
    expect(csvHeaders('')).toEqual([]);
  });

  it('lists the methods a method column names, in the app’s order, ignoring what it cannot read', () => {
    const text = 'seq,method\n1,Direct power\n2,open_circuit\n3,nonsense\n4,DIRECT_POWER\n';
    expect(methodsInColumn(text, 'method')).toEqual(['open_circuit', 'direct_power']);
    expect(methodsInColumn(text, 'missing')).toEqual([]);
  });

  it('offers the inputs of the file’s methods, labelled by the first of them, required where any needs it', () => {
    const fields = mappableFields(['direct_power', 'open_circuit']);
    expect(fields.map((f) => f.key)).toEqual(['frequency', 'txVoltage', 'txCurrent', 'rxVoltage', 'phaseDeg', 'txSelfInductance', 'rxSelfInductance', 'inputPower', 'outputPower', 'txPhaseDeg', 'rxCurrent', 'rxPhaseDeg']);
    expect(fields.find((f) => f.key === 'rxVoltage')).toEqual({ key: 'rxVoltage', kind: 'voltage', label: 'V2, load voltage', required: true });
    expect(mappableFields(['direct_power']).find((f) => f.key === 'rxVoltage')?.required).toBe(false);
    expect(mappableFields([])).toHaveLength(24);
  });

  it('turns a refused import’s issues back into lines of the file', () => {
    expect(issueProblems([{ path: 'rows.17.raw.rxVoltage', message: 'Bad.' }, { path: 'csv', message: 'Empty.' }])).toEqual([
      { line: 17, seq: null, where: 'raw.rxVoltage', message: 'Bad.' },
      { line: null, seq: null, where: 'csv', message: 'Empty.' },
    ]);
  });
});
