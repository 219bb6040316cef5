import request from 'supertest';
import { Invitation, Membership } from '../../../db/models';
import { addMember, bearer, createStudio, createStudioWorld, createUser, uniqueEmail } from '../../support/factories';
import { firstLink, messagesTo, waitForMessage } from '../../support/inbox';
import { buildTestApp, type TestApp } from '../../support/test-app';

describe('studios, members and invitations', () => {
  let t: TestApp;
  beforeAll(() => {
    t = buildTestApp();
  });
  afterAll(() => t.close());
  const as = (user: Parameters<typeof bearer>[0]) => ({ Authorization: bearer(user, t.config) });

  it('creating a studio makes the creator its owner and the current studio, with a slug of its name', async () => {
    const user = await createUser('founder');
    const res = await request(t.app).post('/api/studios').set(as(user)).send({ name: 'Pinked Edge Patterns', timeZone: 'America/Chicago' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ name: 'Pinked Edge Patterns', role: 'owner', timeZone: 'America/Chicago' });
    expect(res.body.slug).toMatch(/^pinked-edge-patterns(-\d+)?$/);
    const session = await request(t.app).get('/api/auth/session').set(as(user));
    expect(session.body.currentStudioId).toBe(res.body.id);
    expect(session.body.studios).toEqual([expect.objectContaining({ id: res.body.id, role: 'owner' })]);
  });

  it('refuses a studio with a bad time zone, naming timeZone', async () => {
    const user = await createUser('tz');
    const res = await request(t.app).post('/api/studios').set(as(user)).send({ name: 'Somewhere', timeZone: 'Mars/Olympus' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.timeZone).toMatch(/time zone/);
  });

  it('an invitation is e-mailed; its link shows the studio, and the invited person accepts it into the role', async () => {
    const w = await createStudioWorld();
    const email = uniqueEmail('grader-to-be');
    const sent = await request(t.app).post(`/api/studios/${w.studio.id}/invitations`).set(as(w.users.owner)).send({ email, role: 'grader' });
    expect(sent.status).toBe(201);
    expect(sent.body).toMatchObject({ email, role: 'grader', state: 'open' });

    const mail = await waitForMessage(email, 'Invitation to the studio “Studio here”');
    expect(mail.text).toContain('as grader');
    const token = firstLink(mail.text, '/invitations/').split('/invitations/')[1];

    const preview = await request(t.app).get(`/api/invitations/${token}`);
    expect(preview.status).toBe(200);
    expect(preview.body).toMatchObject({ studio: { name: 'Studio here' }, role: 'grader', state: 'open' });
    expect(preview.body.email).not.toBe(email); // masked before sign-in

    const invitee = await createUser('invitee', { email: email.toUpperCase() });
    const accepted = await request(t.app).post(`/api/invitations/${token}/accept`).set(as(invitee));
    expect(accepted.status).toBe(200);
    expect(accepted.body).toMatchObject({ id: w.studio.id, role: 'grader' });
    const session = await request(t.app).get('/api/auth/session').set(as(invitee));
    expect(session.body.currentStudioId).toBe(w.studio.id);

    const again = await request(t.app).post(`/api/invitations/${token}/accept`).set(as(invitee));
    expect(again.status).toBe(409);
  });

  it('a forwarded link does not work for another account', async () => {
    const w = await createStudioWorld();
    const email = uniqueEmail('meant-for');
    await request(t.app).post(`/api/studios/${w.studio.id}/invitations`).set(as(w.users.owner)).send({ email, role: 'tester' });
    const token = firstLink((await waitForMessage(email, 'Invitation')).text, '/invitations/').split('/invitations/')[1];
    const res = await request(t.app).post(`/api/invitations/${token}/accept`).set(as(w.users.otherTester));
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/was sent to m/);
    expect(await Membership.count({ where: { studioId: w.studio.id, userId: w.users.otherTester.id } })).toBe(0);
  });

  it('a coordinator invites testers and graders but not coordinators', async () => {
    const w = await createStudioWorld();
    const path = `/api/studios/${w.studio.id}/invitations`;
    expect((await request(t.app).post(path).set(as(w.users.coordinator)).send({ email: uniqueEmail('t'), role: 'tester' })).status).toBe(201);
    const res = await request(t.app).post(path).set(as(w.users.coordinator)).send({ email: uniqueEmail('c'), role: 'coordinator' });
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/Only the owner/);
  });

  it('inviting a member again is refused naming email; a second invitation replaces the open one', async () => {
    const w = await createStudioWorld();
    const path = `/api/studios/${w.studio.id}/invitations`;
    const dup = await request(t.app).post(path).set(as(w.users.owner)).send({ email: w.users.grader.email, role: 'tester' });
    expect(dup.status).toBe(409);
    expect(dup.body.error.fields).toEqual({ email: 'is already a member of this studio' });

    const email = uniqueEmail('twice');
    const first = await request(t.app).post(path).set(as(w.users.owner)).send({ email, role: 'tester' });
    const second = await request(t.app).post(path).set(as(w.users.owner)).send({ email, role: 'grader' });
    const list = await request(t.app).get(path).set(as(w.users.owner));
    const states = Object.fromEntries(list.body.map((i: { id: string; state: string }) => [i.id, i.state]));
    expect(states[first.body.id]).toBe('revoked');
    expect(states[second.body.id]).toBe('open');
  });

  it('a withdrawn invitation can no longer be accepted', async () => {
    const w = await createStudioWorld();
    const email = uniqueEmail('withdrawn');
    const sent = await request(t.app).post(`/api/studios/${w.studio.id}/invitations`).set(as(w.users.owner)).send({ email, role: 'tester' });
    const token = firstLink((await waitForMessage(email, 'Invitation')).text, '/invitations/').split('/invitations/')[1];
    expect((await request(t.app).delete(`/api/studios/${w.studio.id}/invitations/${sent.body.id}`).set(as(w.users.owner))).status).toBe(204);
    expect((await request(t.app).get(`/api/invitations/${token}`)).body.state).toBe('revoked');
    const invitee = await createUser('late', { email });
    expect((await request(t.app).post(`/api/invitations/${token}/accept`).set(as(invitee))).status).toBe(409);
  });

  it('when the mail server is down, the invitation gets a clear 503 and nothing is saved', async () => {
    const down = buildTestApp({ SMTP_PORT: '9' });
    try {
      const w = await createStudioWorld();
      const email = uniqueEmail('nomail');
      const res = await request(down.app)
        .post(`/api/studios/${w.studio.id}/invitations`)
        .set({ Authorization: bearer(w.users.owner, down.config) })
        .send({ email, role: 'tester' });
      expect(res.status).toBe(503);
      expect(res.body.error.message).toMatch(/could not be sent/);
      expect(await Invitation.count({ where: { email } })).toBe(0);
      expect(await messagesTo(email)).toEqual([]);
    } finally {
      await down.close();
    }
  });

  it('the owner changes roles and removes members, but the last owner cannot step down or leave', async () => {
    const w = await createStudioWorld();
    const base = `/api/studios/${w.studio.id}/members`;
    const members = await request(t.app).get(base).set(as(w.users.owner));
    expect(members.body.map((m: { role: string }) => m.role).sort()).toEqual(['coordinator', 'grader', 'owner', 'tester']);

    const demote = await request(t.app).patch(`${base}/${w.memberships.owner.id}`).set(as(w.users.owner)).send({ role: 'grader' });
    expect(demote.status).toBe(409);
    expect(demote.body.error.message).toMatch(/at least one owner/);
    expect((await request(t.app).delete(`/api/studios/${w.studio.id}/membership`).set(as(w.users.owner))).status).toBe(409);

    const promote = await request(t.app).patch(`${base}/${w.memberships.coordinator.id}`).set(as(w.users.owner)).send({ role: 'owner' });
    expect(promote.status).toBe(200);
    expect(promote.body.role).toBe('owner');
    expect((await request(t.app).patch(`${base}/${w.memberships.owner.id}`).set(as(w.users.owner)).send({ role: 'grader' })).status).toBe(200);

    const bad = await request(t.app).patch(`${base}/${w.memberships.tester.id}`).set(as(w.users.coordinator)).send({ role: 'boss' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.role).toMatch(/Choose owner/);

    expect((await request(t.app).delete(`${base}/${w.memberships.tester.id}`).set(as(w.users.coordinator))).status).toBe(204);
    expect(await Membership.findByPk(w.memberships.tester.id)).toBeNull();
    expect((await request(t.app).delete(`${base}/not-a-uuid`).set(as(w.users.coordinator))).status).toBe(404);
  });

  it('one person in two studios with different roles switches between them', async () => {
    const person = await createUser('both');
    const a = await createStudio('Studio A');
    const b = await createStudio('Studio B');
    await addMember(a, person, 'grader');
    await addMember(b, person, 'tester');
    const studios = await request(t.app).get('/api/studios').set(as(person));
    expect(studios.body.map((s: { name: string; role: string }) => `${s.name}:${s.role}`).sort()).toEqual(['Studio A:grader', 'Studio B:tester']);
    const switched = await request(t.app).put('/api/auth/session/studio').set(as(person)).send({ studioId: b.id });
    expect(switched.status).toBe(200);
    expect(switched.body.currentStudioId).toBe(b.id);
    const foreign = await createStudio('Not mine');
    expect((await request(t.app).put('/api/auth/session/studio').set(as(person)).send({ studioId: foreign.id })).status).toBe(404);
  });
});

