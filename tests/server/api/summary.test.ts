import { PDFDocument } from 'pdf-lib';
import Papa from 'papaparse';
import request from 'supertest';
import { Draft } from '../../../db/models';
import { addPhoto } from '../../../server/photos/photos.service';
import { bearer } from '../../support/factories';
import { pdfText } from '../../support/pdf-text';
import { createReleaseWorld, type ReleaseWorld } from '../../support/release-world';
import { jpegWithGpsAndOrientation } from '../../support/sample-files';
import { buildTestApp, type TestApp } from '../../support/test-app';

let t: TestApp;
let w: ReleaseWorld;
const as = (user: Parameters<typeof bearer>[0]) => ({ Authorization: bearer(user, t.config) });
const base = () => `/api/studios/${w.studio.id}/trials/${w.trial.id}`;
const csvRows = (text: string) => Papa.parse<string[]>(text.trim(), {}).data;

beforeAll(async () => {
  t = buildTestApp();
  w = await createReleaseWorld(t.storage, 'Summary');
  await request(t.app).put(`${base()}/findings/triage`).set(as(w.grader)).send({ kind: 'back-rise', direction: 'add', state: 'will-fix' });
  // One photo the tester allowed the studio to share, one for the staff only.
  const jpeg = await jpegWithGpsAndOrientation();
  await addPhoto(w.finishers[0].enrollment.id, w.finishers[0].user, { stage: 'final', view: 'front', consent: 'may-share' }, { buffer: jpeg, name: 'front.jpg' }, t.storage);
  await addPhoto(w.finishers[1].enrollment.id, w.finishers[1].user, { stage: 'final', view: 'front', consent: 'staff-only' }, { buffer: jpeg, name: 'front.jpg' }, t.storage);
  // A change note someone could have typed to start a spreadsheet formula.
  await Draft.create({ patternId: w.pattern.id, version: 2, changeNote: '=HYPERLINK("http://example.test","open")', createdById: w.owner.id });
});
afterAll(() => t.close());

describe('the trial summary', () => {
  it('adds up coverage, reports per stage, the findings with their triage and changes, the drafts and the shared photos only', async () => {
    const res = await request(t.app).get(`${base()}/summary`).set(as(w.grader));
    expect(res.status).toBe(200);
    const s = res.body;
    expect(s.coverage.sizes.map((c: { size: string; target: number; enrolled: number; finished: number }) => [c.size, c.target, c.enrolled, c.finished])).toEqual([
      ['8', 3, 3, 3],
      ['10', 3, 3, 3],
      ['12', 3, 3, 2],
    ]);
    expect(s.coverage).toMatchObject({ target: 9, enrolled: 9, finished: 8 });
    expect(s.reports.stages).toEqual([
      expect.objectContaining({ stage: 'check-in', submitted: 0, expected: 9 }),
      expect.objectContaining({ stage: 'final', submitted: 8, onTime: 8, late: 0, expected: 9 }),
    ]);
    expect(s.findings.drafts).toHaveLength(1);
    expect(s.findings.drafts[0].findings).toEqual([
      expect.objectContaining({ name: 'Back crotch length, added', classLabel: 'Whole draft', count: 7, testers: 8, triageLabel: 'Will fix' }),
    ]);
    // The median change, 3/4 in, at every size, in the reader's unit (inches here); the millimetres
    // to a tenth (0.75 × 25.4 is 19.049999… in floating point, so it rounds down).
    expect(s.findings.changes.map((c: { size: string; change: string; changeMm: number }) => [c.size, c.change, c.changeMm])).toEqual([
      ['8', '3/4 in', 19],
      ['10', '3/4 in', 19],
      ['12', '3/4 in', 19],
    ]);
    expect(s.drafts.map((d: { version: number }) => d.version)).toEqual([1, 2]);
    expect(s.photos).toHaveLength(1);
    expect(s.photos[0]).toMatchObject({ size: '8', view: 'front', stage: 'final' });
    expect(new URL(s.photos[0].thumbUrl).searchParams.get('X-Amz-Expires')).toBe('300');
  });

  it('gives each table as CSV, with no cell able to start a formula, and names a table that does not exist', async () => {
    const coverage = await request(t.app).get(`${base()}/summary/coverage.csv`).set(as(w.owner));
    expect(coverage.headers['content-type']).toMatch(/text\/csv/);
    expect(csvRows(coverage.text)).toEqual([
      ['size', 'testers_wanted', 'testers_enrolled', 'testers_finished'],
      ['8', '3', '3', '3'],
      ['10', '3', '3', '3'],
      ['12', '3', '3', '2'],
    ]);
    const findings = csvRows((await request(t.app).get(`${base()}/summary/findings.csv`).set(as(w.owner))).text);
    expect(findings[1]).toEqual(['1', 'Back crotch length, added', 'Whole draft', '7', '8', '', 'Will fix']);
    const drafts = csvRows((await request(t.app).get(`${base()}/summary/drafts.csv`).set(as(w.owner))).text);
    expect(drafts[2][4]).toBe('\'=HYPERLINK("http://example.test","open")');
    const changes = csvRows((await request(t.app).get(`${base()}/summary/changes.csv`).set(as(w.owner))).text);
    expect(changes.slice(1).map((r) => [r[3], r[4]])).toEqual([['8', '3/4 in'], ['10', '3/4 in'], ['12', '3/4 in']]);
    const reports = csvRows((await request(t.app).get(`${base()}/summary/reports.csv`).set(as(w.owner))).text);
    expect(reports[2]).toEqual(['Final report', '9', '8', '8', '0']);

    const unknown = await request(t.app).get(`${base()}/summary/testers.csv`).set(as(w.owner));
    expect(unknown.status).toBe(400);
    expect(Object.keys(unknown.body.error.fields)).toEqual(['table']);
  });

  it('as a PDF that a PDF library opens, saying the same things, with the shared photo', async () => {
    const res = await request(t.app).get(`${base()}/summary.pdf`).set(as(w.owner)).buffer(true).parse((r, done) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => done(null, Buffer.concat(chunks)));
    });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    expect(res.headers['content-disposition']).toContain(`${w.trial.slug}-summary.pdf`);
    const pdf = res.body as Buffer;
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    // pdf-lib (a PDF reader and writer from the registry) parses the file and finds its pages.
    const doc = await PDFDocument.load(pdf);
    expect(doc.getPageCount()).toBeGreaterThanOrEqual(1);
    expect(doc.getTitle()).toBe(`${w.trial.title}: trial summary`);
    const text = pdfText(pdf);
    for (const expected of [
      w.trial.title,
      'Coverage reached',
      '8 of 9 places filled by testers who finished (9 enrolled).',
      'Back crotch length, added',
      'Whole draft',
      '7 of 8',
      'Will fix',
      'Changes for the next draft (from draft 1)',
      '3/4 in',
      'Draft history',
      'Size 8, front, garment',
    ]) {
      expect(text).toContain(expected);
    }
    // The image of the shared photo is in the file; the staff-only one is not listed.
    expect(pdf.toString('latin1')).toMatch(/\/Subtype \/Image/);
    expect(text.match(/Size \d+, front, garment/g)).toHaveLength(1);
  });
});
