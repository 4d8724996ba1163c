import { csvColumnMapSchema, readingImportSchema } from '../../../src/lib/validations/reading-import';

function pathsOf(result: { success: boolean; error?: { issues: { path: PropertyKey[] }[] } }): string[] {
  return result.success ? [] : (result.error?.issues ?? []).map((issue) => issue.path.join('.'));
}

const base = { seqColumn: 'seq', method: 'open_circuit', fields: { rxVoltage: { column: 'V2', unit: 'mV' } } };

describe('csvColumnMapSchema', () => {
  it('fills the optional columns and the default accuracy', () => {
    expect(csvColumnMapSchema.parse(base)).toEqual({
      ...base,
      repeatColumn: null,
      methodColumn: null,
      circumstances: { instrument: null, calibration: null, temperatureC: null, setupNotes: null, accuracy: { relative: 0.001, phaseDeg: 0.5 } },
    });
  });

  it('needs exactly one of a method for the file and a method column', () => {
    expect(pathsOf(csvColumnMapSchema.safeParse({ ...base, method: null }))).toEqual(['method']);
    expect(pathsOf(csvColumnMapSchema.safeParse({ ...base, methodColumn: 'method' }))).toEqual(['methodColumn']);
    expect(csvColumnMapSchema.safeParse({ ...base, method: null, methodColumn: 'method' }).success).toBe(true);
  });

  it('names the field of an unknown input, a unit of another quantity and a missing seq column', () => {
    const result = csvColumnMapSchema.safeParse({
      ...base,
      seqColumn: ' ',
      fields: { ...base.fields, txSelfInductance: { column: 'L1', unit: 'kg' }, flux: { column: 'B', unit: 'T' } },
    });
    expect(pathsOf(result).sort()).toEqual(['fields.flux', 'fields.txSelfInductance.unit', 'seqColumn']);
    expect(result.error?.issues.find((i) => i.path.join('.') === 'fields.txSelfInductance.unit')?.message).toBe('“kg” is not a unit of an inductance; write one such as uH or nH.');
  });

  it('accepts units as people type them: µH, kΩ, Ohm, °', () => {
    const fields = { txSelfInductance: { column: 'L1', unit: 'µH' }, z11Re: { column: 'R', unit: 'kΩ' }, z11Im: { column: 'X', unit: 'Ohm' }, phaseDeg: { column: 'p', unit: '°' } };
    expect(csvColumnMapSchema.safeParse({ ...base, fields }).success).toBe(true);
  });
});

describe('readingImportSchema', () => {
  it('takes the file text, the mapping and whether to store; checking is the default', () => {
    const parsed = readingImportSchema.parse({ csv: 'seq\n1', mapping: base });
    expect(parsed).toMatchObject({ csv: 'seq\n1', fileName: '', commit: false });
    expect(pathsOf(readingImportSchema.safeParse({ csv: '', mapping: base }))).toEqual(['csv']);
  });
});
