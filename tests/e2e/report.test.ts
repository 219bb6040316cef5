import path from 'node:path';
import type { Page } from 'playwright-core';
import { Enrollment, Milestone, Pattern, PatternSize, Report, Trial, type User } from '../../db/models';
import { addMember, createStudio, createUser, TEST_PASSWORD, enrolTester } from '../support/factories';
import { SCREENSHOT_DIR, startBrowserHarness, type BrowserHarness } from '../support/browser';
import { savedAll, slowPhone } from '../support/report-page';

const PHONE = { width: 390, height: 844 };
const WIDE = { width: 1280, height: 800 };
const DAY = 86_400_000;
const IN = 25.4;

async function signedIn(h: BrowserHarness, user: User) {
  const context = await h.newContext();
  expect((await context.request.post('/api/auth/sign-in', { data: { email: user.email, password: TEST_PASSWORD } })).status()).toBe(200);
  return context;
}

const storedFinal = async (enrollmentId: string) => (await Report.findOne({ where: { enrollmentId, stage: 'final' } }))?.content;

jest.setTimeout(150_000);

describe('a tester’s report in Chromium, on a slow phone', () => {
  let h: BrowserHarness;
  let studio: Awaited<ReturnType<typeof createStudio>>;
  let size: PatternSize;
  let trial: Trial;
  beforeAll(async () => {
    h = await startBrowserHarness();
    studio = await createStudio('Report Studio');
    const pattern = await Pattern.create({ studioId: studio.id, name: 'Paperbag trousers', category: 'trousers', fabricKind: 'woven', bodyColumns: ['hip'] });
    size = await PatternSize.create({ patternId: pattern.id, label: '12', position: 0, bodyMm: { hip: 1003 } });
    trial = await Trial.create({ studioId: studio.id, patternId: pattern.id, slug: `paperbag-${Date.now()}`, title: 'Paperbag trousers', state: 'running', coverage: { sizes: [{ sizeId: size.id, target: 9 }], heightBands: [], variants: [] } });
    await Milestone.create({ trialId: trial.id, kind: 'final-report', dueAt: new Date(Date.now() + 7 * DAY) });
  });
  afterAll(() => h?.close());

  async function tester(prefix: string) {
    const user = await createUser(prefix);
    await addMember(studio, user, 'tester');
    const { enrollment } = await enrolTester(trial.id, user.id, size.id, { plannedFabric: 'Tencel' });
    return { user, enrollment };
  }

  async function openFinal(page: Page) {
    await page.goto('/my-trials');
    await page.getByRole('link', { name: 'Final report' }).click();
    await page.getByRole('heading', { name: 'Final report: Paperbag trousers' }).waitFor();
  }

  it('a typed signed amount survives a reload made right after typing, exactly; a save the server refuses blocks submit with the reason', async () => {
    const { user, enrollment } = await tester('reporter');
    const context = await signedIn(h, user);
    const page = await slowPhone(h, context);
    await openFinal(page);

    await page.getByLabel('Size sewn').fill('12');
    await page.getByRole('radiogroup', { name: 'Fit at the waist' }).getByRole('radio', { name: /^-1 / }).click();
    await page.getByRole('button', { name: 'Add an alteration' }).click();
    // A new row answers nothing for the tester.
    for (const group of ['Alteration 1: area', 'Alteration 1: where']) {
      expect(await page.getByRole('radiogroup', { name: group }).locator('[aria-checked="true"]').count()).toBe(0);
    }
    expect(await page.getByLabel('Alteration 1: amount').inputValue()).toBe('');
    await page.getByText('Choose the area first, then what you changed.').waitFor();
    await page.getByRole('radiogroup', { name: 'Alteration 1: area' }).getByRole('radio', { name: 'Leg' }).click();
    await page.getByRole('radiogroup', { name: 'Alteration 1: what' }).getByRole('radio', { name: 'Leg length' }).click();
    await page.getByLabel('Alteration 1: amount').pressSequentially('-1 1/2');
    // Reloaded at once: no wait for any save.
    await page.reload();
    await page.getByRole('heading', { name: 'Final report: Paperbag trousers' }).waitFor();
    expect(await page.getByLabel('Alteration 1: amount').inputValue()).toBe('-1 1/2 in');
    expect(await page.getByLabel('Size sewn').inputValue()).toBe('12');
    expect(await page.getByRole('radiogroup', { name: 'Fit at the waist' }).getByRole('radio', { name: /^-1 / }).getAttribute('aria-checked')).toBe('true');
    await savedAll(page);
    const stored = await storedFinal(enrollment.id);
    expect(stored?.alterations).toEqual([{ area: 'leg', kind: 'leg-length', amountMm: -1.5 * IN, where: null, note: '', otherText: '' }]);
    expect(stored?.sizeSewn).toBe('12');

    // 25 in reads as a length here but is more than the server takes for an alteration (50 cm).
    const amount = page.getByLabel('Alteration 1: amount');
    await amount.fill('25');
    await amount.blur();
    await page.getByRole('status', { name: 'Save status' }).getByText('Not saved — Alteration 1: amount: must be at most 50 cm either way. Your changes are kept on this device.').waitFor();
    await page.getByLabel('Draft version sewn').fill('1');
    await page.getByLabel('Overall verdict').fill('Lovely drape; the legs were long for me.');
    await page.getByRole('button', { name: 'Submit the final report' }).click();
    await page.getByRole('alert').getByText(/^Not submitted: your latest changes are not saved yet/).waitFor();
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'final-report-refused-phone.png'), fullPage: false });
    const afterRefusal = await Report.findOne({ where: { enrollmentId: enrollment.id, stage: 'final' } });
    expect(afterRefusal!.submittedAt).toBeNull();
    expect(afterRefusal!.content.alterations![0].amountMm).toBeCloseTo(-1.5 * IN, 9);

    await amount.fill('-1 1/2');
    await amount.blur();
    await savedAll(page);
    await page.getByRole('button', { name: 'Submit the final report' }).click();
    await page.getByText(/^Submitted .*\. Thank you! You can still change it until the due time\.$/).waitFor();
    const done = await Report.findOne({ where: { enrollmentId: enrollment.id, stage: 'final' } });
    expect(done!.submittedAt).not.toBeNull();
    expect(done!.content).toMatchObject({ sizeSewn: '12', draftVersion: 1, verdict: 'Lovely drape; the legs were long for me.' });
    expect((await Enrollment.findByPk(enrollment.id))!.status).toBe('finished');
    // Sent: the report now reads as sent, with its receipt, until the tester chooses to change it.
    await page.getByRole('button', { name: 'Change my answers' }).waitFor();
    expect(await page.getByLabel('Overall verdict').isEditable()).toBe(false);
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'final-report-phone.png'), fullPage: true });

    // The trial's grader reads it on the trial page.
    const grader = await createUser('report-grader');
    await addMember(studio, grader, 'grader');
    const staff = await signedIn(h, grader);
    const wide = await h.newPage(staff, WIDE);
    await wide.goto(`/trials/${trial.id}`);
    await wide.getByText(`${user.name} · size 12 · draft 1`).waitFor();
    await wide.getByText('• Leg length: -1 1/2 in').waitFor();
    // One final report is too few to say anything: the trial's findings flag nothing.
    await wide.getByText('Draft 1: 1 tester reported. Nothing points at the pattern or at personal fit.').waitFor();
    expect(h.errors).toEqual([]);
  });

  it('with the network cut, changes stay on the device and the screen says so; when it returns they are sent', async () => {
    const { user, enrollment } = await tester('offline');
    const context = await signedIn(h, user);
    const page = await slowPhone(h, context);
    await openFinal(page);
    await page.getByLabel('Size sewn').fill('12');
    await savedAll(page);

    await context.setOffline(true);
    await page.getByLabel('Overall verdict').fill('Typed on the bus with no signal.');
    await page.getByRole('status', { name: 'Save status' }).getByText('Offline: your changes are kept on this device and will be sent when the connection returns.').waitFor({ timeout: 30_000 });
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'final-report-offline-phone.png'), fullPage: false });
    expect((await storedFinal(enrollment.id))?.verdict).toBeUndefined();
    expect(await page.evaluate(() => Object.keys(window.localStorage).filter((k) => k.startsWith('basted:unsaved:')).length)).toBe(1);

    await context.setOffline(false);
    await page.getByRole('status', { name: 'Save status' }).getByText(/^Back online: your changes were sent\. Saved at \d\d:\d\d\.$/).waitFor({ timeout: 40_000 });
    await savedAll(page);
    expect((await storedFinal(enrollment.id))?.verdict).toBe('Typed on the bus with no signal.');
    await page.reload();
    expect(await page.getByLabel('Overall verdict').inputValue()).toBe('Typed on the bus with no signal.');
    expect(h.errors.filter((e) => !/ERR_INTERNET_DISCONNECTED|Failed to fetch/.test(e))).toEqual([]);
  });

  it('two tabs editing the same report: the second one’s stale save gets a 409, which it resolves keeping both edits', async () => {
    const { user, enrollment } = await tester('two-tabs');
    const context = await signedIn(h, user);
    const first = await slowPhone(h, context);
    const second = await h.newPage(context, PHONE);
    await openFinal(first);
    await openFinal(second);

    // The second tab's first save is held back until the first tab's save is in.
    let releaseSecond: () => void = () => undefined;
    const firstSaved = new Promise<void>((resolve) => (releaseSecond = resolve));
    const answers: number[] = [];
    second.on('response', (r) => {
      if (r.request().method() === 'PUT' && r.url().includes('/reports/final')) answers.push(r.status());
    });
    let held = false;
    await second.route('**/reports/final', async (route) => {
      if (route.request().method() === 'PUT' && !held) {
        held = true;
        await firstSaved;
      }
      await route.continue();
    });

    await second.getByLabel('Size sewn').fill('12');
    await first.getByLabel('Overall verdict').fill('Written in the first tab.');
    await savedAll(first);
    releaseSecond();
    await savedAll(second);
    expect(answers).toEqual([409, 200]);
    await second.getByText(/^This report was also changed in another window or on another device \(verdict\)\. Both sets of changes are kept\.$/).waitFor();
    expect(await storedFinal(enrollment.id)).toMatchObject({ sizeSewn: '12', verdict: 'Written in the first tab.' });
    await first.reload();
    expect(await first.getByLabel('Size sewn').inputValue()).toBe('12');
    expect(await first.getByLabel('Overall verdict').inputValue()).toBe('Written in the first tab.');
  });

  it('an alteration row with no answer is not counted; a row with only a note asks for its kind and amount', async () => {
    const { user, enrollment } = await tester('blank-rows');
    const context = await signedIn(h, user);
    const page = await slowPhone(h, context);
    await openFinal(page);
    await page.getByLabel('Size sewn').fill('12');
    await page.getByLabel('Draft version sewn').fill('1');
    await page.getByRole('radiogroup', { name: 'Fit at the leg' }).getByRole('radio', { name: /^0 / }).click();
    await page.getByLabel('Overall verdict').fill('Fits as drafted.');
    await page.getByRole('button', { name: 'Add an alteration' }).click();
    await page.getByRole('button', { name: 'Add an alteration' }).click();
    await page.getByLabel('Alteration 2: note').fill('Maybe the hem next time');
    await page.getByText('Not counted yet: choose what you changed; give the amount you changed.').waitFor();
    await savedAll(page);

    await page.getByRole('button', { name: 'Submit the final report' }).click();
    await page.getByRole('alert').getByText('The report is not complete yet. Alteration 2: what: Choose what you changed; Alteration 2: amount: Give the amount you changed.').waitFor();
    await page.getByRole('button', { name: 'Remove alteration 2' }).click();
    await savedAll(page);
    await page.getByRole('button', { name: 'Submit the final report' }).click();
    await page.getByText(/^Submitted .*\. Thank you!/).waitFor();

    const row = (await Report.findOne({ where: { enrollmentId: enrollment.id, stage: 'final' } }))!;
    expect(row.submittedAt).not.toBeNull();
    // The blank row is kept as the tester left it, and counts for nothing.
    expect(row.content.alterations).toEqual([{ area: null, kind: null, amountMm: null, where: null, note: '', otherText: '' }]);
    const staff = await signedIn(h, await staffMember());
    const csv = await (await staff.request.get(`/api/studios/${studio.id}/trials/${trial.id}/reports.csv?stage=final`)).text();
    const line = csv.split('\r\n').find((l) => l.startsWith(user.name));
    expect(line).toMatch(/,,,,,,$/); // no area, kind, reading, amount, side or note: no alteration
  });

  async function staffMember() {
    const grader = await createUser('csv-grader');
    await addMember(studio, grader, 'grader');
    return grader;
  }
});
