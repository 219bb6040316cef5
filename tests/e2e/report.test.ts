import path from 'node:path';
import { Milestone, Pattern, PatternSize, Trial } from '../../db/models';
import { addMember, createStudio, createUser, TEST_PASSWORD, enrolTester } from '../support/factories';
import { SCREENSHOT_DIR, startBrowserHarness, type BrowserHarness } from '../support/browser';

const PHONE = { width: 390, height: 844 };

describe('a tester’s report in Chromium', () => {
  let h: BrowserHarness;
  beforeAll(async () => {
    h = await startBrowserHarness();
  });
  afterAll(() => h?.close());

  it('is saved as the tester types and survives a page reload; submitting names what is missing', async () => {
    const studio = await createStudio('Report Studio');
    const tester = await createUser('reporter');
    await addMember(studio, tester, 'tester');
    const pattern = await Pattern.create({ studioId: studio.id, name: 'Paperbag trousers', category: 'trousers', fabricKind: 'woven', bodyColumns: ['hip'] });
    const size = await PatternSize.create({ patternId: pattern.id, label: '12', position: 0, bodyMm: { hip: 1003 } });
    const trial = await Trial.create({ studioId: studio.id, patternId: pattern.id, slug: `paperbag-${Date.now()}`, title: 'Paperbag trousers', state: 'running', coverage: { sizes: [{ sizeId: size.id, target: 2 }], heightBands: [], variants: [] } });
    await Milestone.create({ trialId: trial.id, kind: 'final-report', dueAt: new Date(Date.now() + 7 * 86_400_000) });
    const { enrollment } = await enrolTester(trial.id, tester.id, size.id, { plannedFabric: 'Tencel' });

    const context = await h.newContext();
    expect((await context.request.post('/api/auth/sign-in', { data: { email: tester.email, password: TEST_PASSWORD } })).status()).toBe(200);
    const page = await h.newPage(context, PHONE);
    await page.goto('/my-trials');
    await page.getByRole('link', { name: 'Final report' }).click();
    await page.getByRole('heading', { name: 'Final report: Paperbag trousers' }).waitFor();
    expect(enrollment.id).toBeTruthy();

    await page.getByLabel('Size sewn').fill('12');
    await page.getByRole('radiogroup', { name: 'Fit at the waist' }).getByRole('radio', { name: /^-1 / }).click();
    await page.getByRole('button', { name: 'Add an alteration' }).click();
    await page.getByRole('radiogroup', { name: 'Alteration 1: area' }).getByRole('radio', { name: 'Leg' }).click();
    await page.getByRole('radiogroup', { name: 'Alteration 1: what' }).getByRole('radio', { name: 'Leg length' }).click();
    const amount = page.getByLabel('Alteration 1: amount');
    await amount.fill('-1 1/2');
    await amount.blur();
    await page.getByText('All changes saved.').waitFor();

    await page.reload();
    await page.getByRole('heading', { name: 'Final report: Paperbag trousers' }).waitFor();
    expect(await page.getByLabel('Size sewn').inputValue()).toBe('12');
    expect(await page.getByLabel('Alteration 1: amount').inputValue()).toBe('-1 1/2 in');
    expect(await page.getByRole('radiogroup', { name: 'Fit at the waist' }).getByRole('radio', { name: /^-1 / }).getAttribute('aria-checked')).toBe('true');

    await page.getByRole('button', { name: 'Submit the final report' }).click();
    await page.getByText('The report is not complete yet.').waitFor();
    await page.getByText('Overall verdict: Give your overall verdict').waitFor();
    await page.getByLabel('Draft version sewn').fill('1');
    await page.getByLabel('Overall verdict').fill('Lovely drape; the legs were long for me.');
    await page.getByText('All changes saved.').waitFor();
    await page.getByRole('button', { name: 'Submit the final report' }).click();
    await page.getByText('Submitted. Thank you! You can still change it until the due time.').waitFor();
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'final-report-phone.png'), fullPage: true });

    // The trial's grader reads it on the trial page.
    const grader = await createUser('report-grader');
    await addMember(studio, grader, 'grader');
    const staff = await h.newContext();
    expect((await staff.request.post('/api/auth/sign-in', { data: { email: grader.email, password: TEST_PASSWORD } })).status()).toBe(200);
    const wide = await h.newPage(staff, { width: 1280, height: 800 });
    await wide.goto(`/trials/${trial.id}`);
    await wide.getByText(`${tester.name} · size 12 · draft 1`).waitFor();
    await wide.getByText('• Leg length: -1 1/2 in (both)').waitFor();
    // One final report is too few to say anything: the trial's findings flag nothing.
    await wide.getByText('Draft 1: 1 tester reported. Nothing points at the pattern or at personal fit.').waitFor();
    expect(h.errors).toEqual([]);
  });
});
