import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import {
  DESCRIBED_ACTIONS, describeEvent, genericSentence, HISTORY_CATEGORIES, isReviewTransition,
} from '../../../src/lib/audit/describe-event';

/** Every `action: '...'` the app's data code and the seed write to the audit trail, read from the source. */
function recordedActions(): Map<string, string> {
  const found = new Map<string, string>();
  const visit = (dir: string) => {
    for (const entry of readdirSync(dir, { withFileTypes: true })) {
      const file = path.join(dir, entry.name);
      if (entry.isDirectory()) visit(file);
      else if (/\.ts$/.test(entry.name)) {
        for (const match of readFileSync(file, 'utf8').matchAll(/action: '([a-z0-9_.]+)'/g)) found.set(match[1], path.relative(process.cwd(), file));
      }
    }
  };
  visit(path.join(__dirname, '../../../src/lib/data'));
  visit(path.join(__dirname, '../../../database/seeds'));
  return found;
}

const quote = (name: string) => `\u201c${name}\u201d`;

describe('describeEvent', () => {
  const recorded = recordedActions();

  it('finds the recorded actions in the source (so the next check has something to check)', () => {
    // The audit trail had at least these when this test was written; the list only grows.
    expect([...recorded.keys()]).toEqual(expect.arrayContaining(['study.create', 'coil.create', 'plan.transition', 'reading.create', 'attachment.create']));
  });

  it('has its own sentence and category for every action the code records, even without details', () => {
    const undescribed = [...recorded].filter(([action]) => {
      for (const details of [null, {}]) {
        const { sentence, category } = describeEvent({ action, details });
        if (sentence === genericSentence(action) || category === 'other') return true;
      }
      return false;
    });
    // Names the file that writes each action nobody described, so the fix is obvious.
    expect(undescribed.map(([action, file]) => `${action} (${file})`)).toEqual([]);
  });

  it('describes the review actions', () => {
    const plan = { planId: 7, planName: 'Probe tilt x depth' };
    const cases: [string, Record<string, unknown>, string][] = [
      ['comment.create', { ...plan, pointSeq: null }, `commented on the plan ${quote('Probe tilt x depth')}`],
      ['comment.create', { ...plan, pointSeq: 12 }, `commented on point 12 of the plan ${quote('Probe tilt x depth')}`],
      ['outlier.mark', { ...plan, pointSeq: 4, reason: 'probe knocked' }, `set point 4 of the plan ${quote('Probe tilt x depth')} aside as an outlier: probe knocked`],
      ['outlier.unmark', { ...plan, pointSeq: 4, reason: 'probe knocked' }, `took point 4 of the plan ${quote('Probe tilt x depth')} back into the review`],
      ['review.tolerance', { ...plan, tolerance: 0.05 }, `set the review tolerance of the plan ${quote('Probe tilt x depth')} to 5 %`],
      [
        'fit.run', { ...plan, model: 'tilt_offset', quantity: 'coupling', value: 2.3456, uncertainty: 0.41234 },
        `estimated the tilt error from the coupling coefficient of the plan ${quote('Probe tilt x depth')}: 2.35 \u00b1 0.41\u00b0`,
      ],
      [
        'fit.run', { ...plan, model: 'distance_offset', quantity: 'mutualInductance', value: 0.0031, uncertainty: 0.0004 },
        `estimated the distance error from the mutual inductance of the plan ${quote('Probe tilt x depth')}: 3.1 \u00b1 0.4 mm`,
      ],
    ];
    for (const [action, details, sentence] of cases) {
      expect(describeEvent({ action, details })).toEqual({ sentence, category: 'review' });
    }
  });

  it('says what a plan state change meant, and files decisions under review', () => {
    const name = 'Probe tilt x depth';
    const step = (from: string, to: string, reason?: string) => describeEvent({ action: 'plan.transition', details: { name, from, to, ...(reason ? { reason } : {}) } });
    expect(step('in_review', 'accepted')).toEqual({ sentence: `accepted the plan ${quote(name)}`, category: 'review' });
    expect(step('in_review', 'on_bench', 'repeat points 3-5 with the probe upright')).toEqual({
      sentence: `returned the plan ${quote(name)} to the bench: repeat points 3-5 with the probe upright`, category: 'review',
    });
    expect(step('on_bench', 'in_review')).toEqual({ sentence: `sent the plan ${quote(name)} for review`, category: 'review' });
    expect(step('draft', 'on_bench')).toEqual({ sentence: `opened the plan ${quote(name)} for the bench`, category: 'plans' });
    expect(isReviewTransition('draft', 'on_bench')).toBe(false);
  });

  it('describes the existing actions with their details', () => {
    expect(describeEvent({ action: 'coil.update', details: { name: 'Probe helix', fields: ['spec', 'wireLabel'] } }).sentence)
      .toBe(`changed the coil ${quote('Probe helix')} (geometry, wire label)`);
    expect(describeEvent({ action: 'reading.create', details: { plan: 'P', point: 3, method: 'open_circuit' } }).sentence)
      .toBe(`logged an open-circuit voltage reading at point 3 of the plan ${quote('P')}`);
    expect(describeEvent({ action: 'reading.correct', details: { plan: 'P', point: 3, version: 2, reason: 'wrong range' } }).sentence)
      .toBe(`corrected the reading at point 3 of the plan ${quote('P')} (version 2): wrong range`);
    expect(describeEvent({ action: 'readings.import', details: { plan: 'P', count: 1, fileName: 'bench.csv' } }).sentence)
      .toBe(`imported 1 reading into the plan ${quote('P')} from ${quote('bench.csv')}`);
    expect(describeEvent({ action: 'attachment.create', details: { planId: 1, kind: 'photo', fileName: 'jig.jpg' }, planName: 'P' }))
      .toEqual({ sentence: `attached a photo ${quote('jig.jpg')} to the plan ${quote('P')}`, category: 'files' });
    expect(describeEvent({ action: 'member.role.change', details: { userId: 3, from: 'student', to: 'researcher' }, personName: 'Tomasz Rehn' }).sentence)
      .toBe('changed the study role of Tomasz Rehn from student to researcher');
    expect(describeEvent({ action: 'invitation.create', details: { role: 'supervisor' } }).sentence).toBe('invited someone to join as a supervisor');
    // Seeded rows carry no name: the plan's current name stands in.
    expect(describeEvent({ action: 'plan.create', details: { seeded: true }, planName: 'Probe tilt x depth' }).sentence)
      .toBe(`created the plan ${quote('Probe tilt x depth')}`);
    expect(describeEvent({ action: 'setup.create', details: { seeded: true }, targetName: 'Probe 10 cm deep' }).sentence)
      .toBe(`saved the setup ${quote('Probe 10 cm deep')}`);
    expect(describeEvent({ action: 'coil.delete', details: { name: 'Old loop' }, targetName: 'Renamed since' }).sentence)
      .toBe(`deleted the coil ${quote('Old loop')}`);
  });

  it('gives an unknown action a generic sentence and never throws on odd details', () => {
    expect(describeEvent({ action: 'sensor.recalibrate', details: { any: 1 } })).toEqual({ sentence: genericSentence('sensor.recalibrate'), category: 'other' });
    expect(describeEvent({ action: 'toString', details: null }).category).toBe('other');
    for (const action of DESCRIBED_ACTIONS) {
      const odd = { name: 42, fields: 'spec', point: 'x', count: {}, value: 'NaN', pointSeq: [], tolerance: null, model: 'nonsense', to: 7 };
      const { sentence, category } = describeEvent({ action, details: odd });
      expect(typeof sentence).toBe('string');
      expect(sentence).not.toMatch(/undefined|null|NaN|\[object/);
      expect(HISTORY_CATEGORIES).toContain(category);
    }
  });
});