describe('studio settings', () => {
  let t: TestApp;
  beforeAll(() => {
    t = buildTestApp();
  });
  afterAll(() => t.close());

  it('the owner sets the fuller-belly margin; an unset studio reads the default; a bad value is named', async () => {
    const w = await createStudioWorld();
    const path = `/api/studios/${w.studio.id}`;
    const auth = { Authorization: bearer(w.users.owner, t.config) };
    // Default 1 in = 25.4 mm (common practice, see server/domain/studio-settings.ts).
    expect((await request(t.app).get(path).set(auth)).body.settings).toEqual({ fullerBellyMarginMm: 25.4, analysis: {}, contactEmail: null, photoRetentionDays: 365 });
    const set = await request(t.app).patch(path).set(auth).send({ settings: { fullerBellyMarginMm: 38.1 } });
    expect(set.status).toBe(200);
    expect(set.body.settings.fullerBellyMarginMm).toBe(38.1);
    const bad = await request(t.app).patch(path).set(auth).send({ settings: { fullerBellyMarginMm: -5 } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields['settings.fullerBellyMarginMm']).toBe('must not be negative');
    const coordinator = await request(t.app)
      .patch(path)
      .set({ Authorization: bearer(w.users.coordinator, t.config) })
      .send({ settings: { fullerBellyMarginMm: 10 } });
    expect(coordinator.status).toBe(403);
  });
});
