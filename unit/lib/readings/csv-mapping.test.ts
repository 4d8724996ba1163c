import { guessMapping, MAX_IMPORT_ROWS, parseReadingsCsv, type CsvColumnMap } from '../../../src/lib/readings/csv-mapping';
import { csvColumnMapSchema, type CsvColumnMapInput } from '../../../src/lib/validations/reading-import';

const mapping = (over: Partial<CsvColumnMapInput> = {}): CsvColumnMap =>
  csvColumnMapSchema.parse({
    seqColumn: 'seq',
    method: 'open_circuit',
    fields: { frequency: { column: 'f', unit: 'MHz' }, txCurrent: { column: 'I1', unit: 'mA' }, rxVoltage: { column: 'V2', unit: 'mV' } },
    ...over,
  });

const OPEN_CIRCUIT_HEADER = 'seq,f,I1,V2';
const rowsOf = (text: string, map = mapping()) => parseReadingsCsv(text, map).rows;

describe('guessMapping', () => {
  it('reads the quantity and the unit from header names as people write them', () => {
    const headers = ['Seq', 'Repeat', 'Method', 'f (kHz)', 'I1_mA', 'V2', 'L1 [uH]', 'Pout / mW', 'temperature_C', 'Notes'];
    expect(guessMapping(headers)).toEqual({
      seqColumn: 'Seq',
      repeatColumn: 'Repeat',
      method: null,
      methodColumn: 'Method',
      fields: {
        frequency: { column: 'f (kHz)', unit: 'kHz' },
        txCurrent: { column: 'I1_mA', unit: 'mA' },
        rxVoltage: { column: 'V2', unit: 'V' },
        txSelfInductance: { column: 'L1 [uH]', unit: 'uH' },
        outputPower: { column: 'Pout / mW', unit: 'mW' },
      },
      circumstances: { instrument: null, calibration: null, temperatureC: 'temperature_C', setupNotes: 'Notes', accuracy: { relative: 0.001, phaseDeg: 0.5 } },
    });
  });

  it('matches names without case or punctuation, and skips a name whose unit is of another quantity', () => {
    const guess = guessMapping(['point', 'RX_VOLTAGE_mV', 'tx current (A)', 'V1 (uH)', 'phase_deg']);
    expect(guess.seqColumn).toBe('point');
    expect(guess.fields).toEqual({
      rxVoltage: { column: 'RX_VOLTAGE_mV', unit: 'mV' },
      txCurrent: { column: 'tx current (A)', unit: 'A' },
      phaseDeg: { column: 'phase_deg', unit: 'deg' },
    });
  });

  it('never takes the run sheet’s planned or predicted columns for measured values', () => {
    const runSheet = ['seq', 'repeat', 'is_reference', 'distance_m', 'tilt_deg', 'frequency_Hz', 'mutual_inductance_H', 'tx_self_inductance_H', 'rx_self_inductance_H', 'load_power_W'];
    const guess = guessMapping([...runSheet, 'V2_mV', 'I1_mA']);
    expect(guess.seqColumn).toBe('seq');
    expect(guess.repeatColumn).toBe('repeat');
    expect(guess.fields).toEqual({ rxVoltage: { column: 'V2_mV', unit: 'mV' }, txCurrent: { column: 'I1_mA', unit: 'mA' } });
  });

  it('uses the remembered mapping where the file has its columns, and guesses the rest', () => {
    const remembered = mapping({
      seqColumn: 'Point no.',
      method: 'open_circuit',
      fields: { rxVoltage: { column: 'Vout', unit: 'mV' }, txCurrent: { column: 'Idrive', unit: 'mA' } },
      circumstances: { instrument: 'Kit', accuracy: { relative: 0.01, phaseDeg: 2 } },
    });
    const guess = guessMapping(['Point no.', 'seq', 'Vout', 'I1 (A)', 'V2'], remembered);
    expect(guess).toMatchObject({ seqColumn: 'Point no.', method: 'open_circuit', methodColumn: null });
    // Vout stays the remembered V2 column, so the file's own "V2" column is not taken for it
    expect(guess.fields).toEqual({ rxVoltage: { column: 'Vout', unit: 'mV' }, txCurrent: { column: 'I1 (A)', unit: 'A' } });
    expect(guess.circumstances).toEqual({ instrument: null, calibration: null, temperatureC: null, setupNotes: null, accuracy: { relative: 0.01, phaseDeg: 2 } });
  });

  it('leaves the seq column empty when nothing fits', () => {
    expect(guessMapping(['a', 'b']).seqColumn).toBe('');
  });
});

