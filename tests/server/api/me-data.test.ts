import { unzipSync, strFromU8 } from 'fflate';
import ICAL from 'ical.js';
import request from 'supertest';
import { Application, FindingSnapshot, Membership, OutboxMessage, Photo, Report, TesterProfile, Trial, User } from '../../../db/models';
import { sweepPhotoRetention } from '../../../server/jobs/photo-retention';
import { addPhoto } from '../../../server/photos/photos.service';
import { readObject } from '../../../server/storage/read-object';
import { bearer, TEST_PASSWORD } from '../../support/factories';
import { createReleaseWorld, type ReleaseWorld } from '../../support/release-world';
import { jpegWithGpsAndOrientation } from '../../support/sample-files';
import { buildTestApp, type TestApp } from '../../support/test-app';

let t: TestApp;
const as = (user: Parameters<typeof bearer>[0]) => ({ Authorization: bearer(user, t.config) });
const binary = (r: request.Response, done: (e: Error | null, b: Buffer) => void) => {
  const chunks: Buffer[] = [];
  const stream = r as unknown as NodeJS.ReadableStream;
  stream.on('data', (c: Buffer) => chunks.push(c));
  stream.on('end', () => done(null, Buffer.concat(chunks)));
};

beforeAll(() => {
  t = buildTestApp();
});
afterAll(() => t.close());

/** The events of an iCalendar text, read with ical.js (a parser of RFC 5545 from the registry). */
function eventsOf(ics: string) {
  const calendar = new ICAL.Component(ICAL.parse(ics));
  return calendar.getAllSubcomponents('vevent').map((v) => {
    const e = new ICAL.Event(v);
    return { uid: e.uid, summary: e.summary, start: e.startDate.toJSDate().toISOString(), alarms: v.getAllSubcomponents('valarm').length };
  });
}

describe('a tester’s calendar', () => {
  let w: ReleaseWorld;
  beforeAll(async () => {
    w = await createReleaseWorld(t.storage, 'Calendar');
  });

  it('lists the reports they owe at their own due times (a date the studio gave them included), parsed back by an iCalendar parser', async () => {
    const tester = w.straggler;
    const later = new Date(Date.now() + 9 * 86_400_000);
    later.setUTCMilliseconds(0);
    await tester.enrollment.update({ dueOverrides: { 'final-report': later.toISOString() } });
    const res = await request(t.app).get('/api/me/calendar.ics').set(as(tester.user));
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/calendar/);
    expect(res.headers['content-disposition']).toContain('basted-due-dates.ics');
    const trial = await Trial.findByPk(w.trial.id, { include: ['milestones'] });
    // iCalendar times are to the second (RFC 5545 §3.3.5).
    const checkIn = new Date(Math.floor(trial!.milestones!.find((m) => m.kind === 'toile-check-in')!.dueAt.getTime() / 1000) * 1000);
    expect(eventsOf(res.text)).toEqual([
      { uid: `${tester.enrollment.id}-toile-check-in@basted`, summary: `Toile check-in due: ${w.trial.title}`, start: checkIn.toISOString(), alarms: 1 },
      { uid: `${tester.enrollment.id}-final-report@basted`, summary: `Final report due: ${w.trial.title}`, start: later.toISOString(), alarms: 1 },
    ]);
    // A finisher's final report shows as sent, with no alarm.
    const finisher = await request(t.app).get('/api/me/calendar.ics').set(as(w.finishers[0].user));
    expect(eventsOf(finisher.text).find((e) => e.uid.endsWith('final-report@basted'))).toMatchObject({ summary: `Sent: Final report due: ${w.trial.title}`, alarms: 0 });
  });

  it('has a private feed address that works without signing in, stops when replaced or stopped, and refuses a forged one', async () => {
    const user = w.finishers[1].user;
    expect((await request(t.app).get('/api/me/calendar').set(as(user))).body).toEqual({ feedUrl: null });
    const made = await request(t.app).post('/api/me/calendar/feed').set(as(user));
    const url = new URL(made.body.feedUrl);
    expect(url.pathname).toMatch(/^\/api\/calendar\/[0-9a-f-]{36}\.[A-Za-z0-9_-]{32}\.ics$/);
    expect((await request(t.app).get('/api/me/calendar').set(as(user))).body).toEqual(made.body);
    const feed = await request(t.app).get(url.pathname);
    expect(feed.status).toBe(200);
    expect(eventsOf(feed.text).map((e) => e.uid)).toEqual([`${w.finishers[1].enrollment.id}-toile-check-in@basted`, `${w.finishers[1].enrollment.id}-final-report@basted`]);

    const forged = url.pathname.replace(/\.([A-Za-z0-9_-])/, (_m, c: string) => `.${c === 'A' ? 'B' : 'A'}`);
    expect((await request(t.app).get(forged)).status).toBe(404);
    expect((await request(t.app).get('/api/calendar/not-a-feed.ics')).status).toBe(400);

    const renewed = await request(t.app).post('/api/me/calendar/feed').set(as(user));
    expect(renewed.body.feedUrl).not.toBe(made.body.feedUrl);
    expect((await request(t.app).get(url.pathname)).status).toBe(404);
    expect((await request(t.app).get(new URL(renewed.body.feedUrl).pathname)).status).toBe(200);
    expect((await request(t.app).delete('/api/me/calendar/feed').set(as(user))).status).toBe(204);
    expect((await request(t.app).get(new URL(renewed.body.feedUrl).pathname)).status).toBe(404);
  });
});

