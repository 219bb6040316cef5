import path from 'node:path';
import type { Page } from 'playwright-core';
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
  const pageErrors: string[] = [];

  beforeAll(async () => {
    h = await startBrowserHarness();
  });
  afterAll(() => h?.close());

  async function open(viewport: { width: number; height: number }, url: string): Promise<Page> {
    const page = await h.context.newPage();
    await page.setViewportSize(viewport);
    page.on('pageerror', (e) => pageErrors.push(String(e)));
    page.on('console', (m) => {
      if (m.type() === 'error') pageErrors.push(m.text());
    });
    await page.goto(`${h.baseUrl}${url}`);
    return page;
  }

  afterEach(() => {
    // A CSP violation or a render error would show up here.
    expect(pageErrors).toEqual([]);
    pageErrors.length = 0;
  });

  it('on a phone, shows the start page in the shipped font and navigates into the studio and between its sections', async () => {
    const page = await open(PHONE, '/');
    await page.getByRole('heading', { name: 'Basted', exact: true }).waitFor();

    const faces = await loadedFaces(page);
    expect(faces).toEqual(expect.arrayContaining(['Inter_400Regular', 'Inter_700Bold']));
    expect(await fontOf(page, 'Basted')).toContain('Inter_700Bold');
    expect(await fontOf(page, 'Run a studio')).toContain('Inter_600SemiBold');
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'phone-home.png'), fullPage: true });

    await page.getByRole('link', { name: 'Studio' }).click();
    await page.getByRole('heading', { name: 'Trials' }).waitFor();
    expect(new URL(page.url()).pathname).toBe('/trials');

    // On a phone the sections sit in a bar along the bottom of the window.
    const nav = page.getByRole('navigation', { name: 'Studio navigation' });
    const box = (await nav.boundingBox())!;
    expect(box.width).toBeGreaterThan(PHONE.width * 0.9);
    expect(box.y + box.height).toBeGreaterThan(PHONE.height - 4);

    await nav.getByRole('link', { name: 'Patterns' }).click();
    await page.getByRole('heading', { name: 'Patterns' }).waitFor();
    expect(new URL(page.url()).pathname).toBe('/patterns');
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'phone-patterns.png') });
    await page.close();
  });

  it('on a wide window, shows a side navigation and moves between sections', async () => {
    const page = await open(WIDE, '/trials');
    await page.getByRole('heading', { name: 'Trials' }).waitFor();

    const nav = page.getByRole('navigation', { name: 'Studio navigation' });
    const box = (await nav.boundingBox())!;
    expect(box.x).toBe(0);
    expect(box.width).toBeLessThan(WIDE.width / 3);
    expect(box.height).toBeGreaterThan(WIDE.height * 0.9);
    expect(await fontOf(page, 'Trials')).toMatch(/Inter_/);

    await nav.getByRole('link', { name: 'Findings' }).click();
    await page.getByRole('heading', { name: 'Findings' }).waitFor();
    expect(new URL(page.url()).pathname).toBe('/findings');
    expect(await nav.getByRole('link', { name: 'Findings' }).getAttribute('aria-current')).toBe('page');
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'wide-findings.png') });

    await page.goto(`${h.baseUrl}/`);
    await page.getByRole('heading', { name: 'Basted', exact: true }).waitFor();
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'wide-home.png') });
    await page.close();
  });

  it('opens a deep link to a public call directly, and shows a not-found page for an unknown address', async () => {
    const page = await open(PHONE, '/call/linen-trousers-spring');
    await page.getByRole('heading', { name: 'Call for testers' }).waitFor();
    expect(await page.getByText('Trial: linen-trousers-spring').count()).toBe(1);

    await page.goto(`${h.baseUrl}/no/such/page`);
    await page.getByRole('heading', { name: 'Page not found' }).waitFor();
    await page.close();
  });
});