describe('parseReadingsCsv units', () => {
  it('reads a bare number in the column’s unit and a value with its own unit in that unit', () => {
    const [bare, own] = rowsOf(`${OPEN_CIRCUIT_HEADER}\n1,6.78,250,1200\n2,6780 kHz,0.3 A,1.5 V\n`);
    expect(bare.problems).toEqual([]);
    expect(bare.input?.raw).toEqual({ frequency: 6.78e6, txCurrent: 0.25, rxVoltage: 1.2 });
    expect(own.input?.raw).toEqual({ frequency: 6.78e6, txCurrent: 0.3, rxVoltage: 1.5 });
  });

  it('reports a value of another quantity, a decimal comma and a unit alone at the cell’s field and column', () => {
    const [kg, comma, unitOnly] = rowsOf(`${OPEN_CIRCUIT_HEADER}\n1,6.78,250,12 kg\n2,6.78,"250,5",1200\n3,MHz,250,1200\n`);
    expect(kg.input).toBeNull();
    expect(kg.problems).toEqual([{ field: 'raw.rxVoltage', column: 'V2', message: expect.stringContaining('"12 kg" is not a voltage') }]);
    expect(comma.problems).toEqual([{ field: 'raw.txCurrent', column: 'I1', message: expect.stringContaining('decimal separator as a point') }]);
    expect(unitOnly.problems.map((p) => p.field)).toEqual(['raw.frequency']);
  });

  it('reports missing required values and leaves empty optional ones out', () => {
    const map = mapping({ fields: { ...mapping().fields, phaseDeg: { column: 'phase', unit: 'deg' } } });
    const [missing, optionalEmpty] = rowsOf('seq,f,I1,V2,phase\n1,6.78,,1200,\n2,6.78,250,1200,\n', map);
    expect(missing.problems).toEqual([{ field: 'raw.txCurrent', column: 'I1', message: 'Enter I1, transmitter current.' }]);
    expect(optionalEmpty.problems).toEqual([]);
    expect(optionalEmpty.input?.raw).toEqual({ frequency: 6.78e6, txCurrent: 0.25, rxVoltage: 1.2 });
  });

  it('reports values out of range with the bounds of the reading schema', () => {
    const map = mapping({ fields: { ...mapping().fields, phaseDeg: { column: 'phase', unit: 'deg' } } });
    const [row] = rowsOf('seq,f,I1,V2,phase\n1,6.78,250,1200,200\n', map);
    expect(row.problems).toEqual([{ field: 'raw.phaseDeg', column: 'phase', message: expect.stringContaining('from \u2212180\u00b0 to 180\u00b0') }]);
  });

  it('asks for one complete set of direct-power inputs: both powers or V and I at both ports', () => {
    const map = mapping({ method: 'direct_power', fields: { inputPower: { column: 'Pin', unit: 'W' }, outputPower: { column: 'Pout', unit: 'W' } } });
    const [complete, half] = rowsOf('seq,Pin,Pout\n1,1.2,0.9\n2,,0.9\n', map);
    expect(complete.input?.raw).toEqual({ inputPower: 1.2, outputPower: 0.9 });
    expect(half.problems).toEqual([{ field: 'raw.inputPower', column: 'Pin', message: expect.stringMatching(/^Enter either Pin/) }]);
  });

  it('names a shared column’s input as each row’s method labels it', () => {
    const map = mapping({ method: null, methodColumn: 'method', fields: { ...mapping().fields, rxCurrent: { column: 'I2', unit: 'A' }, txVoltage: { column: 'V1', unit: 'V' } } });
    const [openCircuit, directPower] = rowsOf('seq,method,f,I1,V2,V1,I2\n1,open_circuit,6.78,250,1 kg,,\n1,direct_power,,250,1 kg,5,0.1\n', map);
    expect(openCircuit.problems.map((p) => p.message)).toEqual([expect.stringMatching(/^V2, receiver open-circuit voltage: "1 kg"/)]);
    expect(directPower.problems.map((p) => p.message)).toEqual([expect.stringMatching(/^V2, load voltage: "1 kg"/)]);
  });

  it('reports a required input without a column once for the file, not on every row', () => {
    const parsed = parseReadingsCsv('seq,f,I1\n1,6.78,250\n2,6.78,250\n', mapping({ fields: { frequency: { column: 'f', unit: 'MHz' }, txCurrent: { column: 'I1', unit: 'mA' } } }));
    expect(parsed.fileProblems).toEqual([{ field: 'mapping.fields.rxVoltage.column', column: null, message: expect.stringContaining('Choose the column of V2') }]);
    expect(parsed.rows.flatMap((r) => r.problems)).toEqual([]);
  });
});

