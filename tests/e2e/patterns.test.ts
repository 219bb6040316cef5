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

  it('on a phone the chart is edited one size at a time, and a children’s hoodie filed as a top gets the children’s cautions', async () => {
    const studio = await createStudio('Kids Studio');
    const owner = await createUser('kids-owner');
    await addMember(studio, owner, 'owner');
    const t = h.t;
    // Filed as a top, sizes 4 and 6 (the same numbers as misses' sizes): nothing says "children" yet.
    const created = await request(t.app)
      .post(`/api/studios/${studio.id}/patterns`)
      .set({ Authorization: bearer(owner, t.config) })
      .send({ name: 'Hooded jacket', category: 'top', fabricKind: 'woven' })
      .expect(201);
    await request(t.app)
      .put(`/api/studios/${studio.id}/patterns/${created.body.id}/chart`)
      .set({ Authorization: bearer(owner, t.config) })
      .send({
        draftedHeightMm: null,
        bodyColumns: ['bust'],
        finishedColumns: [],
        sizes: [
          { label: '4', bodyMm: { bust: 560 } },
          { label: '6', bodyMm: { bust: 600 } },
        ],
        variants: [],
      })
      .expect(200);

    const context = await signedIn(h, owner.email);
    const page = await h.newPage(context, PHONE);
    await page.goto(`/patterns/${created.body.id}`);
    await page.getByRole('heading', { name: 'Hooded jacket' }).waitFor();
    await page.getByText('Care notes for the instructions').waitFor();
    await page.getByText(/Made for children\? Marking it so/).waitFor();
    expect(await page.getByText(/ASTM F1816-18/).count()).toBe(0);

    // The designer marks it as made for children: the drawstring caution shows, with the reason.
    await page.getByRole('radiogroup', { name: 'Made for children' }).getByRole('radio', { name: 'Yes, in children’s sizes' }).click();
    await page.getByRole('button', { name: 'Save details' }).click();
    await page.getByText('Details saved.').waitFor();
    await page.getByText('Safety cautions for this garment').waitFor();
    await page.getByText('The children’s cautions show because the pattern is marked as made for children.').waitFor();
    await page.getByText(/ASTM F1816-18/).first().waitFor();
    await page.getByText(/exempts \(16 CFR 1501\.3\)/).waitFor();
    await page.getByText('Safety cautions for this garment').scrollIntoViewIfNeeded();
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'pattern-cautions-phone.png') });
    await page.getByText(/exempts \(16 CFR 1501\.3\)/).scrollIntoViewIfNeeded();
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'pattern-cautions-small-parts-phone.png') });
    const wide = await h.newPage(context, WIDE);
    await wide.goto(`/patterns/${created.body.id}`);
    await wide.getByText('Safety cautions for this garment').waitFor();
    await wide.screenshot({ path: path.join(SCREENSHOT_DIR, 'pattern-cautions-wide.png') });

    // A height under 150 cm in the chart is a reason too.
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
    await page.reload();
    await page.getByText(/and the chart gives a height under 59 in for sizes 4, 6\./).waitFor();

    // Fabric needs on the phone: a one-way length below the plain one is marked on its cell and not saved.
    const plain = page.getByLabel('Fabric 45 in wide, size 4');
    await plain.fill('2 1/2');
    await plain.blur();
    const oneWay = page.getByLabel('Fabric 45 in, one way, size 4');
    await oneWay.fill('2 1/4');
    await oneWay.blur();
    await page.getByText('Fabric 45 in, one way, size 4: is below the 2 1/2 yd stated without a one-way layout').waitFor();
    await page.getByRole('button', { name: 'Save fabric needs' }).click();
    await page.getByText('Not saved: correct the one-way lengths marked in the table first.').waitFor();
    await oneWay.scrollIntoViewIfNeeded();
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'fabric-needs-refused-phone.png') });
    // 2.3 m is 2300 mm: shown as 2 5/8 yd (rounded up), never 2 1/2 yd.
    await oneWay.fill('2.3 m');
    await oneWay.blur();
    expect(await oneWay.inputValue()).toBe('2 5/8 yd');
    await page.getByRole('button', { name: 'Save fabric needs' }).click();
    await page.getByText('Fabric needs saved.').waitFor();
    await page.reload();
    await page.getByRole('heading', { name: 'Hooded jacket' }).waitFor();
    expect(await page.getByLabel('Fabric 45 in, one way, size 4').inputValue()).toBe('2 5/8 yd');

    // The same rule in the full grid on a wide screen.
    await wide.reload();
    const widePlain = wide.getByLabel('Fabric 45 in wide, size 6');
    await widePlain.fill('2');
    await widePlain.blur();
    const wideOneWay = wide.getByLabel('Fabric 45 in, one way, size 6');
    await wideOneWay.fill('1 7/8');
    await wideOneWay.blur();
    await wide.getByText('Fabric 45 in, one way, size 6: is below the 2 yd stated without a one-way layout').waitFor();
    await wide.getByRole('button', { name: 'Save fabric needs' }).scrollIntoViewIfNeeded();
    await wide.screenshot({ path: path.join(SCREENSHOT_DIR, 'fabric-needs-refused-wide.png') });

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
