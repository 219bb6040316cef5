import { GetObjectCommand } from '@aws-sdk/client-s3';
import { gps, parse } from 'exifr';
import request from 'supertest';
import { Enrollment, Pattern, PatternSize, Photo, Trial } from '../../../db/models';
import { bearer, createStudioWorld, type StudioWorld, enrolTester } from '../../support/factories';
import { jpegWithGpsAndOrientation, tinyPdf } from '../../support/sample-files';
import { buildTestApp, type TestApp } from '../../support/test-app';

describe('photos of a tester’s toile and garment', () => {
  let t: TestApp;
  let w: StudioWorld;
  let enrollmentId: string;
  let otherEnrollmentId: string;
  const as = (user: Parameters<typeof bearer>[0], config = t.config) => ({ Authorization: bearer(user, config) });

  beforeAll(async () => {
    t = buildTestApp();
    w = await createStudioWorld();
    const pattern = await Pattern.create({ studioId: w.studio.id, name: 'Wrap skirt', category: 'skirt', fabricKind: 'woven', bodyColumns: ['hip'] });
    const size = await PatternSize.create({ patternId: pattern.id, label: 'S', position: 0, bodyMm: { hip: 950 } });
    const trial = await Trial.create({ studioId: w.studio.id, patternId: pattern.id, slug: `photos-${Date.now()}`, title: 'Wrap skirt', state: 'running', coverage: { sizes: [{ sizeId: size.id, target: 2 }], heightBands: [], variants: [] } });
    const enrol = async (userId: string) => {
      return (await enrolTester(trial.id, userId, size.id)).enrollment.id;
    };
    enrollmentId = await enrol(w.users.tester.id);
    otherEnrollmentId = await enrol(w.users.otherTester.id);
  });
  afterAll(() => t.close());

  const post = (who = w.users.tester, id = enrollmentId, app = t.app, config = t.config) =>
    request(app).post(`/api/me/enrollments/${id}/photos`).set(as(who, config)).field('stage', 'final').field('view', 'front').field('consent', 'staff-only');

  it('a JPEG carrying GPS is stored without any EXIF, turned upright, with a thumbnail; staff get a short link, the tester too', async () => {
    const res = await post().attach('photo', await jpegWithGpsAndOrientation(), 'front.jpg');
    expect(res.status).toBe(201);
    // Orientation 6 applied: the 40 × 20 original stands 20 × 40.
    expect([res.body.width, res.body.height]).toEqual([20, 40]);

    const photo = await Photo.findByPk(res.body.id);
    for (const key of [photo!.fullKey, photo!.thumbKey]) {
      const object = await t.storage.client.send(new GetObjectCommand({ Bucket: t.config.s3.buckets.photos, Key: key }));
      const stored = Buffer.from(await object.Body!.transformToByteArray());
      // Read back with a general EXIF reader (exifr): no GPS, no EXIF at all.
      expect(await gps(stored)).toBeUndefined();
      expect(await parse(stored)).toBeUndefined();
    }

    const staffLink = await request(t.app).post(`/api/photos/${res.body.id}/link?size=thumb`).set(as(w.users.grader));
    expect(staffLink.status).toBe(200);
    expect(Number(new URL(staffLink.body.url).searchParams.get('X-Amz-Expires'))).toBeLessThanOrEqual(300);
    expect((await request(t.app).post(`/api/photos/${res.body.id}/link`).set(as(w.users.tester))).status).toBe(200);
  });

  it('a tester of another studio, or another tester, gets 403 for the link; another tester cannot upload to this enrolment', async () => {
    const res = await post().attach('photo', await jpegWithGpsAndOrientation(), 'side.jpg');
    expect((await request(t.app).post(`/api/photos/${res.body.id}/link`).set(as(w.users.otherOwner))).status).toBe(403);
    expect((await request(t.app).post(`/api/photos/${res.body.id}/link`).set(as(w.users.otherTester))).status).toBe(403);
    const intruder = await post(w.users.otherTester, enrollmentId).attach('photo', await jpegWithGpsAndOrientation(), 'x.jpg');
    expect(intruder.status).toBe(403);
    expect(otherEnrollmentId).not.toBe(enrollmentId);
  });

  it('a text file named .jpg is refused naming it; a PDF too', async () => {
    const text = await post().attach('photo', Buffer.from('not really a photo at all'), 'back.jpg');
    expect(text.status).toBe(415);
    expect(text.body.error.message).toContain('back.jpg');
    expect((await post().attach('photo', tinyPdf(), 'detail.jpg')).status).toBe(415);
  });

  it('an upload over the size limit gets 413 with a clear message', async () => {
    const huge = Buffer.alloc(16 * 1024 * 1024, 0xff); // over the 15 MB photo limit
    const res = await post().attach('photo', huge, 'huge.jpg');
    expect(res.status).toBe(413);
    expect(res.body.error.message).toMatch(/too large/);
  });

  it('with the file store down the upload gets 503 and leaves no row; deleting a photo removes its objects', async () => {
    const down = buildTestApp({ S3_ENDPOINT: 'http://127.0.0.1:9' });
    try {
      const before = await Photo.count();
      const res = await post(w.users.tester, enrollmentId, down.app, down.config).attach('photo', await jpegWithGpsAndOrientation(), 'front.jpg');
      expect(res.status).toBe(503);
      expect(await Photo.count()).toBe(before);
    } finally {
      await down.close();
    }
    const made = await post().attach('photo', await jpegWithGpsAndOrientation(), 'gone.jpg');
    const photo = (await Photo.findByPk(made.body.id))!;
    expect((await request(t.app).delete(`/api/me/photos/${photo.id}`).set(as(w.users.tester))).status).toBe(204);
    await expect(t.storage.client.send(new GetObjectCommand({ Bucket: t.config.s3.buckets.photos, Key: photo.fullKey }))).rejects.toThrow();
    expect(await Photo.findByPk(photo.id)).toBeNull();
  });

  it('a new front, side or back photo of a report replaces the earlier one, objects included; details add up', async () => {
    const upload = (view: string, stage = 'check-in') =>
      request(t.app).post(`/api/me/enrollments/${enrollmentId}/photos`).set(as(w.users.tester)).field('stage', stage).field('view', view).field('consent', 'staff-only').attach('photo', jpeg, `${view}.jpg`);
    const jpeg = await jpegWithGpsAndOrientation();
    const first = (await upload('back')).body.id as string;
    const old = (await Photo.findByPk(first))!;
    const second = await upload('back');
    expect(second.status).toBe(201);
    const backs = await Photo.findAll({ where: { enrollmentId, stage: 'check-in', view: 'back' } });
    expect(backs.map((p) => p.id)).toEqual([second.body.id]);
    await expect(t.storage.client.send(new GetObjectCommand({ Bucket: t.config.s3.buckets.photos, Key: old.fullKey }))).rejects.toThrow();
    // The final report's back photo is another photo.
    expect((await upload('back', 'final')).status).toBe(201);
    expect(await Photo.count({ where: { enrollmentId, view: 'back' } })).toBe(2);
    await upload('detail');
    await upload('detail');
    expect(await Photo.count({ where: { enrollmentId, stage: 'check-in', view: 'detail' } })).toBe(2);
  });

  it('a tester who withdraws has their photos deleted, rows and stored objects', async () => {
    const made = await post().attach('photo', await jpegWithGpsAndOrientation(), 'leaving.jpg');
    expect(made.status).toBe(201);
    const photo = (await Photo.findByPk(made.body.id))!;
    const enrollment = (await Enrollment.findByPk(enrollmentId))!;
    const out = await request(t.app).post(`/api/me/applications/${enrollment.applicationId}/withdraw`).set(as(w.users.tester));
    expect(out.status).toBe(200);
    expect(await Photo.count({ where: { enrollmentId } })).toBe(0);
    await expect(t.storage.client.send(new GetObjectCommand({ Bucket: t.config.s3.buckets.photos, Key: photo.thumbKey }))).rejects.toThrow();
  });
});