describe('a tester’s own data', () => {
  let w: ReleaseWorld;
  beforeAll(async () => {
    w = await createReleaseWorld(t.storage, 'Data');
  });

  it('exports everything held about them as a ZIP of JSON and their photos, and nothing of anyone else', async () => {
    const me = w.finishers[0];
    await TesterProfile.create({ userId: me.user.id, measurementsMm: { hip: 1000, height: 1620 }, experience: 'confident' });
    const jpeg = await jpegWithGpsAndOrientation();
    const photo = await addPhoto(me.enrollment.id, me.user, { stage: 'final', view: 'side', consent: 'staff-only' }, { buffer: jpeg, name: 'side.jpg' }, t.storage);
    await addPhoto(w.finishers[1].enrollment.id, w.finishers[1].user, { stage: 'final', view: 'side', consent: 'staff-only' }, { buffer: jpeg, name: 'side.jpg' }, t.storage);

    const res = await request(t.app).get('/api/me/export.zip').set(as(me.user)).buffer(true).parse(binary);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/zip');
    const files = unzipSync(new Uint8Array(res.body as Buffer));
    const names = Object.keys(files).sort();
    expect(names).toEqual(
      ['README.txt', 'announcements.json', 'applications.json', 'calendar.json', 'downloads.json', 'messages.json', 'photos.json', 'profile.json', 'reports.json', 'rewards.json', `photos/${w.trial.slug}/final-side-${photo.id.slice(0, 8)}.jpg`].sort(),
    );
    const json = (name: string) => JSON.parse(strFromU8(files[name]));
    expect(json('profile.json').account).toMatchObject({ name: me.user.name, email: me.user.email });
    expect(json('profile.json').body.measurementsMm).toEqual({ hip: 1000, height: 1620 });
    expect(json('applications.json')).toEqual([expect.objectContaining({ trial: w.trial.title, status: 'selected', enrolment: expect.objectContaining({ status: 'finished', size: '8' }) })]);
    expect(json('reports.json')).toEqual([expect.objectContaining({ stage: 'final', content: expect.objectContaining({ sizeSewn: '8', draftVersion: 1 }) })]);
    expect(json('photos.json')).toEqual([expect.objectContaining({ file: `photos/${w.trial.slug}/final-side-${photo.id.slice(0, 8)}.jpg`, view: 'side' })]);
    const image = files[`photos/${w.trial.slug}/final-side-${photo.id.slice(0, 8)}.jpg`];
    // The stored photo itself (JPEG start of image marker), byte for byte.
    expect([image[0], image[1]]).toEqual([0xff, 0xd8]);
    expect(Buffer.from(image).equals(await readObject(t.storage, 'photos', photo.fullKey))).toBe(true);
    const whole = Buffer.from(res.body as Buffer).toString('latin1');
    expect(whole).not.toContain(w.finishers[1].user.email);
  });

  it('deletes the account with its photos and measurements; the reports stay in the findings, counted as before, without the person', async () => {
    const me = w.finishers[2];
    await TesterProfile.create({ userId: me.user.id, measurementsMm: { hip: 1040 } });
    const jpeg = await jpegWithGpsAndOrientation();
    const photo = await addPhoto(me.enrollment.id, me.user, { stage: 'final', view: 'front', consent: 'may-share' }, { buffer: jpeg, name: 'front.jpg' }, t.storage);
    const findingsBefore = await request(t.app).get(`/api/studios/${w.studio.id}/trials/${w.trial.id}/findings`).set(as(w.grader));
    const counts = (body: { input: { testers: number }; result: { testers: number; findings: { kind: string; count: number; testers: number }[] } }) => ({
      reports: body.input.testers,
      testers: body.result.testers,
      findings: body.result.findings.map((f) => [f.kind, f.count, f.testers]),
    });

    const wrong = await request(t.app).delete('/api/me/account').set(as(me.user)).send({ password: 'not my password', confirm: 'delete' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.fields).toEqual({ password: 'is not your password' });
    expect(await Photo.count({ where: { id: photo.id } })).toBe(1);
    const unconfirmed = await request(t.app).delete('/api/me/account').set(as(me.user)).send({ password: TEST_PASSWORD });
    expect(unconfirmed.body.error.fields).toEqual({ confirm: 'Type delete to confirm' });

    const res = await request(t.app).delete('/api/me/account').set(as(me.user)).send({ password: TEST_PASSWORD, confirm: 'delete' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ deleted: true, photosRemoved: 1, reportsKept: 1 });
    expect(res.body.notice).toContain('stay in the studios’ findings without your name');

    // Photos gone from the store and the table; measurements gone from the profile and the application.
    await expect(readObject(t.storage, 'photos', photo.fullKey)).rejects.toThrow();
    await expect(readObject(t.storage, 'photos', photo.thumbKey)).rejects.toThrow();
    expect(await Photo.count({ where: { id: photo.id } })).toBe(0);
    expect(await TesterProfile.count({ where: { userId: me.user.id } })).toBe(0);
    expect((await Application.findOne({ where: { userId: me.user.id } }))!.profileSnapshot).toEqual({});
    const row = (await User.findByPk(me.user.id))!;
    expect(row).toMatchObject({ name: 'Former tester', email: `deleted-${me.user.id}@deleted.basted.invalid` });
    expect(row.deletedAt).not.toBeNull();
    expect(await Membership.count({ where: { userId: me.user.id } })).toBe(0);
    expect(await OutboxMessage.count({ where: { recipientEmail: me.user.email } })).toBe(0);

    // The old session and the old sign-in no longer work.
    expect((await request(t.app).get('/api/auth/session').set(as(me.user))).status).toBe(401);
    expect((await request(t.app).post('/api/auth/sign-in').send({ email: me.user.email, password: TEST_PASSWORD })).status).toBe(401);

    // The report is still there and the findings count it as before.
    expect(await Report.count({ where: { enrollmentId: me.enrollment.id } })).toBe(1);
    const findingsAfter = await request(t.app).get(`/api/studios/${w.studio.id}/trials/${w.trial.id}/findings`).set(as(w.grader));
    expect(counts(findingsAfter.body)).toEqual(counts(findingsBefore.body));
    const reports = await request(t.app).get(`/api/studios/${w.studio.id}/trials/${w.trial.id}/reports`).set(as(w.grader));
    expect(reports.body.map((r: { tester: string }) => r.tester)).toContain('Former tester');
    expect(JSON.stringify(reports.body)).not.toContain(me.user.email);
    expect(await FindingSnapshot.count({ where: { trialId: w.trial.id } })).toBe(1);
  });

  it('refuses to delete the only owner of a studio, and deletes nothing', async () => {
    const res = await request(t.app).delete('/api/me/account').set(as(w.owner)).send({ password: TEST_PASSWORD, confirm: 'delete' });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toContain(`only owner of ${w.studio.name}`);
    expect((await User.findByPk(w.owner.id))!.deletedAt).toBeNull();
  });
});

describe('keeping photos after a release', () => {
  it('removes a released trial’s photos (objects and rows) once the studio’s keeping period has passed, and keeps them before or when the studio keeps them', async () => {
    const w = await createReleaseWorld(t.storage, 'Keep');
    const jpeg = await jpegWithGpsAndOrientation();
    const photo = await addPhoto(w.finishers[0].enrollment.id, w.finishers[0].user, { stage: 'final', view: 'back', consent: 'may-share' }, { buffer: jpeg, name: 'back.jpg' }, t.storage);
    const releasedAt = new Date('2027-01-10T12:00:00Z');
    await w.trial.update({ releasedAt, state: 'closed' });
    const days = (n: number) => new Date(releasedAt.getTime() + n * 86_400_000);

    const setDays = (value: number | null) => request(t.app).patch(`/api/studios/${w.studio.id}`).set(as(w.owner)).send({ settings: { photoRetentionDays: value } });
    expect((await setDays(30)).body.settings.photoRetentionDays).toBe(30);
    const early = await sweepPhotoRetention(t.storage, days(29));
    expect(early.photos).toBe(0);
    expect(await Photo.count({ where: { id: photo.id } })).toBe(1);

    expect((await setDays(null)).body.settings.photoRetentionDays).toBeNull();
    await sweepPhotoRetention(t.storage, days(400));
    expect(await Photo.count({ where: { id: photo.id } })).toBe(1);

    await setDays(30);
    const due = await sweepPhotoRetention(t.storage, days(30));
    expect(due.failed).toBe(0);
    expect(await Photo.count({ where: { id: photo.id } })).toBe(0);
    await expect(readObject(t.storage, 'photos', photo.fullKey)).rejects.toThrow();
    expect((await Trial.findByPk(w.trial.id))!.photosRemovedAt!.toISOString()).toBe(days(30).toISOString());

    const bad = await request(t.app).patch(`/api/studios/${w.studio.id}`).set(as(w.owner)).send({ settings: { photoRetentionDays: -1 } });
    expect(bad.body.error.fields).toEqual({ 'settings.photoRetentionDays': 'must not be negative' });
  });
});
