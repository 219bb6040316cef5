import request from 'supertest';
import { OutboxMessage, RewardCode, Trial } from '../../../db/models';
import { bearer, createUser } from '../../support/factories';
import { addDraft, createReleaseWorld, type ReleaseWorld } from '../../support/release-world';
import { startMailHarness, type MailHarness } from './mail-support';

let h: MailHarness;
beforeAll(async () => {
  h = await startMailHarness();
});
afterAll(() => h.close());

const as = (user: Parameters<typeof bearer>[0]) => ({ Authorization: bearer(user, h.t.config) });
const base = (w: ReleaseWorld) => `/api/studios/${w.studio.id}/trials/${w.trial.id}`;
type Item = { key: string; ok: boolean; detail: string; open: string[]; fix: { label: string; link: Record<string, string> } };
const itemOf = (body: { checklist: Item[] }, key: string) => body.checklist.find((i) => i.key === key)!;

/** Triage, a later draft, the gap accepted, the straggler excused and the final draft chosen. */
async function fixEverything(w: ReleaseWorld) {
  const triage = await request(h.t.app).put(`${base(w)}/findings/triage`).set(as(w.grader)).send({ kind: 'back-rise', direction: 'add', state: 'will-fix' });
  expect(triage.status).toBe(200);
  const { draft } = await addDraft(w, h.t.storage, 2, 'Back crotch lengthened by 3/4 in');
  const excuse = await request(h.t.app).patch(`${base(w)}/enrollments/${w.straggler.enrollment.id}/excuse`).set(as(w.coordinator)).send({ excused: true, note: 'Moved house' });
  expect(excuse.body).toMatchObject({ excused: true, excuseNote: 'Moved house' });
  const settings = await request(h.t.app).patch(`${base(w)}/release`).set(as(w.coordinator)).send({ finalDraftId: draft.id, coverageGapNote: 'Size 12 had two finishers; their fit agrees with the others.' });
  expect(settings.status).toBe(200);
  return { draft, settings };
}

