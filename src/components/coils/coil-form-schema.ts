import { z } from 'zod';
import type { CoilSpec } from '@/physics/types';
import type { Coil } from '@/lib/data/coils';
import { formatQuantity, gaugeOfLabel, parseQuantity, parseWire, type QuantityKind } from '@/lib/units';
import { COIL_KINDS, MATERIALS, coilCreateSchema, type CoilCreateInput } from '@/lib/validations/coil';

/**
 * The coil form: every dimension typed as text with its unit ("12 cm", "AWG 18", "10 uH"). The text is
 * read into SI here, then checked by the server's own coilCreateSchema, whose issues are put back on
 * the field they concern. The output is the request body; the server parses it again.
 */

const text = z.string();

export const coilFormSchema = z
  .object({
    name: text,
    kind: z.enum(COIL_KINDS, { error: 'Choose loop, helix or spiral.' }),
    radius: text,
    length: text,
    innerRadius: text,
    outerRadius: text,
    turns: text,
    wire: text,
    material: z.enum(MATERIALS, { error: 'Choose copper or aluminium.' }),
    temperature: text,
    strands: text,
    strandDiameter: text,
    measuredInductance: text,
    measuredResistance: text,
    measuredQ: text,
    measuredFrequency: text,
    notes: text,
  })
  .transform((form, context): CoilCreateInput => {
    let failed = false;
    const fail = (field: keyof CoilFormValues, message: string) => {
      failed = true;
      context.addIssue({ code: 'custom', path: [field], message });
    };
    const quantity = (field: keyof CoilFormValues, kind: QuantityKind, label: string, required = false) => {
      const parsed = parseQuantity(form[field], kind, { field: label, required });
      if (parsed.ok) return parsed.value;
      fail(field, parsed.message);
      return null;
    };
    const plain = (field: keyof CoilFormValues, label: string, example: string, required = false) => {
      const value = form[field].trim().replace(/\s*(°\s*C|degC)$/i, '');
      if (value === '') {
        if (required) fail(field, `${label}: enter a number, such as ${example}.`);
        return null;
      }
      const number = Number(value);
      if (Number.isFinite(number)) return number;
      fail(field, `${label}: "${form[field].trim()}" is not a number. Write, for example, ${example}.`);
      return null;
    };

    const wire = parseWire(form.wire, { field: 'Wire', required: true });
    if (!wire.ok) fail('wire', wire.message);
    const strand = parseWire(form.strandDiameter, { field: 'Strand diameter' });
    if (!strand.ok) fail('strandDiameter', strand.message);
    const common = {
      wireDiameter: wire.ok ? (wire.value?.diameter ?? 0) : 0,
      material: form.material,
      temperatureC: plain('temperature', 'Temperature', '20') ?? undefined,
      strands: plain('strands', 'Strands', '105') ?? undefined,
      strandDiameter: (strand.ok && strand.value?.diameter) || undefined,
    };
    let spec: CoilSpec;
    if (form.kind === 'loop') {
      spec = { kind: 'loop', radius: quantity('radius', 'length', 'Radius', true) ?? 0, ...common };
    } else if (form.kind === 'helix') {
      spec = {
        kind: 'helix',
        radius: quantity('radius', 'length', 'Radius', true) ?? 0,
        turns: plain('turns', 'Turns', '12', true) ?? 0,
        length: quantity('length', 'length', 'Length', true) ?? 0,
        ...common,
      };
    } else {
      spec = {
        kind: 'spiral',
        innerRadius: quantity('innerRadius', 'length', 'Inner radius', true) ?? 0,
        outerRadius: quantity('outerRadius', 'length', 'Outer radius', true) ?? 0,
        turns: plain('turns', 'Turns', '12', true) ?? 0,
        ...common,
      };
    }
    const body: CoilCreateInput = {
      name: form.name,
      spec,
      wireLabel: wire.ok ? (wire.value?.label ?? null) : null,
      measured: {
        inductance: quantity('measuredInductance', 'inductance', 'Measured inductance'),
        resistance: quantity('measuredResistance', 'resistance', 'Measured resistance'),
        qualityFactor: plain('measuredQ', 'Measured Q', '250'),
        frequencyHz: quantity('measuredFrequency', 'frequency', 'Measured at'),
      },
      notes: form.notes,
    };
    if (failed) return z.NEVER;
    // The server's rules, with their messages put beside the field they name.
    const checked = coilCreateSchema.safeParse(body);
    if (!checked.success) {
      for (const issue of checked.error.issues) fail(coilFormFieldFor(issue.path.join('.')) ?? 'name', issue.message);
      return z.NEVER;
    }
    return body;
  });

