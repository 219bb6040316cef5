import request from 'supertest';
import { Pattern, PatternSize, Photo, Report, Trial, type User } from '../../../db/models';
import { bearer, createStudioWorld, createUser, addMember, type StudioWorld, enrolTester } from '../../support/factories';
import { jpegWithGpsAndOrientation } from '../../support/sample-files';
import { buildTestApp, type TestApp } from '../../support/test-app';

describe('the photo wall of a trial and a tester’s photo consent', () => {
  let t: TestApp;
  let w: StudioWorld;
  let trialId: string;
  let otherTrialId: string;
  let sizes: { s: PatternSize; m: PatternSize; l: PatternSize };
  let testers: { small: User; large: User; medium: User };
  const enrolments: Record<string, string> = {};
  const as = (user: User) => ({ Authorization: bearer(user, t.config) });
  const wall = (query = '') => `/api/studios/${w.studio.id}/trials/${trialId}/photos${query}`;

  async function enrol(trial: string, user: User, size: PatternSize) {
    return (await enrolTester(trial, user.id, size.id)).enrollment.id;
  }

  async function upload(user: User, enrollmentId: string, fields: { stage: string; view: string; consent: string }) {
    const res = await request(t.app)
      .post(`/api/me/enrollments/${enrollmentId}/photos`)
      .set(as(user))
      .field('stage', fields.stage)
      .field('view', fields.view)
      .field('consent', fields.consent)
      .attach('photo', await jpegWithGpsAndOrientation(), `${fields.view}.jpg`);
    expect(res.status).toBe(201);
    return res.body.id as string;
  }

  beforeAll(async () => {
    t = buildTestApp();
    w = await createStudioWorld();
    const pattern = await Pattern.create({ studioId: w.studio.id, name: 'Pleated trousers', category: 'trousers', fabricKind: 'woven', bodyColumns: ['hip'] });
    // Created out of grading order on purpose: the wall must follow position, not creation.
    const l = await PatternSize.create({ patternId: pattern.id, label: 'L', position: 2, bodyMm: { hip: 1080 } });
    const s = await PatternSize.create({ patternId: pattern.id, label: 'S', position: 0, bodyMm: { hip: 920 } });
    const m = await PatternSize.create({ patternId: pattern.id, label: 'M', position: 1, bodyMm: { hip: 1000 } });
    sizes = { s, m, l };
    const coverage = { sizes: [s, m, l].map((x) => ({ sizeId: x.id, target: 2 })), heightBands: [], variants: [] };
    trialId = (await Trial.create({ studioId: w.studio.id, patternId: pattern.id, slug: `wall-${Date.now()}`, title: 'Pleated trousers', state: 'running', coverage })).id;
    otherTrialId = (await Trial.create({ studioId: w.studio.id, patternId: pattern.id, slug: `wall-other-${Date.now()}`, title: 'Second round', state: 'running', coverage })).id;

    testers = { small: w.users.tester, large: await createUser('large', { name: 'Tester Large' }), medium: await createUser('medium', { name: 'Tester Medium' }) };
    await addMember(w.studio, testers.large, 'tester');
    await addMember(w.studio, testers.medium, 'tester');
    enrolments.small = await enrol(trialId, testers.small, s);
    enrolments.large = await enrol(trialId, testers.large, l);
    enrolments.medium = await enrol(trialId, testers.medium, m);
    // The medium tester's photos belong to another trial of the same studio.
    enrolments.mediumElsewhere = await enrol(otherTrialId, testers.medium, m);

    await upload(testers.large, enrolments.large, { stage: 'final', view: 'back', consent: 'staff-only' });
    await upload(testers.large, enrolments.large, { stage: 'final', view: 'front', consent: 'may-share' });
    await upload(testers.small, enrolments.small, { stage: 'final', view: 'side', consent: 'staff-only' });
    await upload(testers.small, enrolments.small, { stage: 'check-in', view: 'front', consent: 'staff-only' });
    await upload(testers.medium, enrolments.mediumElsewhere, { stage: 'final', view: 'front', consent: 'may-share' });
    await Report.create({ enrollmentId: enrolments.large, stage: 'final', content: { draftVersion: 2 } });
  });
  afterAll(() => t.close());

  it('shows the staff the trial’s photos in grading order of size, then by view, with tester, stage, consent, draft and a signed thumbnail link', async () => {
    for (const staff of [w.users.grader, w.users.coordinator, w.users.owner]) {
      const res = await request(t.app).get(wall()).set(as(staff));
      expect(res.status).toBe(200);
      expect(res.body.map((p: { size: { label: string }; view: string; stage: string }) => `${p.size.label} ${p.stage} ${p.view}`)).toEqual([
        'S check-in front',
        'S final side',
        'L final front',
        'L final back',
      ]);
    }
    const res = await request(t.app).get(wall()).set(as(w.users.grader));
    const largeFront = res.body.find((p: { size: { label: string }; view: string }) => p.size.label === 'L' && p.view === 'front');
    expect(largeFront).toMatchObject({ tester: { name: 'Tester Large' }, size: { id: sizes.l.id, label: 'L', order: 2 }, stage: 'final', consent: 'may-share', draftVersion: 2, expiresInSeconds: 300 });
    expect(res.body.find((p: { size: { label: string } }) => p.size.label === 'S').draftVersion).toBeNull();
    // The link is signed for the thumbnail object of that photo and lives at most five minutes.
    const photo = (await Photo.findByPk(largeFront.id))!;
    const url = new URL(largeFront.thumbUrl);
    expect(url.pathname).toContain(photo.thumbKey);
    expect(url.searchParams.get('X-Amz-Signature')).toEqual(expect.any(String));
    expect(Number(url.searchParams.get('X-Amz-Expires'))).toBeLessThanOrEqual(300);
    // The thumbnail is really there behind the link.
    const fetched = await fetch(largeFront.thumbUrl);
    expect(fetched.status).toBe(200);
    expect(Buffer.from(await fetched.arrayBuffer()).subarray(0, 3)).toEqual(Buffer.from([0xff, 0xd8, 0xff]));
  });

  it('lets the web app show thumbnails from the object store: its origin is an allowed image source', async () => {
    const res = await request(t.app).get('/api/health');
    const imgSrc = String(res.headers['content-security-policy']).split(';').find((d) => d.trim().startsWith('img-src'));
    expect(imgSrc?.split(' ')).toContain(new URL(t.config.s3.endpoint!).origin);
  });

  it('filters by stage, view and size; a filter that matches nothing gives an empty list', async () => {
    const finals = await request(t.app).get(wall('?stage=final')).set(as(w.users.grader));
    expect(finals.body.map((p: { stage: string }) => p.stage)).toEqual(['final', 'final', 'final']);
    const fronts = await request(t.app).get(wall('?view=front')).set(as(w.users.grader));
    expect(fronts.body.map((p: { size: { label: string } }) => p.size.label)).toEqual(['S', 'L']);
    const large = await request(t.app).get(wall(`?size=${sizes.l.id}&stage=final&view=back`)).set(as(w.users.grader));
    expect(large.body).toHaveLength(1);
    expect(large.body[0]).toMatchObject({ view: 'back', size: { label: 'L' } });
    const none = await request(t.app).get(wall(`?size=${sizes.m.id}`)).set(as(w.users.grader));
    expect(none.status).toBe(200);
    expect(none.body).toEqual([]);
  });

  it('refuses a bad filter with 400 naming it', async () => {
    const res = await request(t.app).get(wall('?view=top&stage=later')).set(as(w.users.grader));
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['stage', 'view']);
  });

  it('refuses testers — even one of this trial — and outsiders, and another studio’s trial is not found', async () => {
    const own = await request(t.app).get(wall()).set(as(testers.small));
    expect(own.status).toBe(403);
    expect(own.body.error.code).toBe('forbidden');
    expect((await request(t.app).get(wall()).set(as(w.users.otherTester))).status).toBe(404);
    expect((await request(t.app).get(wall()).set(as(w.users.otherOwner))).status).toBe(404);
    expect((await request(t.app).get(wall())).status).toBe(401);
    // The other studio's owner asking for this trial under their own studio: no such trial.
    expect((await request(t.app).get(`/api/studios/${w.otherStudio.id}/trials/${trialId}/photos`).set(as(w.users.otherOwner))).status).toBe(404);
    expect((await request(t.app).get(`/api/studios/${w.studio.id}/trials/not-a-uuid/photos`).set(as(w.users.grader))).status).toBe(404);
  });

  it('lets the tester change the consent of their own photo; anyone else gets 403 and nothing changes', async () => {
    const id = await upload(testers.small, enrolments.small, { stage: 'final', view: 'detail', consent: 'staff-only' });
    const changed = await request(t.app).patch(`/api/me/photos/${id}`).set(as(testers.small)).send({ consent: 'may-share' });
    expect(changed.status).toBe(200);
    expect(changed.body).toMatchObject({ id, consent: 'may-share', view: 'detail' });
    expect((await Photo.findByPk(id))!.consent).toBe('may-share');

    // A tester of another trial (same studio), and a tester of another studio.
    for (const intruder of [testers.medium, w.users.otherTester]) {
      const res = await request(t.app).patch(`/api/me/photos/${id}`).set(as(intruder)).send({ consent: 'staff-only' });
      expect(res.status).toBe(403);
    }
    // Staff may look but not change a tester's permission.
    expect((await request(t.app).patch(`/api/me/photos/${id}`).set(as(w.users.owner)).send({ consent: 'staff-only' })).status).toBe(403);
    // A photo that does not exist is simply not found.
    expect((await request(t.app).patch('/api/me/photos/00000000-0000-4000-8000-000000000000').set(as(w.users.owner)).send({ consent: 'staff-only' })).status).toBe(404);
    expect((await Photo.findByPk(id))!.consent).toBe('may-share');
  });

  it('refuses an unknown consent value with 400 naming the field, keeping the one saved', async () => {
    const id = await upload(testers.small, enrolments.small, { stage: 'final', view: 'back', consent: 'staff-only' });
    for (const body of [{ consent: 'everyone' }, {}]) {
      const res = await request(t.app).patch(`/api/me/photos/${id}`).set(as(testers.small)).send(body);
      expect(res.status).toBe(400);
      expect(res.body.error.fields).toEqual({ consent: expect.any(String) });
    }
    expect((await Photo.findByPk(id))!.consent).toBe('staff-only');
  });
});
