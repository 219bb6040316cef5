import path from 'node:path';
import type { Page } from 'playwright-core';
import { Draft, Milestone, Pattern, PatternSize, Trial, type User } from '../../db/models';
import { addMember, createStudio, createUser, TEST_PASSWORD, enrolTester } from '../support/factories';
import { SCREENSHOT_DIR, startBrowserHarness, type BrowserHarness } from '../support/browser';
import { savedAll } from '../support/report-page';
import { jpegWithGpsAndOrientation } from '../support/sample-files';

const PHONE = { width: 390, height: 844 };
const DAY = 86_400_000;

/** Picks a photo file in the report's chooser for one view and waits until it is stored and shown. */
async function addPhoto(page: Page, noun: string, file: { name: string; mimeType: string; buffer: Buffer }, consent?: string) {
  if (consent) await page.getByRole('radiogroup', { name: `Who may see a new ${noun} photo` }).getByRole('radio', { name: consent }).click();
  await page.getByLabel(`Add a ${noun} photo`).setInputFiles(file);
  await page.getByRole('radiogroup', { name: `Who may see the ${noun} photo` }).waitFor({ timeout: 20_000 });
}

describe('a tester’s check-in and final report with photos, on a phone, and the studio’s view of them', () => {
  let h: BrowserHarness;
  beforeAll(async () => {
    h = await startBrowserHarness();
  });
  afterAll(() => h?.close());

  it('a tester sends a check-in and a final report with three photos; the coordinator sees them; another tester sees none of it', async () => {
    const studio = await createStudio('Photo Studio');
    const coordinator = await createUser('wall-coordinator');
    await addMember(studio, coordinator, 'coordinator');
    const pattern = await Pattern.create({ studioId: studio.id, name: 'Sailcloth trousers', category: 'trousers', fabricKind: 'woven', bodyColumns: ['hip'] });
    const sizes = await Promise.all(['10', '12'].map((label, position) => PatternSize.create({ patternId: pattern.id, label, position, bodyMm: { hip: 990 + 38 * position } })));
    await Draft.create({ patternId: pattern.id, version: 1, changeNote: 'First draft' });
    const trial = await Trial.create({ studioId: studio.id, patternId: pattern.id, slug: `sailcloth-${Date.now()}`, title: 'Sailcloth trousers', state: 'running', coverage: { sizes: sizes.map((s) => ({ sizeId: s.id, target: 2 })), heightBands: [], variants: [] } });
    await Milestone.create({ trialId: trial.id, kind: 'toile-check-in', dueAt: new Date(Date.now() + 3 * DAY) });
    await Milestone.create({ trialId: trial.id, kind: 'final-report', dueAt: new Date(Date.now() + 10 * DAY) });
    const enrol = async (user: User, size: PatternSize) => {
      await addMember(studio, user, 'tester');
      return (await enrolTester(trial.id, user.id, size.id, { plannedFabric: 'Canvas' })).enrollment;
    };
    const tester = await createUser('photo-tester');
    const other = await createUser('photo-other');
    const mine = await enrol(tester, sizes[1]);
    await enrol(other, sizes[0]);
    const jpeg = await jpegWithGpsAndOrientation();
    const photo = (name: string) => ({ name, mimeType: 'image/jpeg', buffer: jpeg });

    const context = await h.newContext();
    expect((await context.request.post('/api/auth/sign-in', { data: { email: tester.email, password: TEST_PASSWORD } })).status()).toBe(200);
    const page = await h.newPage(context, PHONE);

    // The toile check-in, with one photo.
    await page.goto('/my-trials');
    await page.getByRole('link', { name: 'Toile check-in' }).click();
    await page.getByRole('heading', { name: 'Toile check-in: Sailcloth trousers' }).waitFor();
    await page.getByLabel('Size sewn').fill('12');
    await page.getByRole('radiogroup', { name: 'Draft version sewn' }).getByRole('radio', { name: 'Draft 1' }).click();
    await page.getByRole('radiogroup', { name: 'Fit at the rise' }).getByRole('radio', { name: /^-1 / }).click();
    await page.getByLabel('Overall verdict').fill('The toile rise is short at the back.');
    await addPhoto(page, 'side', photo('toile-side.jpg'));
    await savedAll(page);
    await page.getByRole('button', { name: 'Submit the toile check-in' }).click();
    await page.getByText(/^Submitted .*\. Thank you! You can still change it until the due time\.$/).waitFor();

    // The final report: fabric, an alteration, and front, side and back photos.
    await page.goto('/my-trials');
    await page.getByRole('link', { name: 'Final report' }).click();
    await page.getByRole('heading', { name: 'Final report: Sailcloth trousers' }).waitFor();
    await page.getByLabel('Size sewn').fill('12');
    await page.getByRole('radiogroup', { name: 'Draft version sewn' }).getByRole('radio', { name: 'Draft 1' }).click();
    await page.getByRole('radiogroup', { name: 'Fit at the waist' }).getByRole('radio', { name: /^0 / }).click();
    await page.getByRole('button', { name: 'Add an alteration' }).click();
    await page.getByRole('radiogroup', { name: 'Alteration 1: area' }).getByRole('radio', { name: 'Rise' }).click();
    await page.getByRole('radiogroup', { name: 'Alteration 1: what' }).getByRole('radio', { name: 'Back crotch length' }).click();
    const amount = page.getByLabel('Alteration 1: amount');
    await amount.fill('3/4');
    await amount.blur();
    await page.getByLabel('Fabric', { exact: true }).fill('Cotton canvas');
    const width = page.getByLabel('Fabric width');
    await width.fill('58');
    await width.blur();
    const used = page.getByLabel('Length used');
    await used.fill('2 1/4');
    await used.blur();
    await addPhoto(page, 'front', photo('front.jpg'), 'The studio may share it');
    await addPhoto(page, 'side', photo('side.jpg'));
    await addPhoto(page, 'back', photo('back.jpg'));
    await page.getByLabel('Overall verdict').fill('Comfortable once the back rise was lengthened.');
    await savedAll(page);
    await page.getByRole('button', { name: 'Submit the final report' }).click();
    await page.getByText(/^Submitted .*\. Thank you! You can still change it until the due time\.$/).waitFor();
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'final-report-photos-phone.png'), fullPage: true });

    // A reload keeps everything, the photos included.
    await page.reload();
    await page.getByRole('heading', { name: 'Final report: Sailcloth trousers' }).waitFor();
    expect(await page.getByLabel('Length used').inputValue()).toBe('2 1/4 yd');
    for (const noun of ['front', 'side', 'back']) await page.getByRole('img', { name: `${noun[0].toUpperCase()}${noun.slice(1)} photo` }).first().waitFor();
    expect(await page.getByRole('radiogroup', { name: 'Who may see the front photo' }).getByRole('radio', { name: 'The studio may share it' }).getAttribute('aria-checked')).toBe('true');

    // The coordinator sees the reports and the photo wall.
    const staff = await h.newContext();
    expect((await staff.request.post('/api/auth/sign-in', { data: { email: coordinator.email, password: TEST_PASSWORD } })).status()).toBe(200);
    const wide = await h.newPage(staff, { width: 1280, height: 900 });
    await wide.goto(`/trials/${trial.id}`);
    await wide.getByText(`${tester.name} · size 12 · draft 1`).waitFor();
    await wide.getByText(/Cotton canvas · 58 in wide · 2 1\/4 yd used/).waitFor();
    for (const view of ['Front', 'Side', 'Back']) await wide.getByRole('img', { name: `${view} photo of ${tester.name}, size 12` }).first().waitFor();
    await wide.getByRole('button', { name: `Open the front photo of ${tester.name}, size 12` }).click();
    await wide.getByText(/The studio may share it/).first().waitFor();
    await wide.screenshot({ path: path.join(SCREENSHOT_DIR, 'photo-wall-wide.png'), fullPage: true });

    // The other tester of the same trial reaches none of it.
    const outsider = await h.newContext();
    expect((await outsider.request.post('/api/auth/sign-in', { data: { email: other.email, password: TEST_PASSWORD } })).status()).toBe(200);
    expect((await outsider.request.get(`/api/me/enrollments/${mine.id}/reports/final`)).status()).toBe(403);
    expect((await outsider.request.get(`/api/me/enrollments/${mine.id}/photos`)).status()).toBe(403);
    const photos = (await (await context.request.get(`/api/me/enrollments/${mine.id}/photos`)).json()) as { id: string }[];
    expect(photos).toHaveLength(4);
    expect((await outsider.request.post(`/api/photos/${photos[0].id}/link`)).status()).toBe(403);
    expect((await outsider.request.get(`/api/studios/${studio.id}/trials/${trial.id}/photos`)).status()).toBe(403);
    expect(h.errors).toEqual([]);
  });
});
