/**
 * The fields sent with an uploaded file (src/lib/validations/attachment.ts): every value arrives as
 * form text, so the point is read only from plain decimal digits.
 */
import { attachmentFieldsSchema } from '../../../src/lib/validations/attachment';

const pointIdOf = (pointId: unknown) => {
  const parsed = attachmentFieldsSchema.safeParse({ kind: 'photo', pointId, caption: '' });
  return parsed.success ? parsed.data.pointId : parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
};

describe('attachmentFieldsSchema pointId', () => {
  test('empty means the whole plan; digits name a point', () => {
    expect(pointIdOf('')).toBeNull();
    expect(pointIdOf(undefined)).toBeNull();
    expect(pointIdOf('12')).toBe(12);
  });

  test.each([' 12 ', '12.0', '1.2e1', '0xc', '+12', '-3', '0', '\ufeff12', '12abc', 'Infinity', '99999999999999999999'])('%j is refused at pointId', (raw) => {
    expect(pointIdOf(raw)).toEqual(['pointId: Choose a point of this plan.']);
  });
});
