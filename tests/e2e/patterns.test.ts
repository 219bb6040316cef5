import path from 'node:path';
import request from 'supertest';
import type { BrowserContext } from 'playwright-core';
import { addMember, bearer, createStudio, createUser, TEST_PASSWORD } from '../support/factories';
import { SCREENSHOT_DIR, startBrowserHarness, type BrowserHarness } from '../support/browser';

const WIDE = { width: 1280, height: 800 };
const PHONE = { width: 390, height: 844 };
const IN = 25.4;

async function signedIn(h: BrowserHarness, email: string): Promise<BrowserContext> {
  const context = await h.newContext();
  const res = await context.request.post('/api/auth/sign-in', { data: { email, password: TEST_PASSWORD } });
  expect(res.status()).toBe(200);
  return context;
}

describe('patterns and size charts in Chromium', () => {
  let h: BrowserHarness;
  beforeAll(async () => {
    h = await startBrowserHarness();
  });
  afterAll(() => h?.close());

  it('a coordinator builds a chart in the grid, a bad CSV changes nothing, a good one imports, and a tester gets their size', async () => {
    const studio = await createStudio('Chart Studio');
    const coordinator = await createUser('chart-coord');
    const tester = await createUser('chart-tester');
    await addMember(studio, coordinator, 'coordinator');
    await addMember(studio, tester, 'tester');

    const context = await signedIn(h, coordinator.email);
    const page = await h.newPage(context, WIDE);
    await page.goto('/patterns');
    await page.getByLabel('Pattern name').fill('Linen trousers');
    await page.getByRole('button', { name: 'Create pattern' }).click();
    await page.getByRole('heading', { name: 'Linen trousers' }).waitFor();

    const columns = page.getByRole('group', { name: 'Body measurements in the chart' });
    await columns.getByRole('checkbox', { name: 'Waist', exact: true }).click();
    await columns.getByRole('checkbox', { name: 'Hip', exact: true }).click();
    for (let i = 0; i < 3; i += 1) await page.getByRole('button', { name: 'Add a size' }).click();
    const labels = ['10', '12', '14'];
    for (const [i, label] of labels.entries()) await page.getByLabel(`Size ${i + 1} label`, { exact: true }).fill(label);
    const values: Record<string, [string, string]> = { '10': ['28', '38'], '12': ['29-1/2', '39 1/2'], '14': ['78.7 cm', '41'] };
    for (const [size, [waist, hip]] of Object.entries(values)) {
      await page.getByLabel(`Body waist, size ${size}`).fill(waist);
      await page.getByLabel(`Body hip, size ${size}`).fill(hip);
      await page.getByLabel(`Body hip, size ${size}`).blur();
    }
    expect(await page.getByLabel('Body waist, size 12').inputValue()).toBe('29 1/2 in');
    // 78.7 cm = 30.98 in, shown to the nearest 1/8 in.
    expect(await page.getByLabel('Body waist, size 14').inputValue()).toBe('31 in');
    await page.getByRole('button', { name: 'Save size chart' }).click();
    await page.getByText('Size chart saved.').waitFor();
    await page.getByText('Hip grades by a constant 1 1/2 in per size.').waitFor();
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'chart-editor-wide.png'), fullPage: true });

    const csv = page.getByLabel('Or paste CSV here');
    await csv.fill('Size,Waist (in),Hip (in)\n10,28,38\n12,abc,39.5\n14,31,41');
    await page.getByRole('button', { name: 'Import pasted CSV' }).click();
    await page.getByText('The file has 1 problem; nothing was saved.').waitFor();
    await page.getByText(/row 3, column Waist \(in\): could not be read/).waitFor();
    await page.reload();
    await page.getByRole('heading', { name: 'Linen trousers' }).waitFor();
    expect(await page.getByLabel('Body waist, size 12').inputValue()).toBe('29 1/2 in');

    await page.getByLabel('Or paste CSV here').fill('Size,Waist (in),Hip (in)\n10,28,38\n12,29.5,39.5\n14,31,41\n16,32.5,42.5');
    await page.getByRole('button', { name: 'Import pasted CSV' }).click();
    await page.getByText('Chart imported.').waitFor();
    expect(await page.getByLabel('Body hip, size 16').inputValue()).toBe('42 1/2 in');

    // The tester, with hip 39 1/2 in and waist 29 1/2 in in their profile: size 12.
    const t = h.t;
    await request(t.app)
      .patch('/api/me/profile')
      .set({ Authorization: bearer(tester, t.config) })
      .send({ measurementsMm: { hip: 39.5 * IN, waist: 29.5 * IN } })
      .expect(200);
    const patternId = new URL(page.url()).pathname.split('/').pop();
    const testerContext = await signedIn(h, tester.email);
    const phone = await h.newPage(testerContext, PHONE);
    await phone.goto(`/size-advice/${patternId}`);
    await phone.getByRole('heading', { name: 'Your size for Linen trousers' }).waitFor();
    await phone.getByRole('heading', { name: 'Size 12' }).waitFor();
    await phone.screenshot({ path: path.join(SCREENSHOT_DIR, 'tester-size-advice-phone.png'), fullPage: true });
    // The tester cannot open the studio's pattern editor.
    await phone.goto(`/patterns/${patternId}`);
    await phone.getByRole('heading', { name: 'My trials' }).waitFor();
    expect(h.errors).toEqual([]);
  });

  it('on a phone the chart is edited one size at a time, and children’s wear shows its safety cautions', async () => {
    const studio = await createStudio('Kids Studio');
    const owner = await createUser('kids-owner');
    await addMember(studio, owner, 'owner');
    const t = h.t;
    const created = await request(t.app)
      .post(`/api/studios/${studio.id}/patterns`)
      .set({ Authorization: bearer(owner, t.config) })
      .send({ name: 'Hooded jacket', category: 'childrens-wear', fabricKind: 'woven' })
      .expect(201);
    await request(t.app)
      .put(`/api/studios/${studio.id}/patterns/${created.body.id}/chart`)
      .set({ Authorization: bearer(owner, t.config) })
      .send({
        draftedHeightMm: null,
        bodyColumns: ['height', 'bust'],
        finishedColumns: [],
        sizes: [
          { label: '4', bodyMm: { height: 1040, bust: 560 } },
          { label: '6', bodyMm: { height: 1160, bust: 600 } },
        ],
        variants: [],
      })
      .expect(200);

    const context = await signedIn(h, owner.email);
    const page = await h.newPage(context, PHONE);
    await page.goto(`/patterns/${created.body.id}`);
    await page.getByRole('heading', { name: 'Hooded jacket' }).waitFor();
    await page.getByText('Safety cautions for this garment').waitFor();
    await page.getByText(/ASTM F1816-18/).first().waitFor();

    const sizePicker = page.getByRole('radiogroup', { name: 'Body: size' });
    await sizePicker.getByRole('radio', { name: '6' }).click();
    // One size shown at a time on a phone (the others stay in the page, hidden, with what was typed).
    expect(await page.getByLabel('Body height, size 6').isVisible()).toBe(true);
    expect(await page.getByLabel('Body height, size 4').isVisible()).toBe(false);
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'chart-editor-phone.png') });

    // A bust of "320" (inches, for this owner) cannot be right: the chart is not saved, and the
    // cell is named, even after switching to another size.
    await sizePicker.getByRole('radio', { name: '4' }).click();
    const bust4 = page.getByLabel('Body bust, size 4');
    await bust4.fill('320');
    await bust4.blur();
    await page.getByText(/^Body bust, size 4: is too long to be right/).waitFor();
    await sizePicker.getByRole('radio', { name: '6' }).click();
    await page.getByRole('button', { name: 'Save size chart' }).click();
    await page.getByText('Not saved: one value could not be read. Correct it first; nothing was changed.').waitFor();
    await page.getByText(/^• Body bust, size 4: is too long to be right/).waitFor();
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'chart-editor-unreadable-phone.png'), fullPage: true });
    expect(await page.getByText('Size chart saved.').count()).toBe(0);
    const stored = await request(t.app).get(`/api/studios/${studio.id}/patterns/${created.body.id}`).set({ Authorization: bearer(owner, t.config) });
    expect(stored.body.chart.sizes.map((x: { bodyMm: Record<string, number> }) => x.bodyMm.bust)).toEqual([560, 600]);

    // Corrected, it saves what the field shows.
    await sizePicker.getByRole('radio', { name: '4' }).click();
    expect(await bust4.inputValue()).toBe('320');
    await bust4.fill('22 1/2');
    await bust4.blur();
    await page.getByRole('button', { name: 'Save size chart' }).click();
    await page.getByText('Size chart saved.').waitFor();
    const saved = await request(t.app).get(`/api/studios/${studio.id}/patterns/${created.body.id}`).set({ Authorization: bearer(owner, t.config) });
    expect(saved.body.chart.sizes[0].bodyMm.bust).toBeCloseTo(22.5 * IN, 9);
    expect(h.errors).toEqual([]);
  });
});
