import path from 'node:path';
import type { Page } from 'playwright-core';
import { Enrollment, Membership, PatternSize, Photo, Report, Studio, Trial } from '../../db/models';
import { DEMO_PASSWORD, DEMO_STUDIO, DEMO_TRIAL_SLUG, seedDemoStudio } from '../../db/seeders/demo-studio';
import { fitAreasFor } from '../../server/domain/alterations';
import { SCREENSHOT_DIR, startBrowserHarness, type BrowserHarness } from '../support/browser';
import { createUser, enrolTester, TEST_PASSWORD } from '../support/factories';
import { jpegWithGpsAndOrientation } from '../support/sample-files';
import { ownMailDatabase } from '../server/api/mail-support';

const PHONE = { width: 390, height: 844 };
const WIDE = { width: 1280, height: 800 };
const IN = 25.4;
const YD = 914.4;

jest.setTimeout(300_000);

type Focus = { role: string; name: string; checked: string | null; inDialog: boolean };

/** The focused element as a screen reader would name it: its role, its name, and whether it is checked. */
async function focused(page: Page): Promise<Focus> {
  return page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    if (!el || el === document.body) return { role: 'none', name: '', checked: null, inDialog: false };
    const tag = el.tagName.toLowerCase();
    const implicit: Record<string, string> = { a: 'link', button: 'button', textarea: 'textbox', select: 'combobox' };
    const input = el as HTMLInputElement;
    const role = el.getAttribute('role') ?? (tag === 'input' ? (input.type === 'file' ? 'file' : 'textbox') : (implicit[tag] ?? tag));
    const name = (el.getAttribute('aria-label') ?? el.innerText ?? '').replace(/\s+/g, ' ').trim();
    return { role, name, checked: el.getAttribute('aria-checked'), inDialog: Boolean(el.closest('[role="dialog"]')) };
  });
}

/** Presses Tab (or Shift+Tab) until the focus is on the control asked for; fails if it never gets there. */
async function tabTo(page: Page, role: string, name: string | RegExp, options: { back?: boolean; max?: number } = {}): Promise<void> {
  const seen: string[] = [];
  for (let i = 0; i < (options.max ?? 120); i += 1) {
    await page.keyboard.press(options.back ? 'Shift+Tab' : 'Tab');
    const f = await focused(page);
    seen.push(`${f.role} “${f.name.slice(0, 40)}”`);
    if (f.role === role && (typeof name === 'string' ? f.name === name : name.test(f.name))) return;
  }
  throw new Error(`Tab never reached ${role} “${name}”. Focus went through:\n${seen.join('\n')}`);
}

/**
 * Tabs into a radio group (one stop), unless the focus is in it already, and moves with the arrow
 * keys until the option wanted is focused, then chooses it with Space if the arrows did not.
 */
async function chooseByArrows(page: Page, group: string, option: string | RegExp) {
  const radios = page.getByRole('radiogroup', { name: group, exact: true }).getByRole('radio');
  const names = await radios.evaluateAll((els) => els.map((e) => e.getAttribute('aria-label') ?? ''));
  const start = await focused(page);
  if (!(start.role === 'radio' && (await radios.evaluateAll((els) => els.some((e) => e === document.activeElement))))) await tabTo(page, 'radio', /.*/, { max: 60 });
  // The next stop must be the group asked for (a radio group is one Tab stop).
  const inGroup = await radios.evaluateAll((els) => els.some((e) => e === document.activeElement));
  if (!inGroup) throw new Error(`Tab reached the radio “${(await focused(page)).name}”, not one of “${group}” (${names.join(', ')})`);
  for (let i = 0; i <= names.length; i += 1) {
    const f = await focused(page);
    if (typeof option === 'string' ? f.name === option : option.test(f.name)) {
      if (f.checked !== 'true') await page.keyboard.press(' ');
      return;
    }
    await page.keyboard.press('ArrowRight');
  }
  throw new Error(`the arrows never reached “${option}” in ${group}`);
}

