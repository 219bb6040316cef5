import request from 'supertest';
import { Announcement, Application, Milestone, OutboxMessage, PoolInvitation, Trial } from '../../../db/models';
import { bearer, createUser, enrolTester } from '../../support/factories';
import { createReleaseWorld, type ReleaseWorld } from '../../support/release-world';
import { startMailHarness, type MailHarness } from './mail-support';

let h: MailHarness;
let w: ReleaseWorld;
beforeAll(async () => {
  h = await startMailHarness();
  w = await createReleaseWorld(h.t.storage, 'Pool');
});
afterAll(() => h.close());

const as = (user: Parameters<typeof bearer>[0]) => ({ Authorization: bearer(user, h.t.config) });
const trialPath = (trialId = w.trial.id) => `/api/studios/${w.studio.id}/trials/${trialId}`;
const poolPath = () => `/api/studios/${w.studio.id}/pool`;

describe('announcements', () => {
  it('need the studio’s contact address, which every copy carries as Reply-To', async () => {
    const refused = await request(h.t.app).post(`${trialPath()}/announcements`).set(as(w.coordinator)).send({ subject: 'Fabric tip', body: 'Pre-wash linen.', statuses: ['active'] });
    expect(refused.status).toBe(409);
    expect(refused.body.error.fields).toEqual({ replyTo: 'the studio has no contact address' });
    expect(await Announcement.count({ where: { trialId: w.trial.id } })).toBe(0);

    const badAddress = await request(h.t.app).patch(`/api/studios/${w.studio.id}`).set(as(w.owner)).send({ settings: { contactEmail: 'not an address' } });
    expect(badAddress.status).toBe(400);
    expect(Object.keys(badAddress.body.error.fields)).toEqual(['settings.contactEmail']);
    const set = await request(h.t.app).patch(`/api/studios/${w.studio.id}`).set(as(w.owner)).send({ settings: { contactEmail: 'hello@pool-studio.test' } });
    expect(set.body.settings.contactEmail).toBe('hello@pool-studio.test');
  });

  it('go to the chosen testers only (finished, size 12 here), are kept on the trial and shown to them in My trials', async () => {
    const size12 = w.sizes[2].id;
    const res = await request(h.t.app)
      .post(`${trialPath()}/announcements`)
      .set(as(w.coordinator))
      .send({ subject: 'Launch date', body: 'The pattern launches on Friday.\n\nThank you all!', statuses: ['finished'], sizeIds: [size12] });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ subject: 'Launch date', recipients: 2, replyTo: 'hello@pool-studio.test', mail: { sent: 2, failed: 0 } });
    const chosen = w.finishers.filter((f) => f.enrollment.sizeId === size12);
    expect(chosen).toHaveLength(2);
    for (const f of chosen) {
      const [mail] = h.capture.to(f.user.email).filter((m) => m.subject.startsWith('Launch date'));
      expect(mail.subject).toBe(`Launch date (${w.trial.title})`);
      expect(mail.headers['reply-to']).toBe('Reply-To: hello@pool-studio.test');
      expect(mail.text).toContain('The pattern launches on Friday.');
      const mine = await request(h.t.app).get('/api/me/announcements').set(as(f.user));
      expect(mine.body).toEqual([expect.objectContaining({ trialId: w.trial.id, subject: 'Launch date', body: 'The pattern launches on Friday.\n\nThank you all!', replyTo: 'hello@pool-studio.test' })]);
    }
    // The size-12 tester who did not finish, and the other sizes, got nothing.
    expect(h.capture.to(w.straggler.user.email).filter((m) => m.subject.startsWith('Launch date'))).toEqual([]);
    expect(h.capture.to(w.finishers[0].user.email).filter((m) => m.subject.startsWith('Launch date'))).toEqual([]);
    expect((await request(h.t.app).get('/api/me/announcements').set(as(w.finishers[0].user))).body).toEqual([]);
    const list = await request(h.t.app).get(`${trialPath()}/announcements`).set(as(w.grader));
    expect(list.body.map((a: { subject: string }) => a.subject)).toEqual(['Launch date']);
  });

  it('refuse an empty audience and a size of another pattern, naming the field', async () => {
    const none = await request(h.t.app).post(`${trialPath()}/announcements`).set(as(w.coordinator)).send({ subject: 'Anyone?', body: 'Hello', statuses: ['dropped'] });
    expect(none.status).toBe(400);
    expect(none.body.error.fields).toEqual({ statuses: 'no tester matches' });
    const foreign = await request(h.t.app).post(`${trialPath()}/announcements`).set(as(w.coordinator)).send({ subject: 'Hello', body: 'Hi', statuses: ['active'], sizeIds: [w.trial.id] });
    expect(foreign.body.error.fields).toEqual({ 'sizeIds.0': 'is not a size of the pattern' });
    const empty = await request(h.t.app).post(`${trialPath()}/announcements`).set(as(w.coordinator)).send({ subject: 'Hi', body: '', statuses: [] });
    expect(Object.keys(empty.body.error.fields).sort()).toEqual(['body', 'statuses', 'subject']);
  });
});

