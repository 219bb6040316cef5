import path from 'node:path';
import { User } from '../../db/models';
import { uniqueEmail } from '../support/factories';
import { SCREENSHOT_DIR, confirmSignUpInBrowser, startBrowserHarness, type BrowserHarness } from '../support/browser';

describe('a new account takes the browser’s time zone, shown and changeable', () => {
  let h: BrowserHarness;
  beforeAll(async () => {
    h = await startBrowserHarness();
  });
  afterAll(() => h?.close());

  it('signing up in a London browser gives Europe/London; the profile shows it and offers the device’s zone when they differ', async () => {
    // A browser whose clock is set to London, as a tester's would be.
    const context = await h.browser.newContext({ baseURL: h.baseUrl, timezoneId: 'Europe/London' });
    const page = await h.newPage(context, { width: 390, height: 844 });
    await page.goto('/sign-up');
    expect(await page.getByLabel('Time zone').inputValue()).toBe('Europe/London');
    const email = uniqueEmail('london-tester');
    await page.getByLabel('Your name').fill('Lou Tester');
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill('pins and needles');
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'sign-up-time-zone-phone.png'), fullPage: true });
    await page.getByRole('button', { name: 'Create account' }).click();
    await confirmSignUpInBrowser(page, email);
    await page.waitForURL((url) => !url.pathname.startsWith('/verify-email'));
    const user = await User.findOne({ where: { email } });
    expect(user!.timeZone).toBe('Europe/London');

    // Changed elsewhere to another zone: the profile offers this device's zone back.
    await user!.update({ timeZone: 'America/Chicago' });
    await page.goto('/profile');
    expect(await page.getByLabel('Time zone').inputValue()).toBe('America/Chicago');
    await page.getByRole('button', { name: 'Use this device’s zone: Europe/London' }).click();
    expect(await page.getByLabel('Time zone').inputValue()).toBe('Europe/London');
    await page.getByRole('button', { name: 'Save profile' }).click();
    await page.getByText('Profile saved.').waitFor();
    expect((await user!.reload()).timeZone).toBe('Europe/London');
    expect(h.errors).toEqual([]);
  });
});
