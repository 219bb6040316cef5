import request from 'supertest';
import { Application, Enrollment, Membership, Trial } from '../../../db/models';
import { bearer, createStudioWorld, createUser, type StudioWorld } from '../../support/factories';
import { waitForMessage } from '../../support/inbox';
import { buildTestApp, type TestApp } from '../../support/test-app';

const IN = 25.4;
const DAY = 24 * 3600 * 1000;

describe('trials: call, applications, coverage, selection, enrollments', () => {
  let t: TestApp;
  let w: StudioWorld;
  let sizes: { id: string; label: string }[];
  let patternId: string;
  const as = (user: Parameters<typeof bearer>[0]) => ({ Authorization: bearer(user, t.config) });
  const staff = (who: keyof StudioWorld['users']) => as(w.users[who]);

  beforeAll(async () => {
    t = buildTestApp();
    w = await createStudioWorld();
    const base = `/api/studios/${w.studio.id}/patterns`;
    const p = await request(t.app).post(base).set(staff('owner')).send({ name: 'Pleated trousers', category: 'trousers', fabricKind: 'woven' });
    patternId = p.body.id;
    const chart = await request(t.app)
      .put(`${base}/${patternId}/chart`)
      .set(staff('owner'))
      .send({
        draftedHeightMm: 66 * IN,
        bodyColumns: ['waist', 'hip'],
        finishedColumns: [],
        sizes: [10, 12, 14].map((n, i) => ({ label: String(n), bodyMm: { waist: (28 + 1.5 * i) * IN, hip: (38 + 1.5 * i) * IN } })),
        variants: [],
      });
    sizes = chart.body.chart.sizes;
  });
  afterAll(() => t.close());

  async function openTrial(targets: number[], closesInDays = 7) {
    const base = `/api/studios/${w.studio.id}/trials`;
    const created = await request(t.app)
      .post(base)
      .set(staff('coordinator'))
      .send({
        patternId,
        title: 'Pleated trousers, first round',
        callText: 'Looking for testers in sizes 10 to 14.',
        requirements: 'A woven with drape; photos front, side and back.',
        coverage: {
          sizes: sizes.map((s, i) => ({ sizeId: s.id, target: targets[i] })).filter((s) => s.target > 0),
          heightBands: [
            { id: 'petite', label: 'Under 160 cm', minMm: null, maxMm: 1600 },
            { id: 'regular', label: '160 cm and over', minMm: 1600, maxMm: null },
          ],
          variants: [],
        },
        milestones: {
          'applications-close': new Date(Date.now() + closesInDays * DAY).toISOString(),
          'toile-check-in': new Date(Date.now() + 14 * DAY).toISOString(),
          'final-report': new Date(Date.now() + 28 * DAY).toISOString(),
        },
      });
    expect(created.status).toBe(201);
    const opened = await request(t.app).patch(`${base}/${created.body.id}`).set(staff('coordinator')).send({ state: 'open' });
    expect(opened.status).toBe(200);
    return created.body as { id: string; slug: string };
  }

  async function applicant(hipIn: number, heightMm: number) {
    const user = await createUser('applicant');
    await request(t.app).patch('/api/me/profile').set(as(user)).send({ measurementsMm: { hip: hipIn * IN, waist: (hipIn - 10) * IN, height: heightMm } }).expect(200);
    return user;
  }
  const application = { plannedFabric: 'Viscose twill', experience: 'confident', deadlinesConfirmed: true, photoConsent: 'staff-only', sizeId: null };

  it('refuses coverage that names sizes of another pattern, naming the field', async () => {
    const res = await request(t.app)
      .post(`/api/studios/${w.studio.id}/trials`)
      .set(staff('coordinator'))
      .send({ patternId, title: 'Bad targets', coverage: { sizes: [{ sizeId: '00000000-0000-4000-8000-000000000000', target: 2 }], heightBands: [], variants: [] } });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ 'coverage.sizes.0.sizeId': 'is not a size of the pattern' });
  });

  it('a public call is readable without signing in; applying takes a snapshot and size advice, once per tester', async () => {
    const trial = await openTrial([1, 1, 1]);
    const call = await request(t.app).get(`/api/calls/${trial.slug}`);
    expect(call.status).toBe(200);
    expect(call.body).toMatchObject({ title: 'Pleated trousers, first round', accepting: true, studio: { name: 'Studio here' } });
    expect(call.body.sizes.map((s: { label: string }) => s.label)).toEqual(['10', '12', '14']);

    const tester = await applicant(39.5, 1700);
    const res = await request(t.app).post(`/api/calls/${trial.slug}/applications`).set(as(tester)).send(application);
    expect(res.status).toBe(201);
    // No size chosen: the advised size (hip 39 1/2 in → 12) is taken.
    expect(res.body.sizeId).toBe(sizes[1].id);
    const stored = await Application.findByPk(res.body.id);
    expect((stored!.profileSnapshot.measurementsMm as Record<string, number>).hip).toBeCloseTo(39.5 * IN, 9);
    await waitForMessage(tester.email, 'Application received');

    // A later profile change does not rewrite the snapshot.
    await request(t.app).patch('/api/me/profile').set(as(tester)).send({ measurementsMm: { hip: 44 * IN } }).expect(200);
    await stored!.reload();
    expect((stored!.profileSnapshot.measurementsMm as Record<string, number>).hip).toBeCloseTo(39.5 * IN, 9);

    const again = await request(t.app).post(`/api/calls/${trial.slug}/applications`).set(as(tester)).send(application);
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/applied to this call already/);

    const missing = await request(t.app).post(`/api/calls/${trial.slug}/applications`).set(as(tester)).send({ ...application, deadlinesConfirmed: false, plannedFabric: '' });
    expect(missing.status).toBe(400);
    expect(Object.keys(missing.body.error.fields).sort()).toEqual(['deadlinesConfirmed', 'plannedFabric']);
  });

  it('refuses dates out of order (applications close ≤ testers chosen ≤ check-in ≤ final report), naming each, and keeps the stored ones', async () => {
    const trial = await openTrial([1, 1, 1]);
    const url = `/api/studios/${w.studio.id}/trials/${trial.id}`;
    // Chosen before applications close, and the final report due before the check-in.
    const bad = await request(t.app)
      .patch(url)
      .set(staff('coordinator'))
      .send({ milestones: { selection: new Date(Date.now() + 2 * DAY).toISOString(), 'final-report': new Date(Date.now() + 10 * DAY).toISOString() } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toBe('The dates are out of order: each must come on or after the one before it.');
    expect(bad.body.error.fields).toEqual({
      'milestones.selection': expect.stringMatching(/^is before “Applications close” \(.* \(Europe\/Lisbon\)\): testers chosen must come on or after it$/),
      'milestones.final-report': expect.stringMatching(/^is before “Toile check-in due” /),
    });
    const stored = await request(t.app).get(url).set(staff('coordinator'));
    expect(stored.body.milestones.map((m: { kind: string }) => m.kind)).toEqual(['applications-close', 'toile-check-in', 'final-report']);
    // A new trial is checked the same way.
    const created = await request(t.app)
      .post(`/api/studios/${w.studio.id}/trials`)
      .set(staff('coordinator'))
      .send({ patternId: (await Trial.findByPk(trial.id))!.patternId, title: 'Backwards trial', milestones: { 'toile-check-in': '2027-03-10T18:00:00Z', 'final-report': '2027-03-01T18:00:00Z' } });
    expect(created.status).toBe(400);
    expect(Object.keys(created.body.error.fields)).toEqual(['milestones.final-report']);
    // In order (equal dates allowed): saved.
    const ok = await request(t.app).patch(url).set(staff('coordinator')).send({ milestones: { selection: new Date(Date.now() + 8 * DAY).toISOString(), 'drafts-out': new Date(Date.now() + 8 * DAY).toISOString() } });
    expect(ok.status).toBe(200);
  });

  it('refuses an application after the closing date with the date in words', async () => {
    const trial = await openTrial([1, 1, 1]);
    await request(t.app)
      .patch(`/api/studios/${w.studio.id}/trials/${trial.id}`)
      .set(staff('coordinator'))
      .send({ milestones: { 'applications-close': new Date(Date.now() - DAY).toISOString() } })
      .expect(200);
    const tester = await applicant(38, 1650);
    const res = await request(t.app).post(`/api/calls/${trial.slug}/applications`).set(as(tester)).send(application);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/^Applications closed on /);
  });

  it('the grid and the proposal agree with the stored applications; accepting selects within capacity and mails each tester', async () => {
    const trial = await openTrial([1, 1, 1]);
    const testers = [await applicant(38, 1550), await applicant(38, 1700), await applicant(39.5, 1700), await applicant(41, 1800)];
    for (const tester of testers) await request(t.app).post(`/api/calls/${trial.slug}/applications`).set(as(tester)).send(application).expect(201);

    const base = `/api/studios/${w.studio.id}/trials/${trial.id}`;
    const grid = await request(t.app).get(`${base}/coverage`).set(staff('coordinator'));
    expect(grid.status).toBe(200);
    const proposal = await request(t.app).post(`${base}/selection/proposal`).set(staff('coordinator'));
    expect(proposal.status).toBe(200);
    expect(proposal.body.picks).toHaveLength(3); // one per size, targets of 1
    expect(proposal.body.leftOut).toHaveLength(1);
    expect(proposal.body.leftOut[0].reason).toEqual(expect.any(String));

    const picks = proposal.body.picks.map((p: { applicantId: string }) => p.applicantId);
    const accepted = await request(t.app).post(`${base}/decisions`).set(staff('coordinator')).send({ applicationIds: picks, status: 'selected' });
    expect(accepted.status).toBe(200);
    expect(accepted.body.selected).toBe(3);
    expect(await Enrollment.count({ where: { trialId: trial.id, status: 'active' } })).toBe(3);

    const left = proposal.body.leftOut[0].applicantId;
    const over = await request(t.app).post(`${base}/decisions`).set(staff('coordinator')).send({ applicationIds: [left], status: 'selected' });
    expect(over.status).toBe(409);
    expect(Object.keys(over.body.error.fields)[0]).toMatch(/^size 10/);

    const waitlist = await request(t.app).post(`${base}/decisions`).set(staff('coordinator')).send({ applicationIds: [left], status: 'waitlisted' });
    expect(waitlist.status).toBe(200);

    // The grid agrees with the stored applications.
    const gridAfter = await request(t.app).get(`${base}/coverage`).set(staff('coordinator'));
    expect(gridAfter.body.totals.selected).toBe(await Application.count({ where: { trialId: trial.id, status: 'selected' } }));
    expect(gridAfter.body.totals.waitlisted).toBe(1);
    expect(gridAfter.body.totals.applicants).toBe(await Application.count({ where: { trialId: trial.id } }));
    for (const row of gridAfter.body.rows as { sizeId: string; selected: number; target: number }[]) {
      expect(row.selected).toBe(await Application.count({ where: { trialId: trial.id, status: 'selected', sizeId: row.sizeId } }));
      expect(row.selected).toBeLessThanOrEqual(row.target);
    }

    const chosen = await Application.findAll({ where: { trialId: trial.id, status: 'selected' } });
    const chosenUsers = testers.filter((u) => chosen.some((a) => a.userId === u.id));
    for (const u of chosenUsers) {
      const mail = await waitForMessage(u.email, 'You are testing');
      expect(mail.text).toMatch(/Final report due:/);
      // A selected tester joins the studio as a tester.
      expect((await Membership.findOne({ where: { studioId: w.studio.id, userId: u.id } }))!.role).toBe('tester');
    }
    const waitlisted = testers.find((u) => !chosenUsers.includes(u))!;
    await waitForMessage(waitlisted.email, 'On the waiting list');

    // My trials: the enrollment with the next due date and what it asks.
    const mine = await request(t.app).get('/api/me/trials').set(as(chosenUsers[0]));
    expect(mine.body[0]).toMatchObject({ status: 'selected', enrollment: { status: 'active' }, next: { kind: 'toile-check-in' } });
    expect(mine.body[0].next.expects).toMatch(/toile/);

    // More time for one tester moves only their date.
    const enrollment = await Enrollment.findOne({ where: { userId: chosenUsers[0].id, trialId: trial.id } });
    const later = new Date(Date.now() + 21 * DAY).toISOString();
    await request(t.app).patch(`${base}/enrollments/${enrollment!.id}/due`).set(staff('coordinator')).send({ kind: 'toile-check-in', dueAt: later }).expect(200);
    const after = await request(t.app).get('/api/me/trials').set(as(chosenUsers[0]));
    expect(after.body[0].next).toMatchObject({ kind: 'toile-check-in', extended: true, dueAt: later });
    const roster = await request(t.app).get(`${base}/enrollments`).set(staff('coordinator'));
    expect(roster.body).toHaveLength(3);
    const extended = roster.body.find((e: { id: string }) => e.id === enrollment!.id);
    expect(extended.dues.find((d: { kind: string }) => d.kind === 'toile-check-in')).toMatchObject({ extended: true, dueAt: later });
    expect(roster.body.filter((e: { dues: { extended: boolean }[] }) => e.dues.some((d) => d.extended))).toHaveLength(1);
  });

  it('a full size cannot be over-filled by two coordinators selecting at the same moment', async () => {
    const trial = await openTrial([1, 0, 0]);
    const a = await applicant(38, 1650);
    const b = await applicant(38, 1700);
    const ids: string[] = [];
    for (const u of [a, b]) ids.push((await request(t.app).post(`/api/calls/${trial.slug}/applications`).set(as(u)).send({ ...application, sizeId: sizes[0].id })).body.id);
    const base = `/api/studios/${w.studio.id}/trials/${trial.id}/decisions`;
    const [r1, r2] = await Promise.all([
      request(t.app).post(base).set(staff('coordinator')).send({ applicationIds: [ids[0]], status: 'selected' }),
      request(t.app).post(base).set(staff('owner')).send({ applicationIds: [ids[1]], status: 'selected' }),
    ]);
    expect([r1.status, r2.status].sort()).toEqual([200, 409]);
    expect(await Application.count({ where: { trialId: trial.id, status: 'selected' } })).toBe(1);
  });

  it('a withdrawal frees the seat and offers it to the best waitlisted applicant of that size', async () => {
    const trial = await openTrial([1, 0, 0]);
    const first = await applicant(38, 1650);
    const second = await applicant(38, 1660);
    const [idA, idB] = [
      (await request(t.app).post(`/api/calls/${trial.slug}/applications`).set(as(first)).send({ ...application, sizeId: sizes[0].id })).body.id,
      (await request(t.app).post(`/api/calls/${trial.slug}/applications`).set(as(second)).send({ ...application, sizeId: sizes[0].id })).body.id,
    ];
    const base = `/api/studios/${w.studio.id}/trials/${trial.id}/decisions`;
    await request(t.app).post(base).set(staff('coordinator')).send({ applicationIds: [idA], status: 'selected' }).expect(200);
    await request(t.app).post(base).set(staff('coordinator')).send({ applicationIds: [idB], status: 'waitlisted' }).expect(200);

    const out = await request(t.app).post(`/api/me/applications/${idA}/withdraw`).set(as(first));
    expect(out.status).toBe(200);
    expect(out.body).toMatchObject({ status: 'withdrawn', seatOffered: true });
    expect((await Application.findByPk(idB))!.status).toBe('selected');
    await waitForMessage(second.email, 'You are testing');
    // Someone else's application cannot be withdrawn: it is not found.
    expect((await request(t.app).post(`/api/me/applications/${idB}/withdraw`).set(as(first))).status).toBe(404);
  });

  it('a draft trial has no public call', async () => {
    const created = await request(t.app)
      .post(`/api/studios/${w.studio.id}/trials`)
      .set(staff('coordinator'))
      .send({ patternId, title: 'Secret draft' });
    expect((await request(t.app).get(`/api/calls/${created.body.slug}`)).status).toBe(404);
  });
});