describe('the tester pool', () => {
  it('lists the studio’s testers with sizes, height band, reports on time and trials finished, and filters them', async () => {
    const res = await request(h.t.app).get(poolPath()).set(as(w.coordinator));
    expect(res.status).toBe(200);
    expect(res.body).toHaveLength(9);
    const first = res.body.find((p: { userId: string }) => p.userId === w.finishers[0].user.id);
    // Their final report came on time; the toile check-in, due ten days ago, never came.
    expect(first).toMatchObject({ sizes: ['8'], trialsFinished: 1, reports: { onTime: 1, late: 0, missed: 1 }, allOnTime: false, heightBand: { id: 'under-160' } });
    expect(first.heightMm).toBeUndefined();
    const straggler = res.body.find((p: { userId: string }) => p.userId === w.straggler.user.id);
    expect(straggler).toMatchObject({ trialsFinished: 0, allOnTime: false });

    const size10 = await request(h.t.app).get(poolPath()).query({ size: '10', minFinished: 1 }).set(as(w.coordinator));
    expect(size10.body.map((p: { sizes: string[] }) => p.sizes)).toEqual([['10'], ['10'], ['10']]);
    const tall = await request(h.t.app).get(poolPath()).query({ band: '180-up' }).set(as(w.coordinator));
    // Heights 1550 + 40 × i mm: testers 7 and 9 are 1830 and 1870 mm.
    expect(tall.body.map((p: { name: string }) => p.name).sort()).toEqual(['Pool Tester 8', 'Pool Tester 9']);
    const bad = await request(h.t.app).get(poolPath()).query({ band: 'giant' }).set(as(w.coordinator));
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(['band']);
  });

  it('invites chosen people to an open call once each; they still apply themselves', async () => {
    const call = await Trial.create({ studioId: w.studio.id, patternId: w.pattern.id, slug: `pool-call-${Date.now()}`, title: 'Pool trousers, second round', state: 'open', coverage: w.trial.coverage });
    await Milestone.create({ trialId: call.id, kind: 'applications-close', dueAt: new Date(Date.now() + 10 * 86_400_000) });
    const chosen = [w.finishers[0].user, w.finishers[1].user];
    const res = await request(h.t.app).post(`${poolPath()}/invitations`).set(as(w.coordinator)).send({ trialId: call.id, userIds: chosen.map((u) => u.id) });
    expect(res.body).toMatchObject({ invited: 2, sent: 2, alreadyInvited: 0 });
    for (const u of chosen) {
      const mail = h.capture.to(u.email).filter((m) => m.subject === 'Invitation to apply: Pool trousers, second round');
      expect(mail).toHaveLength(1);
      expect(mail[0].text).toContain(`http://basted.test/call/${call.slug}`);
    }
    const again = await request(h.t.app).post(`${poolPath()}/invitations`).set(as(w.coordinator)).send({ trialId: call.id, userIds: chosen.map((u) => u.id) });
    expect(again.body).toMatchObject({ invited: 0, alreadyInvited: 2, sent: 0 });
    for (const u of chosen) expect(h.capture.to(u.email).filter((m) => m.subject.startsWith('Invitation to apply')).length).toBe(1);
    expect(await Application.count({ where: { trialId: call.id } })).toBe(0);

    const stranger = await createUser('not-in-pool');
    const refused = await request(h.t.app).post(`${poolPath()}/invitations`).set(as(w.coordinator)).send({ trialId: call.id, userIds: [stranger.id] });
    expect(refused.status).toBe(400);
    expect(refused.body.error.fields).toEqual({ 'userIds.0': 'is not in the studio’s tester pool' });
    const pool = await request(h.t.app).get(poolPath()).set(as(w.owner));
    expect(pool.body.find((p: { userId: string }) => p.userId === chosen[0].id).invitedTo).toEqual([expect.objectContaining({ trialId: call.id, title: 'Pool trousers, second round' })]);
  });
});

