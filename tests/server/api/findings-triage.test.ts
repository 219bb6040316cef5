import request from 'supertest';
import { FindingSnapshot, Pattern, PatternSize, Report, Trial, type User } from '../../../db/models';
import { reportsPerDraft } from '../../../server/findings/findings.service';
import { bearer, createStudioWorld, createUser, type StudioWorld, enrolTester } from '../../support/factories';
import { buildTestApp, type TestApp } from '../../support/test-app';

const IN = 25.4;
type Alteration = { area: 'rise' | 'leg' | 'waist'; kind: string; amountMm: number; where: 'back' | 'both'; note: string; otherText: string };

describe('stored findings, triage, notes, thresholds and "other" alterations', () => {
  let t: TestApp;
  let w: StudioWorld;
  let trial: Trial;
  let sizes: PatternSize[];
  const base = () => `/api/studios/${w.studio.id}/trials/${trial.id}`;
  const as = (user: User) => ({ Authorization: bearer(user, t.config) });
  const backRise = (body: { result: { findings: { kind: string; direction: string; class: string }[] } }) =>
    body.result.findings.find((f) => f.kind === 'back-rise' && f.direction === 'add');

  async function enrol(i: number, size: PatternSize) {
    const user = await createUser(`triage-${i}`);
    const { enrollment } = await enrolTester(trial.id, user.id, size.id, { profileSnapshot: { measurementsMm: { hip: size.bodyMm.hip, inseam: 30 * IN } }, plannedFabric: 'Twill' });
    return { user, enrollment };
  }

  beforeAll(async () => {
    t = buildTestApp();
    w = await createStudioWorld();
    const pattern = await Pattern.create({ studioId: w.studio.id, name: 'Dock trousers', category: 'trousers', fabricKind: 'woven', bodyColumns: ['hip', 'inseam'] });
    sizes = await Promise.all(['8', '10', '12'].map((label, position) => PatternSize.create({ patternId: pattern.id, label, position, bodyMm: { hip: (37 + 1.5 * position) * IN, inseam: 30 * IN } })));
    trial = await Trial.create({ studioId: w.studio.id, patternId: pattern.id, slug: `triage-${Date.now()}`, title: 'Dock trousers', state: 'running', coverage: { sizes: sizes.map((s) => ({ sizeId: s.id, target: 4 })), heightBands: [], variants: [] } });
    // Nine testers, three per size: eight lengthen the back crotch (draft-wide at the default
    // thresholds: 8 of 9, Wilson lower bound ≈ 0.57); one describes a change in her own words.
    for (let i = 0; i < 9; i += 1) {
      const { enrollment } = await enrol(i, sizes[i % 3]);
      const alterations: Alteration[] = i < 8 ? [{ area: 'rise', kind: 'back-rise', amountMm: 0.75 * IN, where: 'back', note: '', otherText: '' }] : [];
      if (i === 8) alterations.push({ area: 'waist', kind: 'other', amountMm: -12, where: 'back', note: '', otherText: '  Took in the BACK waist seam ' });
      await Report.create({ enrollmentId: enrollment.id, stage: 'final', submittedAt: new Date(), content: { sizeSewn: sizes[i % 3].label, draftVersion: 1, fit: { rise: -1 }, alterations, verdict: 'Fine apart from the rise.' } });
    }
  });
  afterAll(() => t.close());

  it('stores the findings of a draft as a snapshot and reuses it while the reports stay the same', async () => {
    const first = await request(t.app).get(`${base()}/findings`).set(as(w.users.grader));
    expect(first.status).toBe(200);
    expect(first.body.snapshot.draft).toBe('1');
    expect(backRise(first.body)).toMatchObject({ class: 'draft-wide', count: 8, testers: 9, triage: { state: 'open' }, notes: [] });
    const stored = await FindingSnapshot.findOne({ where: { trialId: trial.id, draft: '1' } });
    expect(stored?.testers).toBe(9);
    const again = await request(t.app).get(`${base()}/findings`).set(as(w.users.grader));
    expect(again.body.snapshot.computedAt).toBe(first.body.snapshot.computedAt);
  });

  it('recomputes the snapshot when a tester submits a report', async () => {
    const before = (await FindingSnapshot.findOne({ where: { trialId: trial.id, draft: '1' } }))!.computedAt;
    const { user, enrollment } = await enrol(9, sizes[0]);
    const put = await request(t.app)
      .put(`/api/me/enrollments/${enrollment.id}/reports/final`)
      .set(as(user))
      .send({ baseVersion: 0, changes: { sizeSewn: '8', draftVersion: 1, fit: { rise: -1 }, verdict: 'Short in the back rise.', alterations: [{ area: 'rise', kind: 'back-rise', amountMm: 20, where: 'back', note: '', otherText: '' }] } });
    expect(put.status).toBe(200);
    expect((await request(t.app).post(`/api/me/enrollments/${enrollment.id}/reports/final/submit`).set(as(user))).status).toBe(200);
    const after = (await FindingSnapshot.findOne({ where: { trialId: trial.id, draft: '1' } }))!;
    expect(after.testers).toBe(10);
    expect(after.computedAt.getTime()).toBeGreaterThan(before.getTime());
    expect(after.result.findings.find((f) => f.kind === 'back-rise')?.count).toBe(9);
  });

  it('lets the grader and the designer triage a finding and keep notes on it; testers cannot', async () => {
    const noDraft = await request(t.app).put(`${base()}/findings/triage`).set(as(w.users.grader)).send({ kind: 'back-rise', direction: 'add', state: 'fixed' });
    expect(noDraft.status).toBe(400);
    expect(noDraft.body.error.fields.fixedInDraft).toMatch(/which draft/);
    const badState = await request(t.app).put(`${base()}/findings/triage`).set(as(w.users.grader)).send({ kind: 'back-rise', direction: 'add', state: 'ignored' });
    expect(badState.status).toBe(400);
    expect(badState.body.error.fields.state).toBeDefined();

    const fixed = await request(t.app).put(`${base()}/findings/triage`).set(as(w.users.grader)).send({ kind: 'back-rise', direction: 'add', state: 'fixed', fixedInDraft: 2 });
    expect(fixed.status).toBe(200);
    expect(fixed.body.triage).toMatchObject({ state: 'fixed', fixedInDraft: 2, updatedBy: w.users.grader.name });
    const note = await request(t.app).post(`${base()}/findings/notes`).set(as(w.users.owner)).send({ kind: 'back-rise', direction: 'add', body: 'Added 3/4 in at the back crotch point in draft 2.' });
    expect(note.status).toBe(201);
    expect(note.body.notes).toEqual([expect.objectContaining({ author: w.users.owner.name, body: 'Added 3/4 in at the back crotch point in draft 2.' })]);
    const empty = await request(t.app).post(`${base()}/findings/notes`).set(as(w.users.owner)).send({ kind: 'back-rise', direction: 'add', body: '  ' });
    expect(empty.status).toBe(400);
    expect(empty.body.error.fields.body).toMatch(/Write the note/);

    // Open again: the draft number goes with the "fixed" state.
    const reopened = await request(t.app).put(`${base()}/findings/triage`).set(as(w.users.coordinator)).send({ kind: 'back-rise', direction: 'add', state: 'will-fix', fixedInDraft: 3 });
    expect(reopened.body.triage).toMatchObject({ state: 'will-fix', fixedInDraft: null, updatedBy: w.users.coordinator.name });
    const listed = await request(t.app).get(`${base()}/findings`).set(as(w.users.grader));
    expect(backRise(listed.body)).toMatchObject({ triage: { state: 'will-fix' }, notes: [expect.objectContaining({ body: expect.stringMatching(/draft 2/) })] });

    expect((await request(t.app).put(`${base()}/findings/triage`).set(as(w.users.tester)).send({ kind: 'back-rise', direction: 'add', state: 'open' })).status).toBe(403);
  });

  it('classifies with the studio’s own thresholds, which only the owner changes', async () => {
    const settings = `/api/studios/${w.studio.id}`;
    expect((await request(t.app).patch(settings).set(as(w.users.coordinator)).send({ settings: { analysis: { draftWideMinLowerBound: 0.99 } } })).status).toBe(403);
    const bad = await request(t.app).patch(settings).set(as(w.users.owner)).send({ settings: { analysis: { alpha: 2, draftWideMinLowerBound: 0.99 } } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields['settings.analysis.alpha']).toMatch(/at most 0.2/);
    const unknown = await request(t.app).patch(settings).set(as(w.users.owner)).send({ settings: { analysis: { luck: 1 } } });
    expect(unknown.status).toBe(400);
    expect(JSON.stringify(unknown.body.error)).toMatch(/luck: not a threshold/);

    const strict = await request(t.app).patch(settings).set(as(w.users.owner)).send({ settings: { analysis: { draftWideMinLowerBound: 0.99 } } });
    expect(strict.status).toBe(200);
    expect(strict.body.settings.analysis).toEqual({ draftWideMinLowerBound: 0.99 });
    const stricter = await request(t.app).get(`${base()}/findings`).set(as(w.users.grader));
    expect(backRise(stricter.body)?.class).not.toBe('draft-wide');
    expect(stricter.body.snapshot.thresholds.draftWideMinLowerBound).toBe(0.99);

    const reset = await request(t.app).patch(settings).set(as(w.users.owner)).send({ settings: { analysis: { draftWideMinLowerBound: null } } });
    expect(reset.body.settings.analysis).toEqual({});
    expect(backRise((await request(t.app).get(`${base()}/findings`).set(as(w.users.grader))).body)?.class).toBe('draft-wide');
  });

  it('lets a coordinator read an "other" alteration as a kind, and the findings follow', async () => {
    const list = await request(t.app).get(`${base()}/other-alterations`).set(as(w.users.coordinator));
    expect(list.status).toBe(200);
    expect(list.body.items).toEqual([{ text: 'Took in the BACK waist seam', reports: 1, amountsMm: [-12], kind: null }]);
    expect(list.body.kinds.map((k: { key: string }) => k.key)).toContain('waist');
    expect(list.body.kinds.map((k: { key: string }) => k.key)).not.toContain('bust');
    const before = await request(t.app).get(`${base()}/findings`).set(as(w.users.grader));
    expect(before.body.result.findings.map((f: { kind: string }) => f.kind)).toContain('other: Took in the BACK waist seam');

    expect((await request(t.app).put(`${base()}/other-alterations`).set(as(w.users.grader)).send({ text: 'took in the back waist seam', kind: 'waist' })).status).toBe(403);
    const wrong = await request(t.app).put(`${base()}/other-alterations`).set(as(w.users.coordinator)).send({ text: 'took in the back waist seam', kind: 'bust' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.fields.kind).toMatch(/not an alteration of this garment/);

    // Case and spacing aside, the same words.
    const mapped = await request(t.app).put(`${base()}/other-alterations`).set(as(w.users.coordinator)).send({ text: 'took in the back   waist seam', kind: 'waist' });
    expect(mapped.status).toBe(200);
    expect(mapped.body.items[0].kind).toBe('waist');
    const after = await request(t.app).get(`${base()}/findings`).set(as(w.users.grader));
    const kinds = after.body.result.findings.map((f: { kind: string; direction: string }) => `${f.kind} ${f.direction}`);
    expect(kinds).toContain('waist remove');
    expect(kinds.some((k: string) => k.startsWith('other:'))).toBe(false);

    await request(t.app).put(`${base()}/other-alterations`).set(as(w.users.coordinator)).send({ text: 'Took in the back waist seam', kind: null });
    const forgotten = await request(t.app).get(`${base()}/findings`).set(as(w.users.grader));
    expect(forgotten.body.result.findings.map((f: { kind: string }) => f.kind)).toContain('other: Took in the BACK waist seam');
  });

  it('a finding marked "will fix" gets its change per size, on screen and as CSV in the reader\'s unit', async () => {
    await request(t.app).put(`${base()}/findings/triage`).set(as(w.users.grader)).send({ kind: 'back-rise', direction: 'add', state: 'open' }).expect(200);
    const none = await request(t.app).get(`${base()}/findings/changes.csv`).set(as(w.users.grader));
    expect(none.status).toBe(200);
    expect(none.text.trim().split('\r\n')).toHaveLength(1); // the header alone: nothing marked "will fix"
    await request(t.app).put(`${base()}/findings/triage`).set(as(w.users.grader)).send({ kind: 'back-rise', direction: 'add', state: 'will-fix' }).expect(200);
    const json = await request(t.app).get(`${base()}/findings`).set(as(w.users.grader));
    const rows = json.body.result.changes.filter((c: { kind: string }) => c.kind === 'back-rise');
    expect(rows.map((c: { size: string }) => c.size)).toEqual(['8', '10', '12']);
    // Draft-wide: the median of the amounts (here nine of 3/4 in and one of 20 mm) at every size.
    for (const row of rows) expect(row).toMatchObject({ basis: 'median', amountMm: 0.75 * IN });
    // The grader reads inches (the account default): 3/4 in, and the millimetres beside it.
    const csv = await request(t.app).get(`${base()}/findings/changes.csv`).set(as(w.users.grader));
    expect(csv.status).toBe(200);
    expect(csv.headers['content-type']).toMatch(/text\/csv/);
    expect(csv.headers['content-disposition']).toMatch(/draft-changes\.csv/);
    const lines = csv.text.trim().split('\r\n');
    expect(lines[0]).toBe('draft,finding,class,size,change,from,to,change_mm,from_mm,to_mm,basis,extrapolated,note');
    expect(lines.slice(1).filter((l) => l.startsWith('1,"Back crotch length, added",draft-wide,'))).toHaveLength(3);
    expect(lines[1]).toMatch(/^1,"Back crotch length, added",draft-wide,8,3\/4 in,/);
    expect(lines[1]).toContain(',19,19,19,median,no,'); // 3/4 in = 19.05 mm, to a tenth
    // A tester is not staff: no change table for them.
    const tester = await createUser('triage-outsider');
    expect((await request(t.app).get(`${base()}/findings/changes.csv`).set(as(tester))).status).toBe(404);
  });
});

describe('which report speaks for a tester in each draft', () => {
  const report = (stage: 'check-in' | 'final', draftVersion: number, submitted = true) =>
    Report.build({ enrollmentId: 'x', stage, content: { draftVersion }, submittedAt: submitted ? new Date() : null });

  it('takes the final report of a draft over the check-in of the same draft, and skips unsubmitted ones', () => {
    const checkIn1 = report('check-in', 1);
    const final2 = report('final', 2);
    expect(reportsPerDraft([checkIn1, final2])).toEqual([checkIn1, final2]);
    const final1 = report('final', 1);
    expect(reportsPerDraft([final1, checkIn1])).toEqual([final1]);
    expect(reportsPerDraft([checkIn1, final1])).toEqual([final1]);
    expect(reportsPerDraft([report('final', 1, false), checkIn1])).toEqual([checkIn1]);
    expect(reportsPerDraft([report('check-in', 1, false)])).toEqual([]);
  });
});
