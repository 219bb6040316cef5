import { GetObjectCommand, HeadObjectCommand } from '@aws-sdk/client-s3';
import sharp from 'sharp';
import request from 'supertest';
import { Application, DraftFile, Enrollment, Pattern, PatternSize, Photo, Studio, Trial, type User } from '../../../db/models';
import { purgeDeletions } from '../../../server/storage/object-deletions';
import { addMember, bearer, createStudioWorld, createUser, enrolTester, type StudioWorld } from '../../support/factories';
import { waitForMessage } from '../../support/inbox';
import { jpegWithGpsAndOrientation, tinyPdf } from '../../support/sample-files';
import { buildTestApp, type TestApp } from '../../support/test-app';

/** The app with its file store pointed at a closed port: the store is down, everything else is up. */
const storeDown = () => buildTestApp({ S3_ENDPOINT: 'http://127.0.0.1:9' });

describe('uploads, withdrawal and the file store', () => {
  let t: TestApp;
  let w: StudioWorld;
  let trial: Trial;
  let size: PatternSize;
  const as = (user: User, config = t.config) => ({ Authorization: bearer(user, config) });
  const upload = (who: User, enrollmentId: string, view = 'front', app = t.app) =>
    request(app).post(`/api/me/enrollments/${enrollmentId}/photos`).set(as(who)).field('stage', 'final').field('view', view).field('consent', 'staff-only');
  const stored = async (key: string) =>
    t.storage.client.send(new HeadObjectCommand({ Bucket: t.config.s3.buckets.photos, Key: key })).then(
      () => true,
      () => false,
    );

  beforeAll(async () => {
    t = buildTestApp();
    w = await createStudioWorld();
    const pattern = await Pattern.create({ studioId: w.studio.id, name: 'Shirt', category: 'top', fabricKind: 'woven', bodyColumns: ['chest'] });
    size = await PatternSize.create({ patternId: pattern.id, label: 'M', position: 0, bodyMm: { chest: 980 } });
    trial = await Trial.create({ studioId: w.studio.id, patternId: pattern.id, slug: `uploads-${Date.now()}`, title: 'Shirt round', state: 'running', coverage: { sizes: [{ sizeId: size.id, target: 1 }], heightBands: [], variants: [] } });
  });
  afterAll(() => t.close());

  it('withdrawing while the file store is down succeeds whole: the tester leaves, their photos go, the waitlisted tester is chosen and told, and the stored objects are removed once the store is back', async () => {
    const leaving = await createUser('leaving');
    const { application, enrollment } = await enrolTester(trial.id, leaving.id, size.id);
    await addMember(w.studio, leaving, 'tester');
    const photo = await upload(leaving, enrollment.id).attach('photo', await jpegWithGpsAndOrientation(), 'front.jpg');
    expect(photo.status).toBe(201);
    const row = (await Photo.findByPk(photo.body.id))!;
    const waiting = await createUser('waiting');
    const waitlisted = await Application.create({
      trialId: trial.id, userId: waiting.id, sizeId: size.id, variantId: null, profileSnapshot: {}, adviceSnapshot: null,
      plannedFabric: 'Poplin', experience: 'confident', photoConsent: 'staff-only', appliedAt: new Date(), status: 'waitlisted',
    });

    const down = storeDown();
    try {
      const res = await request(down.app).post(`/api/me/applications/${application.id}/withdraw`).set(as(leaving, down.config));
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({ status: 'withdrawn', seatOffered: true });
    } finally {
      await down.close();
    }
    expect((await Application.findByPk(application.id))!.status).toBe('withdrawn');
    expect((await Enrollment.findByPk(enrollment.id))!.status).toBe('dropped');
    expect((await waitlisted.reload()).status).toBe('selected');
    expect((await Enrollment.findOne({ where: { applicationId: waitlisted.id } }))!.status).toBe('active');
    await waitForMessage(waiting.email, 'You are testing Shirt round');
    // The photo is gone from Basted at once; its objects wait in the store for removal…
    expect(await Photo.count({ where: { enrollmentId: enrollment.id } })).toBe(0);
    expect(await stored(row.fullKey)).toBe(true);
    const [queued] = await t.sequelize.query('SELECT object_key FROM object_deletions WHERE object_key IN (:keys)', { replacements: { keys: [row.fullKey, row.thumbKey] } });
    expect(queued).toHaveLength(2);
    // …and the job removes them once the store answers.
    await purgeDeletions(t.sequelize, t.storage, { now: new Date(Date.now() + 2 * 60_000) });
    expect(await stored(row.fullKey)).toBe(false);
    expect(await stored(row.thumbKey)).toBe(false);
  });

  it('deleting a photo while the store is down answers 503 and keeps the photo; with the store up it goes, objects and all', async () => {
    const tester = await createUser('deleter');
    const { enrollment } = await enrolTester(trial.id, tester.id, size.id);
    const made = await upload(tester, enrollment.id, 'side').attach('photo', await jpegWithGpsAndOrientation(), 'side.jpg');
    const row = (await Photo.findByPk(made.body.id))!;
    const down = storeDown();
    try {
      const res = await request(down.app).delete(`/api/me/photos/${row.id}`).set(as(tester, down.config));
      expect(res.status).toBe(503);
      expect(res.body.error.code).toBe('unavailable');
    } finally {
      await down.close();
    }
    expect(await Photo.count({ where: { id: row.id } })).toBe(1);
    expect((await request(t.app).delete(`/api/me/photos/${row.id}`).set(as(tester))).status).toBe(204);
    expect(await Photo.count({ where: { id: row.id } })).toBe(0);
    expect(await stored(row.fullKey)).toBe(false);
  });

  it('a photo declaring more than 50 megapixels is refused (413) before it is decoded, whatever its file size', async () => {
    const tester = await createUser('bomb');
    const { enrollment } = await enrolTester(trial.id, tester.id, size.id);
    // 8000 × 7500 = 60 MP of one colour: a PNG of a few hundred kilobytes.
    const png = await sharp({ create: { width: 8000, height: 7500, channels: 3, background: { r: 250, g: 250, b: 250 } } }).png({ compressionLevel: 9 }).toBuffer();
    expect(png.length).toBeLessThan(1_000_000);
    const res = await upload(tester, enrollment.id).attach('photo', png, 'huge.png');
    expect(res.status).toBe(413);
    expect(res.body.error.message).toMatch(/8000 × 7500 pixels; a photo may have at most 50 megapixels/);
    expect(await Photo.count({ where: { enrollmentId: enrollment.id } })).toBe(0);
  });

  it('a tester who was declined or left cannot upload, and their photos are not on the staff wall', async () => {
    const tester = await createUser('declined');
    const { application, enrollment } = await enrolTester(trial.id, tester.id, size.id);
    expect((await upload(tester, enrollment.id, 'back').attach('photo', await jpegWithGpsAndOrientation(), 'back.jpg')).status).toBe(201);
    await request(t.app).post(`/api/studios/${w.studio.id}/trials/${trial.id}/decisions`).set(as(w.users.coordinator)).send({ applicationIds: [application.id], status: 'declined' }).expect(200);

    const after = await upload(tester, enrollment.id, 'detail').attach('photo', await jpegWithGpsAndOrientation(), 'detail.jpg');
    expect(after.status).toBe(409);
    expect(await Photo.count({ where: { enrollmentId: enrollment.id } })).toBe(1);
    const wall = await request(t.app).get(`/api/studios/${w.studio.id}/trials/${trial.id}/photos`).set(as(w.users.grader));
    expect(wall.status).toBe(200);
    expect(wall.body.filter((p: { enrollmentId: string }) => p.enrollmentId === enrollment.id)).toEqual([]);
  });

  it('uploads are limited per person per hour, and a report takes at most 12 detail photos', async () => {
    const limited = buildTestApp({ PHOTO_UPLOAD_HOURLY_LIMIT: '2' });
    try {
      const tester = await createUser('rate');
      const { enrollment } = await enrolTester(trial.id, tester.id, size.id);
      const jpeg = await jpegWithGpsAndOrientation();
      const statuses: number[] = [];
      for (let i = 0; i < 3; i += 1) statuses.push((await upload(tester, enrollment.id, 'detail', limited.app).attach('photo', jpeg, `d${i}.jpg`)).status);
      expect(statuses).toEqual([201, 201, 429]);
    } finally {
      await limited.close();
    }
    const tester = await createUser('details');
    const { enrollment } = await enrolTester(trial.id, tester.id, size.id);
    const jpeg = await jpegWithGpsAndOrientation();
    for (let i = 0; i < 12; i += 1) expect((await upload(tester, enrollment.id, 'detail').attach('photo', jpeg, `d${i}.jpg`)).status).toBe(201);
    const thirteenth = await upload(tester, enrollment.id, 'detail').attach('photo', jpeg, 'd12.jpg');
    expect(thirteenth.status).toBe(409);
    expect(thirteenth.body.error.fields.photo).toMatch(/at most 12/);
  });

  it('a draft file named in any script keeps its name, and the download link names it so', async () => {
    const name = 'Schnitt Größe 38 – café 裁縫.pdf';
    const pattern = await Pattern.create({ studioId: w.studio.id, name: 'Unicode', category: 'top', fabricKind: 'woven', bodyColumns: [] });
    const res = await request(t.app)
      .post(`/api/studios/${w.studio.id}/patterns/${pattern.id}/drafts`)
      .set(as(w.users.owner))
      .field('changeNote', 'First draft')
      .attach('print-a4', tinyPdf(), name);
    expect(res.status).toBe(201);
    expect(res.body.files[0].name).toBe(name);
    expect((await DraftFile.findByPk(res.body.files[0].id))!.originalName).toBe(name);
    const link = await request(t.app).post(`/api/draft-files/${res.body.files[0].id}/link`).set(as(w.users.owner));
    const disposition = new URL(link.body.url).searchParams.get('response-content-disposition')!;
    expect(disposition).toContain(`filename*=UTF-8''${encodeURIComponent(name)}`);
  });

  it("deleting a studio leaves none of its files in the store: drafts and testers' photos", async () => {
    const studio = await Studio.create({ name: 'Closing studio', slug: `closing-${Date.now()}`, timeZone: 'UTC' });
    const owner = await createUser('closer');
    await addMember(studio, owner, 'owner');
    const pattern = await Pattern.create({ studioId: studio.id, name: 'Last pattern', category: 'top', fabricKind: 'woven', bodyColumns: ['chest'] });
    const s = await PatternSize.create({ patternId: pattern.id, label: 'S', position: 0, bodyMm: { chest: 900 } });
    const closing = await Trial.create({ studioId: studio.id, patternId: pattern.id, slug: `closing-trial-${Date.now()}`, title: 'Last', state: 'running', coverage: { sizes: [{ sizeId: s.id, target: 2 }], heightBands: [], variants: [] } });
    const tester = await createUser('last-tester');
    const { enrollment } = await enrolTester(closing.id, tester.id, s.id);
    const photo = await upload(tester, enrollment.id).attach('photo', await jpegWithGpsAndOrientation(), 'front.jpg');
    const draft = await request(t.app).post(`/api/studios/${studio.id}/patterns/${pattern.id}/drafts`).set(as(owner)).field('changeNote', 'Only draft').attach('print-a4', tinyPdf(), 'a4.pdf');
    const row = (await Photo.findByPk(photo.body.id))!;
    const file = (await DraftFile.findByPk(draft.body.files[0].id))!;

    expect((await request(t.app).delete(`/api/studios/${studio.id}`).set(as(owner))).status).toBe(204);
    expect(await stored(row.fullKey)).toBe(false);
    expect(await stored(row.thumbKey)).toBe(false);
    await expect(t.storage.client.send(new GetObjectCommand({ Bucket: t.config.s3.buckets.drafts, Key: file.objectKey }))).rejects.toThrow();
  });
});
