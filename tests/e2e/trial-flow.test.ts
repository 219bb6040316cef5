import path from 'node:path';
import request from 'supertest';
import type { Page } from 'playwright-core';
import { addMember, bearer, createStudio, createUser, TEST_PASSWORD, uniqueEmail } from '../support/factories';
import { confirmSignUpInBrowser, SCREENSHOT_DIR, startBrowserHarness, type BrowserHarness } from '../support/browser';
import { waitForMessage } from '../support/inbox';
import { toLocalText } from '../../components/trials/dates';

const WIDE = { width: 1280, height: 800 };
const PHONE = { width: 390, height: 844 };
const IN = 25.4;
const DAY = 86_400_000;

describe('a fit trial from call to selection, in Chromium', () => {
  let h: BrowserHarness;
  beforeAll(async () => {
    h = await startBrowserHarness();
  });
  afterAll(() => h?.close());

  async function applyAsNewTester(callPath: string, name: string, email: string, size: string): Promise<Page> {
    const context = await h.newContext();
    const page = await h.newPage(context, PHONE);
    await page.goto(callPath);
    await page.getByRole('link', { name: 'Create an account and apply' }).click();
    await page.getByLabel('Your name').fill(name);
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill('bias tape and basting');
    await page.getByRole('button', { name: 'Create account' }).click();
    await confirmSignUpInBrowser(page, email);
    await page.getByRole('heading', { name: 'Apply' }).waitFor();
    await page.getByRole('radiogroup', { name: 'Size you will sew' }).getByRole('radio', { name: size, exact: true }).click();
    await page.getByLabel('Fabric you plan to use').fill('Mid-weight linen');
    await page.getByRole('radio', { name: 'Confident: sews from patterns regularly' }).click();
    await page.getByRole('switch', { name: 'I can meet these deadlines' }).click();
    await page.getByRole('radio', { name: 'Only the trial’s staff' }).click();
    await page.getByRole('button', { name: 'Send application' }).click();
    await page.getByText('Application sent. The studio will let you know by e-mail.').waitFor();
    return page;
  }

  it('a coordinator opens a call → two testers apply → automatic selection → the testers see their enrolment and dates, and the mail is in the inbox', async () => {
    const studio = await createStudio('Flow Studio');
    const coordinator = await createUser('flow-coord');
    await addMember(studio, coordinator, 'coordinator');
    const base = `/api/studios/${studio.id}/patterns`;
    const auth = { Authorization: bearer(coordinator, h.t.config) };
    const pattern = await request(h.t.app).post(base).set(auth).send({ name: 'Barrel-leg trousers', category: 'trousers', fabricKind: 'woven' }).expect(201);
    await request(h.t.app)
      .put(`${base}/${pattern.body.id}/chart`)
      .set(auth)
      .send({
        draftedHeightMm: 66 * IN,
        bodyColumns: ['waist', 'hip'],
        finishedColumns: [],
        sizes: [
          { label: '10', bodyMm: { waist: 28 * IN, hip: 38 * IN } },
          { label: '12', bodyMm: { waist: 29.5 * IN, hip: 39.5 * IN } },
        ],
        variants: [],
      })
      .expect(200);

    const staff = await h.newContext();
    expect((await staff.request.post('/api/auth/sign-in', { data: { email: coordinator.email, password: TEST_PASSWORD } })).status()).toBe(200);
    const page = await h.newPage(staff, WIDE);
    await page.goto('/trials');
    // No pattern chosen: the banner names the field by its label, not by its name in the code.
    await page.getByLabel('Trial title').fill('No pattern yet');
    await page.getByRole('button', { name: 'Create trial' }).click();
    await page.getByText('One answer needs a change. Please check: Pattern to test.').waitFor();
    await page.getByRole('radio', { name: 'Barrel-leg trousers' }).click();
    await page.getByLabel('Trial title').fill('Barrel-leg trousers: fit round one');
    await page.getByRole('button', { name: 'Create trial' }).click();
    await page.getByRole('heading', { name: 'Barrel-leg trousers: fit round one', level: 1 }).waitFor();

    await page.getByLabel('Size 10', { exact: true }).fill('1');
    await page.getByLabel('Size 12', { exact: true }).fill('1');
    await page.getByRole('button', { name: 'Save targets' }).click();
    await page.getByText('Targets saved.').waitFor();

    // Typed as wall time in the studio's zone (the factory studio is in Europe/Lisbon).
    const at = (days: number) => toLocalText(new Date(Date.now() + days * DAY), 'Europe/Lisbon');
    await page.getByLabel('Applications close').fill(at(7));
    await page.getByLabel('Toile check-in due').fill(at(14));
    // Out of order, and one date in the past: the order is refused, the past date is pointed out.
    await page.getByLabel('Final report due').fill(at(10));
    await page.getByLabel('Testers chosen').fill(at(-1));
    await page.getByText('This date is in the past: check it before saving.').waitFor();
    await page.getByRole('button', { name: 'Save call and dates' }).click();
    await page.getByText('The dates are out of order: each must come on or after the one before it. Nothing was saved.').waitFor();
    await page.getByText(/^Testers chosen: is before “Applications close” \(/).waitFor();
    await page.getByText(/^Final report due: is before “Toile check-in due” \(/).waitFor();
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'trial-dates-out-of-order-wide.png'), fullPage: true });
    await page.getByLabel('Testers chosen').fill(at(8));
    await page.getByLabel('Final report due').fill(at(28));
    await page.getByRole('radiogroup', { name: 'State' }).getByRole('radio', { name: 'Call open' }).click();
    await page.getByRole('button', { name: 'Save call and dates' }).click();
    await page.getByText('Call and dates saved.').waitFor();
    const callPath = (await page.getByRole('link', { name: 'Open the public call' }).getAttribute('href'))!;
    expect(callPath).toMatch(/^\/call\/barrel-leg-trousers-fit-round-one/);

    const emails = [uniqueEmail('tester-a'), uniqueEmail('tester-b')];
    const testerA = await applyAsNewTester(callPath, 'Tess Tester', emails[0], '10');
    await applyAsNewTester(callPath, 'Rue Tester', emails[1], '12');
    await waitForMessage(emails[0], 'Application received');

    await page.reload();
    await page.getByRole('button', { name: 'Propose a selection' }).click();
    await page.getByText(/^✓ Tess Tester: /).waitFor();
    await page.getByText(/^✓ Rue Tester: /).waitFor();
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'trial-proposal-wide.png'), fullPage: true });
    await page.getByRole('button', { name: 'Accept: select 2' }).click();
    await page.getByText('Done: 2 selected, 0 waitlisted, 0 declined. Each tester was told by e-mail.').waitFor();

    for (const email of emails) {
      const mail = await waitForMessage(email, 'You are testing Barrel-leg trousers: fit round one');
      expect(mail.text).toMatch(/Toile check-in due: /);
    }
    await testerA.goto('/my-trials');
    await testerA.getByText('You are testing · size 10 · Flow Studio').waitFor();
    await testerA.getByText(/^Next: Toile check-in due, /).waitFor();

    // The coordinator gives this one tester three more days for the toile.
    await page.getByRole('button', { name: 'Give more time: Tess Tester, Toile check-in due' }).click();
    await page.getByLabel('New date for Tess Tester, toile check-in due').fill(at(17));
    await page.getByRole('button', { name: 'Save the new date' }).click();
    await page.getByText('New date saved for this tester.').waitFor();
    await testerA.reload();
    await testerA.getByText(/^Next: Toile check-in due, .*\(extended for you\)$/).waitFor();
    await testerA.screenshot({ path: path.join(SCREENSHOT_DIR, 'my-trials-phone.png'), fullPage: true });
    expect(h.errors).toEqual([]);
  });
});