export type CoilFormValues = z.input<typeof coilFormSchema>;

const FIELD_OF_PATH: Record<string, keyof CoilFormValues> = {
  name: 'name',
  'spec.kind': 'kind',
  'spec.radius': 'radius',
  'spec.length': 'length',
  'spec.innerRadius': 'innerRadius',
  'spec.outerRadius': 'outerRadius',
  'spec.turns': 'turns',
  'spec.wireDiameter': 'wire',
  'spec.material': 'material',
  'spec.temperatureC': 'temperature',
  'spec.strands': 'strands',
  'spec.strandDiameter': 'strandDiameter',
  wireLabel: 'wire',
  'measured.inductance': 'measuredInductance',
  'measured.resistance': 'measuredResistance',
  'measured.qualityFactor': 'measuredQ',
  'measured.frequencyHz': 'measuredFrequency',
  notes: 'notes',
};

/** The form field an API issue path ("spec.outerRadius") belongs to. */
export function coilFormFieldFor(path: string): keyof CoilFormValues | undefined {
  return FIELD_OF_PATH[path];
}

export const EMPTY_COIL_FORM: CoilFormValues = {
  name: '', kind: 'spiral', radius: '', length: '', innerRadius: '', outerRadius: '', turns: '', wire: '',
  material: 'copper', temperature: '', strands: '', strandDiameter: '',
  measuredInductance: '', measuredResistance: '', measuredQ: '', measuredFrequency: '', notes: '',
};

/** Enough digits that saving an unchanged form stores the same numbers. */
const EDIT_DIGITS = 9;
const shown = (value: number | null | undefined, kind: QuantityKind) => (value === null || value === undefined ? '' : formatQuantity(value, kind, EDIT_DIGITS));

/** A stored coil as form text, normalised ("0.12" m -> "12 cm"); a gauge stays a gauge. */
export function coilToFormValues(coil: Coil): CoilFormValues {
  const s = coil.spec;
  const wire = coil.wireLabel !== null && gaugeOfLabel(coil.wireLabel) !== null ? coil.wireLabel : shown(s.wireDiameter, 'length');
  return {
    ...EMPTY_COIL_FORM,
    name: coil.name,
    kind: s.kind,
    radius: s.kind === 'spiral' ? '' : shown(s.radius, 'length'),
    length: s.kind === 'helix' ? shown(s.length, 'length') : '',
    innerRadius: s.kind === 'spiral' ? shown(s.innerRadius, 'length') : '',
    outerRadius: s.kind === 'spiral' ? shown(s.outerRadius, 'length') : '',
    turns: s.kind === 'loop' ? '' : String(s.turns),
    wire,
    material: s.material ?? 'copper',
    temperature: s.temperatureC === undefined ? '' : String(s.temperatureC),
    strands: s.strands === undefined ? '' : String(s.strands),
    strandDiameter: shown(s.strandDiameter, 'length'),
    measuredInductance: shown(coil.measured.inductance, 'inductance'),
    measuredResistance: shown(coil.measured.resistance, 'resistance'),
    measuredQ: coil.measured.qualityFactor === null ? '' : String(coil.measured.qualityFactor),
    measuredFrequency: shown(coil.measured.frequencyHz, 'frequency'),
    notes: coil.notes,
  };
}
