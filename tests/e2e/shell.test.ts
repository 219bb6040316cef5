import path from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { addMember, createStudio, createUser, TEST_PASSWORD } from '../support/factories';
import { SCREENSHOT_DIR, startBrowserHarness, type BrowserHarness } from '../support/browser';

const PHONE = { width: 390, height: 844 };
const WIDE = { width: 1280, height: 800 };

/** Font faces the page has actually loaded (document.fonts.check() says true even for missing ones). */
async function loadedFaces(page: Page): Promise<string[]> {
  return page.evaluate(async () => {
    await document.fonts.ready;
    return [...document.fonts].filter((f) => f.status === 'loaded').map((f) => f.family.replace(/["']/g, ''));
  });
}

async function fontOf(page: Page, text: string): Promise<string> {
  return page.getByText(text, { exact: true }).first().evaluate((el) => getComputedStyle(el).fontFamily);
}

describe('the web app in Chromium', () => {
  let h: BrowserHarness;
  let owner: BrowserContext;

  beforeAll(async () => {
    h = await startBrowserHarness();
    // An owner of a studio, signed in through the API (this suite is about the shell).
    const user = await createUser('shell-owner');
    await addMember(await createStudio('Shell Test Studio'), user, 'owner');
    owner = await h.newContext();
    const res = await owner.request.post('/api/auth/sign-in', { data: { email: user.email, password: TEST_PASSWORD } });
    expect(res.status()).toBe(200);
  });
  afterAll(() => h?.close());
  afterEach(() => {
    // A CSP violation or a render error would show up here.
    expect(h.errors).toEqual([]);
  });

  it('on a phone, shows the start page in the shipped font and navigates into the studio and between its sections', async () => {
    const page = await h.newPage(owner, PHONE);
    await page.goto('/');
    await page.getByRole('heading', { name: 'Basted', exact: true }).waitFor();

    const faces = await loadedFaces(page);
    expect(faces).toEqual(expect.arrayContaining(['Inter_400Regular', 'Inter_700Bold']));
    expect(await fontOf(page, 'Basted')).toContain('Inter_700Bold');
    expect(await fontOf(page, 'Run a studio')).toContain('Inter_600SemiBold');
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'phone-home.png'), fullPage: true });

    await page.getByRole('link', { name: 'Studio', exact: true }).click();
    await page.getByRole('heading', { name: 'Trials', level: 1 }).waitFor();
    expect(new URL(page.url()).pathname).toBe('/trials');

    // On a phone the sections sit in a bar along the bottom of the window.
    const nav = page.getByRole('navigation', { name: 'Sections' });
    const box = (await nav.boundingBox())!;
    expect(box.width).toBeGreaterThan(PHONE.width * 0.9);
    expect(box.y + box.height).toBeGreaterThan(PHONE.height - 4);

    await nav.getByRole('link', { name: 'Patterns' }).click();
    await page.getByRole('heading', { name: 'Patterns', level: 1 }).waitFor();
    expect(new URL(page.url()).pathname).toBe('/patterns');
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'phone-patterns.png') });
    await page.close();
  });

  it('on a wide window, shows a side navigation and moves between sections', async () => {
    const page = await h.newPage(owner, WIDE);
    await page.goto('/trials');
    await page.getByRole('heading', { name: 'Trials', level: 1 }).waitFor();

    const nav = page.getByRole('navigation', { name: 'Sections' });
    const box = (await nav.boundingBox())!;
    expect(box.x).toBe(0);
    expect(box.width).toBeLessThan(WIDE.width / 3);
    expect(box.height).toBeGreaterThan(WIDE.height * 0.9);
    expect(await fontOf(page, 'Trials')).toMatch(/Inter_/);
    await page.getByText('Shell Test Studio · Owner').waitFor();

    await nav.getByRole('link', { name: 'Findings' }).click();
    await page.getByRole('heading', { name: 'Findings', level: 1 }).waitFor();
    expect(new URL(page.url()).pathname).toBe('/findings');
    expect(await nav.getByRole('link', { name: 'Findings' }).getAttribute('aria-current')).toBe('page');
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'wide-findings.png') });

    await page.goto('/');
    await page.getByRole('heading', { name: 'Basted', exact: true }).waitFor();
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'wide-home.png') });
    await page.close();
  });

  it('opens a deep link to a call directly (an unknown one says so), and shows a not-found page for an unknown address', async () => {
    const visitor = await h.newContext();
    const page = await h.newPage(visitor, PHONE);
    await page.goto('/call/linen-trousers-spring');
    await page.getByRole('heading', { name: 'Call for testers' }).waitFor();
    await page.getByText('This call is not open. The link may be old, or the studio has closed it.').waitFor();

    await page.goto('/no/such/page');
    await page.getByRole('heading', { name: 'Page not found' }).waitFor();
    await visitor.close();
  });

  it('sends a signed-out visitor from a studio page to sign-in', async () => {
    const visitor = await h.newContext();
    const page = await h.newPage(visitor, PHONE);
    await page.goto('/members');
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    expect(new URL(page.url()).searchParams.get('next')).toBe('/members');
    await visitor.close();
  });
});
