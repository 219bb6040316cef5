import { mkdir } from 'node:fs/promises';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { firstLink, waitForMessage } from './inbox';
import { buildTestApp, type TestApp } from './test-app';

export const SCREENSHOT_DIR = path.resolve(__dirname, '../../.artifacts/screenshots');

export type BrowserHarness = {
  baseUrl: string;
  t: TestApp;
  browser: Browser;
  /** A separate browser profile: its own cookies, as a second person on another device. */
  newContext(): Promise<BrowserContext>;
  /** A page that records page errors and console errors into `errors`. */
  newPage(context: BrowserContext, viewport: { width: number; height: number }): Promise<Page>;
  errors: string[];
  close(): Promise<void>;
};

async function freePort(): Promise<number> {
  const probe = createServer();
  await new Promise<void>((resolve) => probe.listen(0, '127.0.0.1', resolve));
  const { port } = probe.address() as AddressInfo;
  await new Promise<void>((resolve) => probe.close(() => resolve()));
  return port;
}

/**
 * The real server with the exported web app (dist/, built by npm test's set-up) on a loopback
 * port, its mail links pointing at that port, and Debian's Chromium driven by playwright-core.
 */
export async function startBrowserHarness(): Promise<BrowserHarness> {
  const port = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  const t = buildTestApp({ WEB_DIST: path.resolve(__dirname, '../../dist'), PUBLIC_URL: baseUrl });
  const server: Server = await new Promise((resolve) => {
    const s = t.app.listen(port, '127.0.0.1', () => resolve(s));
  });
  await mkdir(SCREENSHOT_DIR, { recursive: true });
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    // No network here: without these flags Chromium keeps trying to reach its own services.
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
  const errors: string[] = [];
  return {
    baseUrl,
    t,
    browser,
    errors,
    newContext: () => browser.newContext({ baseURL: baseUrl }),
    async newPage(context, viewport) {
      const page = await context.newPage();
      await page.setViewportSize(viewport);
      page.on('pageerror', (e) => errors.push(String(e)));
      page.on('console', (m) => {
        // A 4xx answer is the app working as designed (401 before sign-in, 400 for a spent link);
        // the tests assert on what the page then shows.
        if (m.type() === 'error' && !/status of 4\d\d/.test(m.text())) errors.push(m.text());
      });
      return page;
    },
    async close() {
      await browser.close();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await t.close();
    },
  };
}

/**
 * After "Create account": the page says to check the e-mail; the link in it (from the local
 * inbox) confirms the address, makes the account, and returns to where the person was going.
 */
export async function confirmSignUpInBrowser(page: Page, email: string): Promise<void> {
  await page.getByRole('heading', { name: 'Check your e-mail' }).waitFor();
  const mail = await waitForMessage(email, 'Confirm your e-mail address');
  await page.goto(firstLink(mail.text, '/verify-email'));
}
