import path from 'node:path';
import { createUser, TEST_PASSWORD } from '../support/factories';
import { SCREENSHOT_DIR, startBrowserHarness, type BrowserHarness } from '../support/browser';
import { firstLink, waitForMessage } from '../support/inbox';

const PHONE = { width: 390, height: 844 };
const WIDE = { width: 1280, height: 800 };

describe('a tester’s own account, in Chromium', () => {
  let h: BrowserHarness;
  beforeAll(async () => {
    h = await startBrowserHarness();
  });
  afterAll(() => h?.close());

  it('enters measurements the way people write them, sees them back in their unit, and they survive a reload', async () => {
    const user = await createUser('measured');
    const context = await h.newContext();
    const page = await h.newPage(context, WIDE);
    await page.goto('/sign-in?next=/profile');
    await page.getByLabel('E-mail').fill(user.email);
    await page.getByLabel('Password').fill(TEST_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('heading', { name: 'Profile' }).waitFor();

    const hip = page.getByLabel('Hip', { exact: true });
    await hip.fill('40-1/2');
    await hip.blur();
    expect(await hip.inputValue()).toBe('40 1/2 in');

    const waist = page.getByLabel('Waist', { exact: true });
    await waist.fill('thirty');
    await waist.blur();
    await page.getByText(/^Waist: could not be read/).waitFor();
    await page.getByRole('button', { name: 'Save profile' }).click();
    await page.getByText('Not saved: Waist could not be read. Correct it first.').waitFor();

    await waist.fill('81.5 cm');
    await waist.blur();
    expect(await waist.inputValue()).toBe('32 1/8 in');
    await page.getByRole('radio', { name: 'Advanced: alters and fits patterns' }).click();
    await page.getByRole('button', { name: 'Save profile' }).click();
    await page.getByText('Profile saved.').waitFor();

    await page.reload();
    await page.getByRole('heading', { name: 'Profile' }).waitFor();
    expect(await page.getByLabel('Hip', { exact: true }).inputValue()).toBe('40 1/2 in');
    await page.getByRole('radio', { name: 'Centimetres' }).click();
    // 40 1/2 in = 1028.7 mm exactly (1 in = 25.4 mm), shown to 0.1 cm.
    expect(await page.getByLabel('Hip', { exact: true }).inputValue()).toBe('102.9 cm');
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'profile-wide.png'), fullPage: true });
    expect(h.errors).toEqual([]);
  });

  it('resets a forgotten password from the e-mailed link on a phone', async () => {
    const user = await createUser('forgetful');
    const context = await h.newContext();
    const page = await h.newPage(context, PHONE);
    await page.goto('/sign-in');
    await page.getByRole('link', { name: 'Forgot your password?' }).click();
    await page.getByLabel('E-mail').fill(user.email);
    await page.getByRole('button', { name: 'Send the link' }).click();
    await page.getByText('If an account uses this address').waitFor();

    const link = firstLink((await waitForMessage(user.email, 'Reset your Basted password')).text, '/reset-password');
    await page.goto(link);
    await page.getByLabel('New password', { exact: true }).fill('short');
    await page.getByRole('button', { name: 'Save and sign in' }).click();
    await page.getByText('New password: Use at least 10 characters').waitFor();
    await page.getByLabel('New password', { exact: true }).fill('a much longer password');
    await page.getByRole('button', { name: 'Save and sign in' }).click();
    await page.getByRole('heading', { name: 'Your studios' }).waitFor();

    // The link is spent.
    await page.goto(link);
    await page.getByLabel('New password', { exact: true }).fill('yet another password');
    await page.getByRole('button', { name: 'Save and sign in' }).click();
    await page.getByText('This reset link has expired or was used already. Ask for a new one.').waitFor();
    expect(h.errors).toEqual([]);
  });
});
