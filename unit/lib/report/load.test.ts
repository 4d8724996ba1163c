import JSZip from 'jszip';
import Papa from 'papaparse';
import { loadPlanReport } from '../../../src/lib/report/load';
import { planReportPdf, planReportZip } from '../../../src/lib/report/exports';
import { db, SEEDED, sessionUserByEmail, statusOf, studyIdByName } from '../../support/database';
import { drawPdfsFromSources } from '../../support/source-pdf-threads';

/**
 * The report gathered from the seeded demo lab (database/seeds): the plan sent for review, "Probe tilt
 * at 10 cm", 7 tilts measured twice by two methods, with two comments. Read only: nothing is written.
 */
const REVIEW_PLAN = 'Probe tilt at 10 cm';

describe('loadPlanReport', () => {
  let padId: number;
  let railId: number;
  let planId: number;

  beforeAll(async () => {
    drawPdfsFromSources();
    padId = await studyIdByName(SEEDED.padStudy);
    railId = await studyIdByName(SEEDED.railStudy);
    planId = (await db('sweep_plans').where({ study_id: padId, name: REVIEW_PLAN }).first('id')).id;
  });

  afterAll(async () => {
    await db.destroy();
  });

  it('gathers the study, setup, coils, points, every reading, the three reviews and the comments', async () => {
    const supervisor = await sessionUserByEmail(SEEDED.supervisor);
    const report = await loadPlanReport(supervisor, padId, planId);
    expect(report.study.name).toBe(SEEDED.padStudy);
    expect(report.plan.name).toBe(REVIEW_PLAN);
    expect(report.setup.id).toBe(report.plan.setupId);
    expect([report.transmitter.id, report.receiver.id]).toEqual([report.setup.transmitterCoilId, report.setup.receiverCoilId]);
    expect(report.points).toHaveLength(report.plan.pointCount);
    const readingCount = Number((await db('readings').where({ plan_id: planId }).count({ n: '*' }))[0].n);
    expect(report.readings).toHaveLength(readingCount);
    for (const quantity of ['coupling', 'mutualInductance', 'efficiency'] as const) {
      expect(report.reviews[quantity].quantity).toBe(quantity);
      // the seed measures every pose by open-circuit voltage (M, k) and by direct power (efficiency)
      expect(report.reviews[quantity].summary.compared).toBe(7);
    }
    expect(report.comments.map((c) => c.seq)).toEqual([null, 7]);
  });

  it('answers 404 to someone who is not on the study, and for a plan of another study', async () => {
    const outsider = await sessionUserByEmail(SEEDED.otherResearcher);
    expect(await statusOf(() => loadPlanReport(outsider, padId, planId))).toBe(404);
    // the outsider is a researcher of the rail study, but the plan is not in it
    expect(await statusOf(() => loadPlanReport(outsider, railId, planId))).toBe(404);
  });

  it('makes the PDF and the zip from the seeded plan, with a safe file name', async () => {
    const student = await sessionUserByEmail(SEEDED.student);
    const pdf = await planReportPdf(student, padId, planId);
    expect(pdf.body.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(pdf.fileName).toBe('couplet-probe-tilt-at-10-cm-report.pdf');
    const zip = await planReportZip(student, padId, planId);
    expect(zip.fileName).toBe('couplet-probe-tilt-at-10-cm-data.zip');
    const files = await JSZip.loadAsync(zip.body);
    const points = Papa.parse(await files.file('points.csv')!.async('string'), { header: true, skipEmptyLines: true }).data;
    expect(points).toHaveLength(14);
  }, 60_000);
});