describe('by keyboard alone, in Chromium', () => {
  let h: BrowserHarness;
  let db: Awaited<ReturnType<typeof ownMailDatabase>>;
  let previousUrl: string | undefined;
  let trial: Trial;

  beforeAll(async () => {
    db = await ownMailDatabase();
    previousUrl = process.env.DATABASE_URL;
    process.env.DATABASE_URL = db.url;
    h = await startBrowserHarness();
    await seedDemoStudio(h.t.sequelize, 4);
    trial = (await Trial.findOne({ where: { slug: DEMO_TRIAL_SLUG } }))!;
  });
  afterAll(async () => {
    await h?.close();
    process.env.DATABASE_URL = previousUrl;
    await db?.drop();
  });

  it('a tester signs in, writes and sends a whole final report (radios by arrows, switches by Space, a photo through the file chooser) without the mouse', async () => {
    const studio = (await Studio.findOne({ where: { slug: DEMO_STUDIO.slug } }))!;
    const user = await createUser('keys', { name: 'Kit Keyboard' });
    await Membership.create({ studioId: studio.id, userId: user.id, role: 'tester' });
    const size10 = (await PatternSize.findOne({ where: { patternId: trial.patternId, label: '10' } }))!;
    const { enrollment } = await enrolTester(trial.id, user.id, size10.id);

    const context = await h.newContext();
    const page = await h.newPage(context, PHONE);
    await page.goto('/sign-in');
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    await tabTo(page, 'textbox', 'E-mail');
    await page.keyboard.type(user.email);
    await tabTo(page, 'textbox', 'Password');
    await page.keyboard.type(TEST_PASSWORD);
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { name: 'My trials', level: 1 }).waitFor();

    await tabTo(page, 'link', 'Final report');
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { name: /^Final report: / }).waitFor();

    await tabTo(page, 'textbox', 'Size sewn');
    await page.keyboard.type('10');
    await chooseByArrows(page, 'Draft version sewn', 'Draft 2');
    await chooseByArrows(page, 'Variant sewn', 'The main pattern');
    const areas = fitAreasFor('trousers');
    for (const area of areas) await chooseByArrows(page, `Fit at the ${area}`, area === 'leg' ? /^\+1 / : /^0 /);
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'keyboard-report-radios-phone.png') });

    await tabTo(page, 'button', 'Add an alteration');
    await page.keyboard.press('Enter');
    await chooseByArrows(page, 'Alteration 1: area', 'Leg');
    await chooseByArrows(page, 'Alteration 1: what', 'Leg length');
    await tabTo(page, 'textbox', 'Alteration 1: amount');
    await page.keyboard.type('-1 1/2');
    await chooseByArrows(page, 'Alteration 1: where', 'Both');
    await tabTo(page, 'textbox', 'Alteration 1: note');
    await page.keyboard.type('Shortened at the lengthen line.');

    await tabTo(page, 'textbox', 'Fabric');
    await page.keyboard.type('Viscose twill');
    await tabTo(page, 'textbox', 'Fabric width');
    await page.keyboard.type('60');
    await tabTo(page, 'textbox', 'Length used');
    await page.keyboard.type('3 1/4');
    await tabTo(page, 'switch', /^Napped or one-way fabric/);
    await page.keyboard.press(' ');
    expect((await focused(page)).checked).toBe('true');

    await tabTo(page, 'button', 'Add a step');
    await page.keyboard.press('Enter');
    await tabTo(page, 'textbox', 'Unclear step 1: number');
    await page.keyboard.type('7');
    await tabTo(page, 'textbox', 'Unclear step 1: what was unclear');
    await page.keyboard.type('Which way the fly shield faces.');

    // The photo: the file chooser opens from the keyboard (Space on the file button).
    await chooseByArrows(page, 'Who may see a new front photo', 'The studio may share it');
    await tabTo(page, 'file', 'Add a front photo');
    const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.keyboard.press(' ')]);
    await chooser.setFiles({ name: 'front.jpg', mimeType: 'image/jpeg', buffer: await jpegWithGpsAndOrientation() });
    await page.getByRole('radiogroup', { name: 'Who may see the front photo' }).waitFor({ timeout: 30_000 });

    await tabTo(page, 'textbox', 'Overall verdict');
    await page.keyboard.type('Drapes well; I shortened the legs.');
    await tabTo(page, 'switch', 'I would make it again');
    await page.keyboard.press(' ');
    expect((await focused(page)).checked).toBe('true');
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'keyboard-report-switch-phone.png') });

    await tabTo(page, 'button', 'Submit the final report');
    await page.keyboard.press('Enter');
    await page.getByText(/^Submitted .*\. Thank you!/).waitFor({ timeout: 30_000 });
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'keyboard-report-sent-phone.png') });

    const report = (await Report.findOne({ where: { enrollmentId: enrollment.id, stage: 'final' } }))!;
    expect(report.submittedAt).not.toBeNull();
    expect(report.content).toMatchObject({
      sizeSewn: '10',
      draftVersion: 2,
      variantSewn: null,
      fit: Object.fromEntries(areas.map((a) => [a, a === 'leg' ? 1 : 0])),
      alterations: [{ area: 'leg', kind: 'leg-length', amountMm: -1.5 * IN, where: 'both', note: 'Shortened at the lengthen line.', otherText: '' }],
      unclearSteps: [{ step: '7', problem: 'Which way the fly shield faces.' }],
      verdict: 'Drapes well; I shortened the legs.',
      wouldMakeAgain: true,
    });
    expect(report.content.fabric).toMatchObject({ kind: 'Viscose twill', widthMm: 60 * IN, napped: true });
    expect(report.content.fabric!.usedMm).toBeCloseTo(3.25 * YD, 6);
    const photos = await Photo.findAll({ where: { enrollmentId: enrollment.id } });
    expect(photos.map((p) => [p.view, p.consent])).toEqual([['front', 'may-share']]);
    expect((await Enrollment.findByPk(enrollment.id))!.status).toBe('finished');
    expect(h.errors).toEqual([]);
  });

  it('the photo viewer keeps the focus inside while open, closes on Escape, and gives the focus back to the photo that opened it', async () => {
    const context = await h.newContext();
    expect((await context.request.post('/api/auth/sign-in', { data: { email: 'coordinator@demo.basted.test', password: DEMO_PASSWORD } })).status()).toBe(200);
    const page = await h.newPage(context, WIDE);
    await page.goto(`/trials/${trial.id}`);
    const opener = page.getByRole('button', { name: /^Open the front photo/ }).first();
    await opener.waitFor({ timeout: 30_000 });
    await opener.focus();
    const openerName = await opener.getAttribute('aria-label');
    await page.keyboard.press('Enter');
    const dialog = page.getByRole('dialog');
    await dialog.waitFor();
    expect(await dialog.getAttribute('aria-label')).toMatch(/^Front · /);
    expect((await focused(page)).inDialog).toBe(true);
    for (let i = 0; i < 6; i += 1) {
      await page.keyboard.press('Tab');
      expect((await focused(page)).inDialog).toBe(true);
    }
    await page.keyboard.press('Shift+Tab');
    expect((await focused(page)).inDialog).toBe(true);
    await page.keyboard.press('Escape');
    await dialog.waitFor({ state: 'detached' });
    expect((await focused(page)).name).toBe(openerName);
    expect(h.errors).toEqual([]);
  });
});
