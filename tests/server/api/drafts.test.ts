import request from 'supertest';
import { Draft, DraftFile, Enrollment, Trial } from '../../../db/models';
import { addMember, bearer, createStudioWorld, createUser, type StudioWorld, enrolTester } from '../../support/factories';
import { waitForMessage } from '../../support/inbox';
import { buildTestApp, type TestApp } from '../../support/test-app';
import { tinyPdf } from '../../support/sample-files';

// A small valid PDF built in code (see tests/support/sample-files.ts).
const PDF = tinyPdf();

describe('draft files', () => {
  let t: TestApp;
  let w: StudioWorld;
  let patternId: string;
  let trialId: string;
  const as = (user: Parameters<typeof bearer>[0]) => ({ Authorization: bearer(user, t.config) });

  beforeAll(async () => {
    t = buildTestApp();
    w = await createStudioWorld();
    const p = await request(t.app).post(`/api/studios/${w.studio.id}/patterns`).set(as(w.users.owner)).send({ name: 'Cargo shorts', category: 'shorts', fabricKind: 'woven' });
    patternId = p.body.id;
    const chart = await request(t.app)
      .put(`/api/studios/${w.studio.id}/patterns/${patternId}/chart`)
      .set(as(w.users.owner))
      .send({ draftedHeightMm: null, bodyColumns: ['hip'], finishedColumns: [], sizes: [{ label: 'M', bodyMm: { hip: 1000 } }], variants: [] });
    const trial = await Trial.create({
      studioId: w.studio.id,
      patternId,
      slug: `drafts-${Date.now()}`,
      title: 'Cargo shorts round one',
      state: 'running',
      coverage: { sizes: [{ sizeId: chart.body.chart.sizes[0].id, target: 2 }], heightBands: [], variants: [] },
    });
    trialId = trial.id;
    await enrolTester(trialId, w.users.tester.id, chart.body.chart.sizes[0].id, { plannedFabric: 'Cotton drill' });
  });
  afterAll(() => t.close());

  const upload = (app: TestApp['app'], who: Parameters<typeof bearer>[0], config = t.config) =>
    request(app).post(`/api/studios/${w.studio.id}/patterns/${patternId}/drafts`).set({ Authorization: bearer(who, config) });

  it('a coordinator uploads numbered drafts; enrolled testers are told; a tester downloads through a short-lived link, which is logged', async () => {
    const first = await upload(t.app, w.users.coordinator)
      .field('changeNote', 'First draft for the fit round')
      .attach('print-a4', PDF, 'cargo-shorts-a4.pdf')
      .attach('instructions', PDF, 'instructions.pdf');
    expect(first.status).toBe(201);
    expect(first.body.version).toBe(1);
    expect(first.body.files.map((f: { kind: string }) => f.kind).sort()).toEqual(['instructions', 'print-a4']);
    const second = await upload(t.app, w.users.owner).field('changeNote', 'Back rise lengthened by 3/8 in').attach('print-a4', PDF, 'a4-v2.pdf');
    expect(second.body.version).toBe(2);

    const mail = await waitForMessage(w.users.tester.email, 'New draft 2');
    expect(mail.text).toContain('Back rise lengthened by 3/8 in');

    const mine = await request(t.app).get(`/api/me/trials/${trialId}/drafts`).set(as(w.users.tester));
    expect(mine.status).toBe(200);
    expect(mine.body.map((d: { version: number }) => d.version)).toEqual([2, 1]);
    const fileId = mine.body[0].files[0].id;
    const link = await request(t.app).post(`/api/draft-files/${fileId}/link`).set(as(w.users.tester));
    expect(link.status).toBe(200);
    expect(link.body.expiresInSeconds).toBeLessThanOrEqual(300);
    // The link itself expires within five minutes (X-Amz-Expires of the signed URL).
    expect(Number(new URL(link.body.url).searchParams.get('X-Amz-Expires'))).toBeLessThanOrEqual(300);
    const fetched = Buffer.from(await (await fetch(link.body.url)).arrayBuffer());
    expect(fetched.equals(PDF)).toBe(true);

    const list = await request(t.app).get(`/api/studios/${w.studio.id}/patterns/${patternId}/drafts`).set(as(w.users.grader));
    const latestA4 = list.body[0].files.find((f: { kind: string }) => f.kind === 'print-a4');
    expect(latestA4.downloadedBy.map((d: { name: string }) => d.name)).toEqual([w.users.tester.name]);
  });

  it('a tester who finished keeps the draft files; one who left the trial loses them', async () => {
    const finished = await createUser('finished');
    const left = await createUser('left');
    const sizeId = (await Enrollment.findOne({ where: { trialId } }))!.sizeId;
    const done = await enrolTester(trialId, finished.id, sizeId);
    await done.enrollment.update({ status: 'finished' });
    const gone = await enrolTester(trialId, left.id, sizeId);
    await gone.enrollment.update({ status: 'dropped' });
    const file = await DraftFile.findOne({ include: [{ model: Draft, as: 'draft', where: { patternId }, required: true }] });
    expect((await request(t.app).get(`/api/me/trials/${trialId}/drafts`).set(as(finished))).status).toBe(200);
    expect((await request(t.app).post(`/api/draft-files/${file!.id}/link`).set(as(finished))).status).toBe(200);
    expect((await request(t.app).get(`/api/me/trials/${trialId}/drafts`).set(as(left))).status).toBe(403);
    expect((await request(t.app).post(`/api/draft-files/${file!.id}/link`).set(as(left))).status).toBe(403);
  });

  it('a tester of another trial gets 403 for the trial’s drafts and for a link, and nothing is logged', async () => {
    const outsider = await createUser('outsider');
    await addMember(w.studio, outsider, 'tester');
    const file = await DraftFile.findOne();
    expect((await request(t.app).get(`/api/me/trials/${trialId}/drafts`).set(as(outsider))).status).toBe(403);
    expect((await request(t.app).post(`/api/draft-files/${file!.id}/link`).set(as(outsider))).status).toBe(403);
    expect((await request(t.app).post(`/api/draft-files/${file!.id}/link`).set(as(w.users.otherTester))).status).toBe(403);
  });

  it('a text file named .pdf is refused naming the file, and nothing is stored', async () => {
    const before = await Draft.count({ where: { patternId } });
    const res = await upload(t.app, w.users.coordinator).field('changeNote', 'Oops').attach('print-a4', Buffer.from('just some notes, not a pattern'), 'sneaky.pdf');
    expect(res.status).toBe(415);
    expect(res.body.error.message).toContain('sneaky.pdf');
    expect(await Draft.count({ where: { patternId } })).toBe(before);
  });

  it('without a change note the upload is refused naming changeNote', async () => {
    const res = await upload(t.app, w.users.coordinator).attach('print-a4', PDF, 'a.pdf');
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['changeNote']);
  });

  it('with the file store down the upload gets a clear 503 and leaves no row behind', async () => {
    const down = buildTestApp({ S3_ENDPOINT: 'http://127.0.0.1:9' });
    try {
      const before = await Draft.count({ where: { patternId } });
      const res = await upload(down.app, w.users.coordinator, down.config).field('changeNote', 'Store is down').attach('print-a4', PDF, 'a.pdf');
      expect(res.status).toBe(503);
      expect(res.body.error.message).toMatch(/file store cannot be reached/);
      expect(await Draft.count({ where: { patternId } })).toBe(before);
    } finally {
      await down.close();
    }
  });
});
