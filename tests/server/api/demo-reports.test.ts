import { GetObjectCommand, HeadObjectCommand } from '@aws-sdk/client-s3';
import sharp from 'sharp';
import { Application, Draft, DraftDownload, DraftFile, Enrollment, FindingSnapshot, Milestone, Pattern, PatternSize, Photo, Report, Trial } from '../../../db/models';
import { DEMO_FABRIC_SHORT_SIZES, DEMO_FLY_STEP, DEMO_WAIST_SIZE, demoPdf, openDemoStorage } from '../../../db/seeders/demo-reports';
import { DEMO_PATTERN_NAME, DEMO_TRIAL_SLUG, seedDemoStudio } from '../../../db/seeders/demo-studio';
import type { AnalysisOutput, Finding } from '../../../server/analysis/types';
import { alterationKindsFor, fitAreasFor } from '../../../server/domain/alterations';
import { reportCompleteSchema, reportDraftSchema } from '../../../server/domain/schemas/reports';
import { checkDraftFile } from '../../../server/files/content-check';
import { findingsFor } from '../../../server/findings/findings.service';
import type { Bucket } from '../../../server/storage/storage';
import { buildTestApp, type TestApp } from '../../support/test-app';

/** Row counts of everything the demo seed writes, for the demo trial alone (other suites share the database). */
async function demoCounts() {
  const trial = (await Trial.findOne({ where: { slug: DEMO_TRIAL_SLUG } }))!;
  const enrollmentIds = (await Enrollment.findAll({ where: { trialId: trial.id } })).map((e) => e.id);
  const draftIds = (await Draft.findAll({ where: { patternId: trial.patternId } })).map((d) => d.id);
  const fileIds = (await DraftFile.findAll({ where: { draftId: draftIds } })).map((f) => f.id);
  return {
    applications: await Application.count({ where: { trialId: trial.id } }),
    enrollments: enrollmentIds.length,
    reports: await Report.count({ where: { enrollmentId: enrollmentIds } }),
    photos: await Photo.count({ where: { enrollmentId: enrollmentIds } }),
    drafts: draftIds.length,
    draftFiles: fileIds.length,
    downloads: await DraftDownload.count({ where: { draftFileId: fileIds } }),
  };
}

