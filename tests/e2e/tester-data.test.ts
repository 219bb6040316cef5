import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { strFromU8, unzipSync } from 'fflate';
import ICAL from 'ical.js';
import { TesterProfile, User } from '../../db/models';
import { addPhoto } from '../../server/photos/photos.service';
import { readObject } from '../../server/storage/read-object';
import { SCREENSHOT_DIR, startBrowserHarness, type BrowserHarness } from '../support/browser';
import { TEST_PASSWORD } from '../support/factories';
import { createReleaseWorld } from '../support/release-world';
import { jpegWithGpsAndOrientation } from '../support/sample-files';

const WIDE = { width: 1280, height: 800 };
const PHONE = { width: 390, height: 844 };
const shot = (name: string) => path.join(SCREENSHOT_DIR, name);

describe('a tester’s calendar and own data in Chromium', () => {
  let h: BrowserHarness;
  beforeAll(async () => {
    h = await startBrowserHarness();
  });
  afterAll(() => h?.close());

  it('subscribes to the calendar feed, exports their data and deletes the account; photos leave the store, the findings keep their counts', async () => {
    const w = await createReleaseWorld(h.t.storage, 'Own');
    const me = w.finishers[4];
    await TesterProfile.create({ userId: me.user.id, measurementsMm: { hip: 1000, waist: 760, height: 1650 }, experience: 'advanced' });
    const jpeg = await jpegWithGpsAndOrientation();
    const photos = [
      await addPhoto(me.enrollment.id, me.user, { stage: 'final', view: 'front', consent: 'may-share' }, { buffer: jpeg, name: 'front.jpg' }, h.t.storage),
      await addPhoto(me.enrollment.id, me.user, { stage: 'final', view: 'back', consent: 'staff-only' }, { buffer: jpeg, name: 'back.jpg' }, h.t.storage),
    ];
    const grader = await h.newContext();
    expect((await grader.request.post('/api/auth/sign-in', { data: { email: w.grader.email, password: TEST_PASSWORD } })).status()).toBe(200);
    const counts = async () => {
      const body = (await (await grader.request.get(`/api/studios/${w.studio.id}/trials/${w.trial.id}/findings`)).json()) as {
        input: { testers: number };
        result: { testers: number; findings: { kind: string; direction: string; count: number; testers: number }[] };
      };
      return { reports: body.input.testers, testers: body.result.testers, findings: body.result.findings.map((f) => `${f.kind} ${f.direction}: ${f.count} of ${f.testers}`) };
    };
    const before = await counts();

    const context = await h.newContext();
    const page = await h.newPage(context, PHONE);
    await page.goto('/sign-in');
    await page.getByLabel('E-mail').fill(me.user.email);
    await page.getByLabel('Password').fill(TEST_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('heading', { name: 'My trials', level: 1 }).waitFor();

    // The calendar: a private address a calendar app subscribes to, without any sign-in.
    await page.getByRole('button', { name: 'Get a private calendar address' }).click();
    const address = page.getByLabel('Private calendar address');
    await address.waitFor();
    const feedUrl = await address.inputValue();
    await address.scrollIntoViewIfNeeded();
    await page.screenshot({ path: shot('my-trials-calendar-phone.png') });
    const feed = await fetch(feedUrl);
    expect(feed.status).toBe(200);
    expect(feed.headers.get('content-type')).toMatch(/^text\/calendar/);
    // Parsed back with ical.js, an RFC 5545 parser from the registry.
    const calendar = new ICAL.Component(ICAL.parse(await feed.text()));
    expect(calendar.getFirstPropertyValue('x-wr-calname')).toBe('Basted: my due dates');
    const events = calendar.getAllSubcomponents('vevent').map((v) => new ICAL.Event(v));
    expect(events.map((e) => e.uid)).toEqual([`${me.enrollment.id}-toile-check-in@basted`, `${me.enrollment.id}-final-report@basted`]);
    expect(events.map((e) => e.summary)).toEqual([`Toile check-in due: ${w.trial.title}`, `Sent: Final report due: ${w.trial.title}`]);
    const due = (await w.trial.reload({ include: ['milestones'] })).milestones!.find((m) => m.kind === 'final-report')!.dueAt;
    expect(events[1].startDate.toJSDate().getTime()).toBe(Math.floor(due.getTime() / 1000) * 1000);

    // The export: a ZIP of JSON and the photos.
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download all my data (ZIP)' }).click()]);
    expect(download.suggestedFilename()).toMatch(/^basted-my-data-\d{4}-\d\d-\d\d\.zip$/);
    const zip = unzipSync(new Uint8Array(await readFile((await download.path())!)));
    const names = Object.keys(zip).sort();
    expect(names.filter((n) => !n.startsWith('photos/'))).toEqual(
      ['README.txt', 'announcements.json', 'applications.json', 'calendar.json', 'downloads.json', 'messages.json', 'photos.json', 'profile.json', 'reports.json', 'rewards.json'].sort(),
    );
    expect(names.filter((n) => n.startsWith('photos/'))).toEqual(photos.map((p) => `photos/${w.trial.slug}/final-${p.view}-${p.id.slice(0, 8)}.jpg`).sort());
    const profile = JSON.parse(strFromU8(zip['profile.json']));
    expect(profile.account.email).toBe(me.user.email);
    expect(profile.body.measurementsMm).toEqual({ hip: 1000, waist: 760, height: 1650 });
    expect(JSON.parse(strFromU8(zip['calendar.json']))).toMatchObject({ privateFeed: true });
    expect(JSON.parse(strFromU8(zip['reports.json']))[0].content.verdict).toBe('Short in the back rise.');

    // Deleting the account: explained first, then done with the password.
    await page.getByRole('button', { name: 'Delete my account…' }).click();
    await page.getByText('Reports you already sent stay in the studios’ findings, without your name', { exact: false }).waitFor();
    await page.getByLabel('Your password').fill(TEST_PASSWORD);
    await page.getByLabel('Type delete to confirm').fill('delete');
    await page.getByLabel('Type delete to confirm').scrollIntoViewIfNeeded();
    await page.screenshot({ path: shot('my-data-delete-phone.png') });
    const wide = await h.newPage(context, WIDE);
    await wide.goto('/my-trials');
    await wide.getByRole('button', { name: 'Download all my data (ZIP)' }).scrollIntoViewIfNeeded();
    await wide.screenshot({ path: shot('my-data-wide.png') });
    await wide.close();
    await page.getByRole('button', { name: 'Delete my account', exact: true }).click();
    await page.getByRole('heading', { name: 'Your account is deleted' }).waitFor();
    await page.screenshot({ path: shot('account-deleted-phone.png') });

    // Photos are gone from the store; the feed and the session stop; the findings count as before.
    for (const p of photos) {
      await expect(readObject(h.t.storage, 'photos', p.fullKey)).rejects.toThrow();
      await expect(readObject(h.t.storage, 'photos', p.thumbKey)).rejects.toThrow();
    }
    expect((await fetch(feedUrl)).status).toBe(404);
    expect((await context.request.get('/api/auth/session')).status()).toBe(401);
    expect((await User.findByPk(me.user.id))!.name).toBe('Former tester');
    expect(await counts()).toEqual(before);
    expect(h.errors).toEqual([]);
  });
});