describe('copying a trial for a next round', () => {
  it('copies the call, targets and dates moved by the days asked, as a draft; its finishers are invited when the new call opens', async () => {
    const source = await Trial.findByPk(w.trial.id, { include: ['milestones'] });
    const res = await request(h.t.app).post(`${trialPath()}/copy`).set(as(w.coordinator)).send({ title: 'Pool trousers, third round', shiftDays: 45, inviteFinishers: true });
    expect(res.status).toBe(201);
    expect(res.body.invitationsWaiting).toBe(8);
    const copy = res.body.trial;
    expect(copy).toMatchObject({ title: 'Pool trousers, third round', state: 'draft', callText: source!.callText, requirements: source!.requirements, coverage: source!.coverage, copiedFromId: source!.id });
    for (const m of source!.milestones!) {
      const moved = copy.milestones.find((x: { kind: string }) => x.kind === m.kind);
      expect(new Date(moved.dueAt).getTime() - m.dueAt.getTime()).toBe(45 * 86_400_000);
    }
    expect(h.capture.messages.filter((m) => m.subject.includes('third round'))).toEqual([]);

    const opened = await request(h.t.app).patch(trialPath(copy.id)).set(as(w.coordinator)).send({ state: 'open' });
    expect(opened.status).toBe(200);
    for (const f of w.finishers) expect(h.capture.to(f.user.email).filter((m) => m.subject === 'Invitation to apply: Pool trousers, third round')).toHaveLength(1);
    expect(h.capture.to(w.straggler.user.email).filter((m) => m.subject.includes('third round'))).toEqual([]);
    expect(await PoolInvitation.count({ where: { trialId: copy.id, sentAt: null } })).toBe(0);
    // Opening again (a later edit) sends nothing twice.
    await request(h.t.app).patch(trialPath(copy.id)).set(as(w.coordinator)).send({ requirements: 'Any drapey woven.' });
    expect(await OutboxMessage.count({ where: { trialId: copy.id } })).toBe(8);

    const bad = await request(h.t.app).post(`${trialPath()}/copy`).set(as(w.coordinator)).send({ title: 'x', shiftDays: 1.5 });
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['shiftDays', 'title']);
  });

  it('an invitation to a tester who already applied is not sent', async () => {
    const call = await Trial.create({ studioId: w.studio.id, patternId: w.pattern.id, slug: `pool-applied-${Date.now()}`, title: 'Pool applied call', state: 'open', coverage: w.trial.coverage });
    const user = w.finishers[2].user;
    await enrolTester(call.id, user.id, w.sizes[0].id);
    const res = await request(h.t.app).post(`${poolPath()}/invitations`).set(as(w.coordinator)).send({ trialId: call.id, userIds: [user.id] });
    expect(res.body).toMatchObject({ invited: 0, alreadyApplied: 1, sent: 0 });
  });
});