describe('the demo trial: two drafts, check-ins and final reports, photos, and findings of every class', () => {
  let t: TestApp;
  let trial: Trial;
  let enrollments: Enrollment[];
  let seededOnce: Awaited<ReturnType<typeof demoCounts>>;

  const read = async (bucket: Bucket, key: string) => {
    const object = await t.storage.client.send(new GetObjectCommand({ Bucket: t.config.s3.buckets[bucket], Key: key }));
    return Buffer.from(await object.Body!.transformToByteArray());
  };
  const CM = { lengthUnit: 'cm', fabricUnit: 'm' } as const;
  const finding = (result: AnalysisOutput | null, kind: string, direction: 'add' | 'remove') => {
    const f = result?.findings.find((x) => x.kind === kind && x.direction === direction);
    if (!f) throw new Error(`no finding ${kind} ${direction} in draft ${result?.draft}`);
    return f as Finding;
  };

  beforeAll(async () => {
    t = buildTestApp();
    await seedDemoStudio(t.sequelize, 4);
    seededOnce = await demoCounts();
    trial = (await Trial.findOne({ where: { slug: DEMO_TRIAL_SLUG } }))!;
    enrollments = await Enrollment.findAll({ where: { trialId: trial.id }, include: [{ model: Report, as: 'reports' }] });
  });
  afterAll(() => t.close());

  it('every selected tester sent a check-in on draft 1 before it was due; all but a few sent a final report on draft 2', async () => {
    const due = new Map((await Milestone.findAll({ where: { trialId: trial.id } })).map((m) => [m.kind as string, m.dueAt]));
    const reportsOf = (e: Enrollment) => (e as Enrollment & { reports: Report[] }).reports;
    expect(enrollments.length).toBeGreaterThanOrEqual(22);
    for (const e of enrollments) {
      const checkIn = reportsOf(e).find((r) => r.stage === 'check-in');
      expect(checkIn?.content.draftVersion).toBe(1);
      expect(checkIn!.submittedAt!.getTime()).toBeLessThan(due.get('toile-check-in')!.getTime());
    }
    const finals = enrollments.map((e) => reportsOf(e).find((r) => r.stage === 'final'));
    const sent = finals.filter((r) => r?.submittedAt);
    for (const r of sent) {
      expect(r!.content.draftVersion).toBe(2);
      expect(r!.submittedAt!.getTime()).toBeLessThan(Math.min(due.get('final-report')!.getTime(), Date.now()));
    }
    const missing = enrollments.length - sent.length;
    expect(missing).toBeGreaterThanOrEqual(4);
    expect(missing).toBeLessThanOrEqual(5);
    // Some of the missing ones are saved half-way, the others not started.
    expect(finals.filter((r) => r && !r.submittedAt).length).toBeGreaterThan(0);
    expect(finals.filter((r) => !r).length).toBeGreaterThan(0);
    // A tester who sent the final report has finished; the others are still active.
    for (const [i, e] of enrollments.entries()) expect(e.status).toBe(finals[i]?.submittedAt ? 'finished' : 'active');

    // The content is complete: fabric, verdict and signed alterations with area, side and note.
    const sample = sent[0]!.content;
    expect(sample).toMatchObject({ sizeSewn: expect.any(String), variantSewn: null, verdict: expect.stringMatching(/\w{3}/), wouldMakeAgain: expect.any(Boolean) });
    expect(sample.fabric).toMatchObject({ kind: expect.any(String), fibre: expect.any(String), widthMm: expect.any(Number), usedMm: expect.any(Number), stretchPct: expect.any(Number), napped: expect.any(Boolean) });
    // Every report is what the app itself would accept: the form's schema, the garment's kinds and areas.
    const kinds = new Set(alterationKindsFor('trousers').map((k) => k.key));
    const areas = new Set<string>(fitAreasFor('trousers'));
    for (const r of enrollments.flatMap((e) => reportsOf(e))) {
      expect(reportDraftSchema.parse(r.content)).toEqual(r.content);
      if (r.submittedAt) expect(reportCompleteSchema.safeParse(r.content).success).toBe(true);
      for (const a of r.content.alterations ?? []) expect(kinds.has(a.kind ?? '')).toBe(true);
      for (const area of Object.keys(r.content.fit ?? {})) expect(areas.has(area)).toBe(true);
    }
    // As after a real submission, the stored findings of both drafts are computed.
    expect((await FindingSnapshot.findAll({ where: { trialId: trial.id } })).map((f) => f.draft).sort()).toEqual(['1', '2']);
    const all = enrollments.flatMap((e) => reportsOf(e)).flatMap((r) => r.content.alterations ?? []);
    expect(all.length).toBeGreaterThan(40);
    for (const a of all) expect(a).toMatchObject({ area: expect.any(String), where: expect.stringMatching(/^(front|back|both)$/), note: expect.stringMatching(/\w/) });
  });

  it('draft 1: the short back rise is draft-wide, the back crotch scoop grows with size, the leg follows each inseam, the waist of size 10 stands out', async () => {
    const { result } = await findingsFor(trial, { draft: '1' }, CM);
    expect(result!.testers).toBe(enrollments.length);

    const rise = finding(result, 'back-rise', 'add');
    expect(rise.class).toBe('draft-wide');
    expect(rise.count / rise.testers).toBeGreaterThan(0.75);
    expect(rise.bySize.filter((s) => s.n > 0).every((s) => s.k > 0)).toBe(true);

    const scoop = finding(result, 'crotch-curve-scoop', 'add');
    expect(scoop.class).toBe('grading');
    expect(scoop.amountSlope!.slopeMmPerSize).toBeGreaterThan(0);

    const leg = finding(result, 'leg-length', 'remove');
    expect(leg.class).toBe('personal-fit');
    expect(leg.bodyCorrelation!.n).toBeGreaterThanOrEqual(5);
    expect(leg.bodyCorrelation!.r).toBeGreaterThanOrEqual(0.6);

    const waist = finding(result, 'waist', 'remove');
    expect(waist.class).toBe('size-specific');
    expect(waist.sizes).toEqual([DEMO_WAIST_SIZE]);
  });

  it('draft 1 → 2: the back rise is fixed, the problems draft 2 did not touch are not, personal fit stays personal fit', async () => {
    const { result } = await findingsFor(trial, { compare: ['1', '2'] }, CM);
    const row = (kind: string, direction: string) => result!.comparison!.find((c) => c.kind === kind && c.direction === direction);
    expect(row('back-rise', 'add')).toMatchObject({ status: 'fixed', class: 'draft-wide' });
    expect(row('back-rise', 'add')!.countTo).toBeLessThanOrEqual(1);
    expect(row('back-rise', 'add')!.difference!.interval[1]).toBeLessThan(0);
    expect(['still-present', 'improved']).toContain(row('crotch-curve-scoop', 'add')!.status);
    expect(row('waist', 'remove')).toMatchObject({ status: 'still-present', sizes: [DEMO_WAIST_SIZE] });
    expect(row('leg-length', 'remove')!.status).toBe('personal-fit');
  });

  it('the grader marked the scoop and the waist "will fix": the change table of draft 2 lists them per size, in the reader\'s unit', async () => {
    const { result } = await findingsFor(trial, { draft: '2' }, { lengthUnit: 'in', fabricUnit: 'yd' });
    const changes = result!.changes!;
    expect([...new Set(changes.map((c) => `${c.kind}|${c.direction}`))].sort()).toEqual(['crotch-curve-scoop|add', 'waist|remove']);
    const sizes = (await PatternSize.findAll({ where: { patternId: trial.patternId }, order: [['position', 'ASC']] })).map((s) => s.label);
    const scoop = changes.filter((c) => c.kind === 'crotch-curve-scoop');
    expect(scoop.map((c) => c.size)).toEqual(sizes);
    expect(scoop.every((c) => c.basis === 'fitted')).toBe(true);
    expect(scoop[scoop.length - 1]!.amountMm!).toBeGreaterThan(scoop[0]!.amountMm!);
    const waist = changes.filter((c) => c.kind === 'waist' && c.amountMm !== null);
    expect(waist.map((c) => c.size)).toEqual([DEMO_WAIST_SIZE]);
    expect(waist[0]!.amountMm!).toBeLessThan(0);
    // Reasons are written for this reader: inches, no millimetres.
    expect(result!.findings.flatMap((f) => f.reasons).join(' ')).not.toMatch(/\d mm\b/);
    expect(finding(result, 'crotch-curve-scoop', 'add').reasons.join(' ')).toMatch(/“scoop the crotch curve, added”, median \d[\d /]* in/);
  });

  it('draft 2: the same grading, personal-fit and size-specific findings; fabric short in sizes 18 and 20 only; the fly front unclear to several testers', async () => {
    const { result } = await findingsFor(trial, { draft: '2' }, CM);
    expect(result!.draft).toBe('2');
    expect(finding(result, 'crotch-curve-scoop', 'add').class).toBe('grading');
    expect(finding(result, 'leg-length', 'remove').class).toBe('personal-fit');
    expect(finding(result, 'waist', 'remove')).toMatchObject({ class: 'size-specific', sizes: [DEMO_WAIST_SIZE] });
    expect(result!.findings.some((f) => f.kind === 'back-rise' && f.class !== 'none' && f.class !== 'too-few-reports')).toBe(false);

    const flagged = [...new Set(result!.fabric!.filter((c) => c.flagged).map((c) => c.size))].sort();
    expect(flagged).toEqual([...DEMO_FABRIC_SHORT_SIZES].sort());
    expect(result!.fabric!.filter((c) => !c.flagged && c.needMm !== null).length).toBeGreaterThan(5);

    const steps = result!.unclearSteps!;
    const fly = steps.find((s) => s.step === DEMO_FLY_STEP)!;
    expect(fly.count).toBeGreaterThanOrEqual(3);
    expect(fly.flagged).toBe(true);
    expect(steps.filter((s) => s.flagged).map((s) => s.step)).toEqual([DEMO_FLY_STEP]);
    expect(steps.some((s) => s.count === 1 && !s.flagged)).toBe(true);
  });

  it('drafts 1 and 2 carry a one-page PDF each, in the store, with the change note of draft 2', async () => {
    const pattern = (await Pattern.findOne({ where: { name: DEMO_PATTERN_NAME } }))!;
    const drafts = await Draft.findAll({ where: { patternId: pattern.id }, include: [{ model: DraftFile, as: 'files' }], order: [['version', 'ASC']] });
    expect(drafts.map((d) => d.version)).toEqual([1, 2]);
    expect(drafts[1].changeNote).toMatch(/rise lengthened/i);
    expect(drafts[0].createdAt.getTime()).toBeLessThan(drafts[1].createdAt.getTime());
    for (const d of drafts) {
      const file = d.files![0];
      const bytes = await read('drafts', file.objectKey);
      expect(bytes.length).toBe(file.bytes);
      // The upload check accepts it as a PDF by its content.
      await expect(checkDraftFile(bytes, file.originalName)).resolves.toMatchObject({ mime: 'application/pdf' });
      expect(bytes.toString('latin1')).toContain(`draft ${d.version}`);
    }
  });

  it('the hand-written PDF has a cross-reference table whose offsets point at its objects', () => {
    const text = demoPdf(['Title (with brackets) \u2014 draft 9', 'A second line']).toString('latin1');
    expect(text.startsWith('%PDF-1.4\n')).toBe(true);
    expect(text.endsWith('%%EOF\n')).toBe(true);
    const xrefAt = Number(/startxref\n(\d+)\n/.exec(text)![1]);
    expect(text.slice(xrefAt, xrefAt + 5)).toBe('xref\n');
    const entries = [...text.slice(xrefAt).matchAll(/^(\d{10}) 00000 n $/gm)].map((m) => Number(m[1]));
    expect(entries).toHaveLength(5);
    entries.forEach((offset, i) => expect(text.slice(offset, offset + `${i + 1} 0 obj`.length)).toBe(`${i + 1} 0 obj`));
    const length = Number(/\/Length (\d+) >>\nstream\n/.exec(text)![1]);
    const start = text.indexOf('stream\n') + 'stream\n'.length;
    expect(text.slice(start + length, start + length + '\nendstream'.length)).toBe('\nendstream');
    expect(text).toContain('(Title \\(with brackets\\) \x97 draft 9) Tj');
  });

  it('photos of a few final reports, front, side and back, shared and staff-only, are stored with thumbnails and read back as JPEGs', async () => {
    const photos = await Photo.findAll({ include: [{ model: Enrollment, as: 'enrollment', where: { trialId: trial.id } }] });
    expect(photos.length).toBeGreaterThanOrEqual(9);
    expect(new Set(photos.map((p) => p.view))).toEqual(new Set(['front', 'side', 'back']));
    expect(new Set(photos.map((p) => p.consent))).toEqual(new Set(['may-share', 'staff-only']));
    for (const p of photos) {
      expect(p.stage).toBe('final');
      for (const key of [p.fullKey, p.thumbKey]) {
        const head = await t.storage.client.send(new HeadObjectCommand({ Bucket: t.config.s3.buckets.photos, Key: key }));
        expect(head.ContentType).toBe('image/jpeg');
      }
    }
    const meta = await sharp(await read('photos', photos[0].fullKey)).metadata();
    expect(meta).toMatchObject({ format: 'jpeg', width: photos[0].width, height: photos[0].height });
    expect(meta.exif).toBeUndefined();
    const thumb = await sharp(await read('photos', photos[0].thumbKey)).metadata();
    expect(Math.max(thumb.width, thumb.height)).toBeLessThanOrEqual(480);
    // Only testers who sent their final report have photos of the finished pair.
    const sentBy = new Set((await Report.findAll({ where: { stage: 'final' } })).filter((r) => r.submittedAt).map((r) => r.enrollmentId));
    for (const p of photos) expect(sentBy.has(p.enrollmentId)).toBe(true);
  });

  it('seeding again adds nothing and stores nothing new', async () => {
    const keys = async () => {
      const enrollmentIds = enrollments.map((e) => e.id);
      const draftIds = (await Draft.findAll({ where: { patternId: trial.patternId } })).map((d) => d.id);
      return [...(await Photo.findAll({ where: { enrollmentId: enrollmentIds } })).map((p) => p.fullKey), ...(await DraftFile.findAll({ where: { draftId: draftIds } })).map((f) => f.objectKey)].sort();
    };
    const before = await keys();
    await seedDemoStudio(t.sequelize, 4);
    expect(await demoCounts()).toEqual(seededOnce);
    expect(await keys()).toEqual(before);
  });

  it('a file store that cannot be reached stops the seed with a message naming the store', async () => {
    await expect(openDemoStorage({ ...process.env, S3_ENDPOINT: 'http://127.0.0.1:9' })).rejects.toThrow(/file store at http:\/\/127\.0\.0\.1:9 .*cannot be reached/);
  });
});