describe('closing a trial', () => {
  it('lists each open item of the checklist with where to fix it, and refuses a release that leaves any unconfirmed, sending nothing', async () => {
    const w = await createReleaseWorld(h.t.storage, 'Open');
    const res = await request(h.t.app).get(`${base(w)}/release`).set(as(w.owner));
    expect(res.status).toBe(200);
    expect(res.body.ready).toBe(false);
    expect(res.body.checklist.map((i: Item) => [i.key, i.ok])).toEqual([
      ['findings-triaged', false],
      ['will-fix-drafted', true],
      ['coverage', false],
      ['testers-done', false],
      ['final-draft', false],
    ]);
    expect(itemOf(res.body, 'findings-triaged').open).toEqual(['Back crotch length, added (whole draft): still open']);
    expect(itemOf(res.body, 'findings-triaged').fix.link).toEqual({ screen: 'findings', trialId: w.trial.id });
    expect(itemOf(res.body, 'coverage').open).toEqual(['Size 12: 2 of 3 finished']);
    expect(itemOf(res.body, 'testers-done').open).toEqual([`${w.straggler.user.name}: no final report`]);
    expect(itemOf(res.body, 'final-draft').detail).toBe('Choose the final draft (the newest is draft 1).');

    const refused = await request(h.t.app).post(`${base(w)}/release`).set(as(w.owner)).send({ confirmOpenItems: ['coverage'] });
    expect(refused.status).toBe(409);
    expect(Object.keys(refused.body.error.fields).sort()).toEqual(['confirmOpenItems.final-draft', 'confirmOpenItems.findings-triaged', 'confirmOpenItems.testers-done']);
    expect((await Trial.findByPk(w.trial.id))!.releasedAt).toBeNull();
    expect(await OutboxMessage.count({ where: { trialId: w.trial.id } })).toBe(0);

    // "Will fix" with no later draft is an open item of its own.
    await request(h.t.app).put(`${base(w)}/findings/triage`).set(as(w.grader)).send({ kind: 'back-rise', direction: 'add', state: 'will-fix' });
    const after = await request(h.t.app).get(`${base(w)}/release`).set(as(w.grader));
    expect(itemOf(after.body, 'findings-triaged').ok).toBe(true);
    expect(itemOf(after.body, 'will-fix-drafted')).toMatchObject({ ok: false, open: ['Back crotch length, added: found in draft 1, no draft after it yet'] });
    expect(itemOf(after.body, 'will-fix-drafted').fix.link).toEqual({ screen: 'pattern', patternId: w.pattern.id });
  });

  it('when the checklist holds, releases: each finisher gets thanks with the final files and one reward code, the excused tester a closing note; a second release sends nothing twice', async () => {
    const w = await createReleaseWorld(h.t.storage, 'Ready');
    const bad = await request(h.t.app).post(`${base(w)}/reward-codes`).set(as(w.coordinator)).send({ csv: 'code\nTHANKS-01\n\nTHANKS 02\nTHANKS-01\n' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toEqual({ 'row 4': 'has spaces or characters a code cannot have', 'row 5': 'repeats the code of row 2' });
    expect(await RewardCode.count({ where: { trialId: w.trial.id } })).toBe(0);
    const codes = Array.from({ length: 10 }, (_, i) => `THANKS-${String(i + 1).padStart(2, '0')}`);
    const imported = await request(h.t.app).post(`${base(w)}/reward-codes`).set(as(w.coordinator)).send({ csv: `code\r\n${codes.join('\r\n')}\r\n` });
    expect(imported.status).toBe(201);
    expect(imported.body).toMatchObject({ added: 10, total: 10, assigned: 0 });

    const { draft } = await fixEverything(w);
    const status = await request(h.t.app).get(`${base(w)}/release`).set(as(w.owner));
    expect(status.body.checklist.filter((i: Item) => !i.ok)).toEqual([]);
    expect(status.body.ready).toBe(true);

    const released = await request(h.t.app).post(`${base(w)}/release`).set(as(w.owner)).send({});
    expect(released.status).toBe(200);
    expect(released.body.mail).toEqual({ thanks: 8, closing: 1, codes: { assigned: 8, sent: 8, missing: 0 } });
    const trial = (await Trial.findByPk(w.trial.id))!;
    expect(trial.releasedAt).not.toBeNull();
    expect(trial.state).toBe('closed');
    expect(trial.finalDraftId).toBe(draft.id);
    expect(trial.releaseOpenItems).toEqual([]);

    const given = new Set<string>();
    for (const f of w.finishers) {
      const mail = h.capture.to(f.user.email);
      expect(mail.map((m) => m.subject).sort()).toEqual([`Released, with thanks: ${w.trial.title}`, `Your reward code: ${w.trial.title}`]);
      expect(mail.find((m) => m.subject.startsWith('Released'))!.text).toContain('Draft 2 is the final pattern');
      const code = /THANKS-\d\d/.exec(mail.find((m) => m.subject.startsWith('Your reward'))!.text)![0];
      given.add(code);
    }
    expect(given.size).toBe(8);
    expect(h.capture.to(w.straggler.user.email).map((m) => m.subject)).toEqual([`Closing: ${w.trial.title}`]);

    const sentBefore = h.capture.messages.length;
    const rowsBefore = await OutboxMessage.count({ where: { trialId: w.trial.id } });
    const again = await request(h.t.app).post(`${base(w)}/release`).set(as(w.owner)).send({});
    expect(again.status).toBe(409);
    expect(again.body.error.fields).toEqual({ trial: 'released already' });
    const resend = await request(h.t.app).post(`${base(w)}/reward-codes/send`).set(as(w.owner));
    expect(resend.body.delivery).toEqual({ assigned: 0, sent: 0, missing: 0 });
    expect(await OutboxMessage.count({ where: { trialId: w.trial.id } })).toBe(rowsBefore);
    expect(h.capture.messages.length).toBe(sentBefore);
    expect(await RewardCode.count({ where: { trialId: w.trial.id, enrollmentId: null } })).toBe(2);
  });

  it('two releases at the same moment: one goes through, every finisher gets exactly one thank-you and one code', async () => {
    const w = await createReleaseWorld(h.t.storage, 'Race');
    await request(h.t.app).post(`${base(w)}/reward-codes`).set(as(w.owner)).send({ csv: Array.from({ length: 8 }, (_, i) => `RACE${i}`).join('\n') });
    await fixEverything(w);
    const [a, b] = await Promise.all([
      request(h.t.app).post(`${base(w)}/release`).set(as(w.owner)).send({}),
      request(h.t.app).post(`${base(w)}/release`).set(as(w.coordinator)).send({}),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    for (const f of w.finishers) expect(h.capture.to(f.user.email).length).toBe(2);
    expect(await RewardCode.count({ where: { trialId: w.trial.id, enrollmentId: null } })).toBe(0);
  });

  it('releases with open items when each is confirmed, and keeps them with the release', async () => {
    const w = await createReleaseWorld(h.t.storage, 'Confirmed');
    const res = await request(h.t.app)
      .post(`${base(w)}/release`)
      .set(as(w.coordinator))
      .send({ confirmOpenItems: ['findings-triaged', 'coverage', 'testers-done', 'final-draft'] });
    expect(res.status).toBe(200);
    expect(res.body.released.openItems.map((i: { key: string }) => i.key)).toEqual(['findings-triaged', 'coverage', 'testers-done', 'final-draft']);
    // No final draft: the finishers are thanked and told the files will follow.
    const thanks = h.capture.to(w.finishers[0].user.email).find((m) => m.subject.startsWith('Released'))!;
    expect(thanks.text).toContain('The final files will be in My trials as soon as the studio adds them.');
    // The not-yet-finished tester is no longer reminded: the trial is closed.
    expect(await OutboxMessage.count({ where: { trialId: w.trial.id, category: 'reminders', status: 'queued' } })).toBe(0);
  });

  it('codes imported after the release go to the finishers still without one, once each, and say when there are too few', async () => {
    const w = await createReleaseWorld(h.t.storage, 'Late');
    await request(h.t.app).post(`${base(w)}/reward-codes`).set(as(w.owner)).send({ csv: 'LATE-A\nLATE-B\nLATE-C' });
    await fixEverything(w);
    const released = await request(h.t.app).post(`${base(w)}/release`).set(as(w.owner)).send({});
    expect(released.body.mail.codes).toEqual({ assigned: 3, sent: 3, missing: 5 });
    const more = await request(h.t.app).post(`${base(w)}/reward-codes`).set(as(w.owner)).send({ csv: 'LATE-A\nLATE-D' });
    expect(more.body.error.fields).toEqual({ 'row 1': 'is imported for this trial already' });
    await request(h.t.app).post(`${base(w)}/reward-codes`).set(as(w.owner)).send({ csv: 'LATE-D\nLATE-E\nLATE-F\nLATE-G\nLATE-H\nLATE-I' });
    const sent = await request(h.t.app).post(`${base(w)}/reward-codes/send`).set(as(w.owner));
    expect(sent.body.delivery).toEqual({ assigned: 5, sent: 5, missing: 0 });
    expect(sent.body).toMatchObject({ total: 9, assigned: 8, unassigned: 1 });
    for (const f of w.finishers) expect(h.capture.to(f.user.email).filter((m) => m.subject.startsWith('Your reward code')).length).toBe(1);
    const list = await request(h.t.app).get(`${base(w)}/reward-codes`).set(as(w.coordinator));
    expect(list.body.codes.filter((c: { tester: string | null }) => c.tester).length).toBe(8);
    expect(list.body.codes.every((c: { tester: string | null; mail: { status: string } | null }) => !c.tester || c.mail?.status === 'sent')).toBe(true);
  });

  it('a finisher gets the final files through a short-lived link; a tester who did not finish and a stranger are refused', async () => {
    const w = await createReleaseWorld(h.t.storage, 'Files');
    await fixEverything(w);
    await request(h.t.app).post(`${base(w)}/release`).set(as(w.owner)).send({});
    const finisher = w.finishers[0].user;
    const mine = await request(h.t.app).get('/api/me/releases').set(as(finisher));
    expect(mine.body).toHaveLength(1);
    expect(mine.body[0]).toMatchObject({ trialTitle: w.trial.title, finished: true, finalDraft: { version: 2 } });
    const fileId = mine.body[0].finalDraft.files[0].id;
    const link = await request(h.t.app).post(`/api/me/final-files/${fileId}/link`).set(as(finisher));
    expect(link.status).toBe(200);
    expect(link.body.expiresInSeconds).toBeLessThanOrEqual(300);
    expect(new URL(link.body.url).searchParams.get('X-Amz-Expires')).toBe('300');
    const fetched = await fetch(link.body.url);
    expect(Buffer.from(await fetched.arrayBuffer()).subarray(0, 5).toString('latin1')).toBe('%PDF-');

    const notFinished = await request(h.t.app).get('/api/me/releases').set(as(w.straggler.user));
    expect(notFinished.body[0]).toMatchObject({ finished: false, finalDraft: null });
    expect((await request(h.t.app).post(`/api/me/final-files/${fileId}/link`).set(as(w.straggler.user))).status).toBe(403);
    expect((await request(h.t.app).post(`/api/me/final-files/${fileId}/link`).set(as(await createUser('stranger')))).status).toBe(403);
    // Draft 1 is not the final draft: no link to it through this route, even for a finisher.
    const first = await request(h.t.app).post(`/api/me/final-files/${(await w.draft1.reload({ include: ['files'] })).files![0].id}/link`).set(as(finisher));
    expect(first.status).toBe(403);
  });

  it('a grader reads the checklist but may not release; bad input names the field', async () => {
    const w = await createReleaseWorld(h.t.storage, 'Rules');
    expect((await request(h.t.app).post(`${base(w)}/release`).set(as(w.grader)).send({})).status).toBe(403);
    const bad = await request(h.t.app).post(`${base(w)}/release`).set(as(w.owner)).send({ confirmOpenItems: ['everything'] });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(['confirmOpenItems.0']);
    const wrongDraft = await request(h.t.app).patch(`${base(w)}/release`).set(as(w.owner)).send({ finalDraftId: w.trial.id });
    expect(wrongDraft.body.error.fields).toEqual({ finalDraftId: 'is not a draft of this pattern' });
  });
});