describe('parseReadingsCsv rows', () => {
  const methodMap = () =>
    mapping({
      method: null,
      methodColumn: 'method',
      fields: { ...mapping().fields, inputPower: { column: 'Pin', unit: 'W' }, outputPower: { column: 'Pout', unit: 'W' } },
    });

  it('takes each row’s method from the method column, by id or by name in any case', () => {
    const text = 'seq,method,f,I1,V2,Pin,Pout\n1,OPEN_CIRCUIT,6.78,250,1200,,\n1,direct power,,,,1.2,0.9\n2,Open-circuit voltage,6.78,250,1300,,\n3,magic,6.78,250,1,,\n4,,6.78,250,1,,\n';
    const rows = rowsOf(text, methodMap());
    expect(rows.map((r) => r.method)).toEqual(['open_circuit', 'direct_power', 'open_circuit', null, null]);
    expect(rows[1].input?.raw).toEqual({ inputPower: 1.2, outputPower: 0.9 });
    expect(rows[3].problems).toEqual([{ field: 'method', column: 'method', message: expect.stringContaining('“magic” is not a measurement method') }]);
    expect(rows[4].problems.map((p) => p.field)).toEqual(['method']);
  });

  it('reports a seq or repeat that is not a whole number, and leaves an empty repeat unchecked', () => {
    const map = mapping({ repeatColumn: 'repeat' });
    const rows = rowsOf('seq,repeat,f,I1,V2\n,1,6.78,250,1200\n2.5,1,6.78,250,1200\n3,,6.78,250,1200\n4,two,6.78,250,1200\n', map);
    expect(rows.map((r) => r.problems.map((p) => p.field))).toEqual([['seq'], ['seq'], [], ['repeat']]);
    expect(rows.map((r) => [r.seq, r.repeat])).toEqual([[null, 1], [null, 1], [3, null], [4, null]]);
  });

  it('numbers rows by the file’s lines, counting the header, empty lines and line breaks inside quotes', () => {
    const map = mapping({ circumstances: { setupNotes: 'notes' } });
    const rows = rowsOf('\uFEFFseq,f,I1,V2,notes\n\n1,6.78,250,1200,"fixture\nleaning"\n\r\n2,6.78,250,1200,\n', map);
    expect(rows.map((r) => r.line)).toEqual([3, 6]);
    expect(rows[0].input?.setupNotes).toBe('fixture\nleaning');
  });

  it('reads instrument, calibration and temperature, with the file’s accuracy on every row', () => {
    const map = mapping({
      circumstances: { instrument: 'kit', calibration: 'cal', temperatureC: 'T', accuracy: { relative: 0.005, phaseDeg: 1 } },
    });
    const rows = rowsOf('seq,f,I1,V2,kit,cal,T\n1,6.78,250,1200,Scope B,in date,21.5 °C\n2,6.78,250,1200,,maybe,warm\n', map);
    expect(rows[0].input).toMatchObject({ instrument: 'Scope B', calibration: 'in_date', temperatureC: 21.5, accuracy: { relative: 0.005, phaseDeg: 1 } });
    expect(rows[1].problems.map((p) => [p.field, p.column])).toEqual([['calibration', 'cal'], ['temperatureC', 'T']]);
  });
});

describe('parseReadingsCsv files', () => {
  it('reports an empty file and a file without data rows', () => {
    expect(parseReadingsCsv('\n\n', mapping()).fileProblems).toEqual([{ field: 'csv', column: null, message: expect.stringContaining('The file is empty') }]);
    expect(parseReadingsCsv(`${OPEN_CIRCUIT_HEADER}\n\n`, mapping()).fileProblems).toEqual([{ field: 'csv', column: null, message: 'The file has a header but no data rows.' }]);
  });

  it('stops at a mapped column the file does not have', () => {
    const parsed = parseReadingsCsv('seq,f,I1\n1,6.78,250\n', mapping());
    expect(parsed.rows).toEqual([]);
    expect(parsed.fileProblems).toEqual([{ field: 'mapping.fields.rxVoltage.column', column: 'V2', message: 'The file has no column “V2”; choose another column.' }]);
  });

  it(`refuses more than ${MAX_IMPORT_ROWS} data rows`, () => {
    const text = `${OPEN_CIRCUIT_HEADER}\n${'1,6.78,250,1200\n'.repeat(MAX_IMPORT_ROWS + 1)}`;
    const parsed = parseReadingsCsv(text, mapping());
    expect(parsed.rows).toHaveLength(MAX_IMPORT_ROWS);
    expect(parsed.fileProblems).toEqual([{ field: 'csv', column: null, message: expect.stringContaining('more than 20,000 rows') }]);
  });
});
