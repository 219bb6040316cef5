import Papa from 'papaparse';
import request from 'supertest';
import { Application, Draft, DraftDownload, DraftFile, Enrollment, Membership, Milestone, Pattern, PatternSize, Report, Trial } from '../../../db/models';
import { addMember, bearer, createStudioWorld, createUser, enrolTester, type StudioWorld } from '../../support/factories';
import { firstLink, messagesTo } from '../../support/inbox';
import { buildTestApp, type TestApp } from '../../support/test-app';

const DAY = 86_400_000;
/** Cells a spreadsheet would run as formulas (OWASP, "CSV Injection"); the address is invented. */
const FORMULA = '=HYPERLINK("http://evil.example.test/x","Click me")';

describe('object-level access between studios and testers', () => {
  let t: TestApp;
  let w: StudioWorld;
  const as = (user: Parameters<typeof bearer>[0]) => ({ Authorization: bearer(user, t.config) });

  beforeAll(async () => {
    t = buildTestApp();
    w = await createStudioWorld();
  });
  afterAll(() => t.close());

  it("a studio cannot read another studio's draft history through its own studio's address (404, nothing of it returned)", async () => {
    const theirs = await Pattern.create({ studioId: w.otherStudio.id, name: 'Secret coat', category: 'coat', fabricKind: 'woven', bodyColumns: [] });
    const draft = await Draft.create({ patternId: theirs.id, version: 1, changeNote: 'Confidential change: sleeve cap lowered', createdById: w.users.otherOwner.id });
    const file = await DraftFile.create({ draftId: draft.id, kind: 'print-a4', originalName: 'secret-coat-a4.pdf', objectKey: 'drafts/x.pdf', bytes: 10 });
    await DraftDownload.create({ draftFileId: file.id, userId: w.users.otherTester.id });

    const res = await request(t.app).get(`/api/studios/${w.studio.id}/patterns/${theirs.id}/drafts`).set(as(w.users.owner));
    expect(res.status).toBe(404);
    expect(JSON.stringify(res.body)).not.toMatch(/Confidential|secret-coat|Test other-tester/);
    // Their own staff still read it through their own studio.
    const own = await request(t.app).get(`/api/studios/${w.otherStudio.id}/patterns/${theirs.id}/drafts`).set(as(w.users.otherOwner));
    expect(own.status).toBe(200);
    expect(own.body[0].changeNote).toBe('Confidential change: sleeve cap lowered');
  });

  it('both CSV exports turn cells that start with = + - @ into text, and the chart import reads them back', async () => {
    const pattern = await Pattern.create({ studioId: w.studio.id, name: 'Shift dress', category: 'dress', fabricKind: 'woven', bodyColumns: ['hip'] });
    const size = await PatternSize.create({ patternId: pattern.id, label: '@SUM(1)', position: 0, bodyMm: { hip: 1000 } });
    const trial = await Trial.create({
      studioId: w.studio.id,
      patternId: pattern.id,
      slug: `csv-${Date.now()}`,
      title: 'Shift dress',
      state: 'running',
      coverage: { sizes: [{ sizeId: size.id, target: 3 }], heightBands: [], variants: [] },
    });
    const tester = await createUser('csv', { name: FORMULA });
    const { enrollment } = await enrolTester(trial.id, tester.id, size.id);
    await Report.create({
      enrollmentId: enrollment.id,
      stage: 'final',
      submittedAt: new Date(),
      content: {
        sizeSewn: '+1',
        draftVersion: 1,
        fit: { hip: 0 },
        verdict: 'ok',
        alterations: [{ area: 'hip', kind: 'other', otherText: '-2+3', amountMm: -12.7, where: 'both', note: '=1+2\ncmd' }],
      },
    });

    const csv = await request(t.app).get(`/api/studios/${w.studio.id}/trials/${trial.id}/reports.csv`).set(as(w.users.owner));
    expect(csv.status).toBe(200);
    const rows = Papa.parse<Record<string, string>>(csv.text, { header: true, skipEmptyLines: true }).data;
    expect(rows).toHaveLength(1);
    expect(rows[0].tester).toBe(`'${FORMULA}`);
    expect(rows[0].size).toBe("'@SUM(1)");
    expect(rows[0].size_sewn).toBe("'+1");
    expect(rows[0].kind).toBe('other: -2+3'); // starts with a letter: left alone
    expect(rows[0].note).toBe("'=1+2\ncmd");
    expect(rows[0].amount_mm).toBe('-12.7'); // a number stays a number
    for (const [column, cell] of Object.entries(rows[0])) if (column !== 'amount_mm') expect(cell).not.toMatch(/^[=+\-@\t\r]/);

    const chart = await request(t.app).get(`/api/studios/${w.studio.id}/patterns/${pattern.id}/chart.csv`).set(as(w.users.owner));
    expect(chart.status).toBe(200);
    expect(Papa.parse<string[]>(chart.text).data[1][0]).toBe("'@SUM(1)");
    const back = await request(t.app)
      .post(`/api/studios/${w.studio.id}/patterns/${pattern.id}/chart.csv`)
      .set(as(w.users.owner))
      .set('Content-Type', 'text/csv')
      .send(chart.text);
    expect(back.status).toBe(200);
    expect(back.body.chart.sizes.map((s: { label: string }) => s.label)).toEqual(['@SUM(1)']);
  });

  it("staff do not see a tester's report until the tester submits it", async () => {
    const pattern = await Pattern.create({ studioId: w.studio.id, name: 'Vest', category: 'top', fabricKind: 'woven', bodyColumns: ['chest'] });
    const size = await PatternSize.create({ patternId: pattern.id, label: 'S', position: 0, bodyMm: { chest: 900 } });
    const trial = await Trial.create({ studioId: w.studio.id, patternId: pattern.id, slug: `unsub-${Date.now()}`, title: 'Vest', state: 'running', coverage: { sizes: [{ sizeId: size.id, target: 3 }], heightBands: [], variants: [] } });
    await Milestone.create({ trialId: trial.id, kind: 'final-report', dueAt: new Date(Date.now() + 5 * DAY) });
    const writer = await createUser('writer');
    const { enrollment } = await enrolTester(trial.id, writer.id, size.id);
    await request(t.app).put(`/api/me/enrollments/${enrollment.id}/reports/final`).set(as(writer)).send({ baseVersion: 0, changes: { verdict: 'first thoughts, not ready to share' } }).expect(200);

    const list = await request(t.app).get(`/api/studios/${w.studio.id}/trials/${trial.id}/reports`).set(as(w.users.grader));
    expect(list.status).toBe(200);
    expect(list.body).toEqual([]);
    const csv = await request(t.app).get(`/api/studios/${w.studio.id}/trials/${trial.id}/reports.csv`).set(as(w.users.grader));
    expect(csv.text).not.toContain('not ready to share');

    await request(t.app).put(`/api/me/enrollments/${enrollment.id}/reports/final`).set(as(writer)).send({ baseVersion: 1, changes: { sizeSewn: 'S', draftVersion: 1, fit: { chest: 0 }, verdict: 'Fits well' } }).expect(200);
    await request(t.app).post(`/api/me/enrollments/${enrollment.id}/reports/final/submit`).set(as(writer)).expect(200);
    const after = await request(t.app).get(`/api/studios/${w.studio.id}/trials/${trial.id}/reports`).set(as(w.users.grader));
    expect(after.body.map((r: { content: { verdict: string } }) => r.content.verdict)).toEqual(['Fits well']);
  });

  it('a declined tester leaves the studio, and selecting them again makes their enrolment active again', async () => {
    const pattern = await Pattern.create({ studioId: w.studio.id, name: 'Skirt', category: 'skirt', fabricKind: 'woven', bodyColumns: ['hip'] });
    const size = await PatternSize.create({ patternId: pattern.id, label: '12', position: 0, bodyMm: { hip: 1000 } });
    const trial = await Trial.create({ studioId: w.studio.id, patternId: pattern.id, slug: `redecide-${Date.now()}`, title: 'Skirt', state: 'running', coverage: { sizes: [{ sizeId: size.id, target: 2 }], heightBands: [], variants: [] } });
    const person = await createUser('redecided');
    const { application } = await enrolTester(trial.id, person.id, size.id);
    await addMember(w.studio, person, 'tester');
    const decide = (status: string) =>
      request(t.app).post(`/api/studios/${w.studio.id}/trials/${trial.id}/decisions`).set(as(w.users.coordinator)).send({ applicationIds: [application.id], status });

    expect((await decide('declined')).status).toBe(200);
    expect((await Enrollment.findOne({ where: { applicationId: application.id } }))!.status).toBe('dropped');
    expect(await Membership.count({ where: { studioId: w.studio.id, userId: person.id } })).toBe(0);
    // No longer a member: the studio is not theirs to open.
    expect((await request(t.app).get(`/api/studios/${w.studio.id}`).set(as(person))).status).toBe(404);

    expect((await decide('selected')).status).toBe(200);
    expect((await Application.findByPk(application.id))!.status).toBe('selected');
    expect((await Enrollment.findOne({ where: { applicationId: application.id } }))!.status).toBe('active');
    expect(await Membership.count({ where: { studioId: w.studio.id, userId: person.id, role: 'tester' } })).toBe(1);
  });
});

describe('password reset links', () => {
  let t: TestApp;
  beforeAll(() => {
    t = buildTestApp();
  });
  afterAll(() => t.close());

  it("using one reset link spends the account's other open links", async () => {
    const user = await createUser('tworesets');
    await request(t.app).post('/api/auth/password-reset').send({ email: user.email }).expect(202);
    await request(t.app).post('/api/auth/password-reset').send({ email: user.email }).expect(202);
    let tokens: string[] = [];
    for (let i = 0; i < 100 && tokens.length < 2; i += 1) {
      if (i) await new Promise((r) => setTimeout(r, 100));
      tokens = (await messagesTo(user.email)).map((m) => new URL(firstLink(m.text, '/reset-password')).searchParams.get('token')!);
    }
    expect(tokens).toHaveLength(2);
    expect((await request(t.app).post('/api/auth/password-reset/confirm').send({ token: tokens[0], password: 'the first new password' })).status).toBe(200);
    const second = await request(t.app).post('/api/auth/password-reset/confirm').send({ token: tokens[1], password: 'a second new password' });
    expect(second.status).toBe(400);
    expect(second.body.error.fields.token).toMatch(/expired or was used/);
  });
});
