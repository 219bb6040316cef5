import { mkdtemp, mkdir, rm } from 'node:fs/promises';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext } from 'playwright-core';
import { buildTestApp, type TestApp } from './test-app';

export const SCREENSHOT_DIR = path.resolve(__dirname, '../../.artifacts/screenshots');

export type BrowserHarness = {
  baseUrl: string;
  context: BrowserContext;
  close(): Promise<void>;
};

/**
 * The real server with the exported web app (dist/, built by npm test's set-up) on a free
 * loopback port, and Debian's Chromium driven by playwright-core in a fresh profile.
 */
export async function startBrowserHarness(): Promise<BrowserHarness & { t: TestApp }> {
  const t = buildTestApp({ WEB_DIST: path.resolve(__dirname, '../../dist') });
  const server: Server = await new Promise((resolve) => {
    const s = t.app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const profile = await mkdtemp(path.join(os.tmpdir(), 'basted-chromium-'));
  await mkdir(SCREENSHOT_DIR, { recursive: true });
  const context = await chromium.launchPersistentContext(profile, {
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
  return {
    t,
    baseUrl,
    context,
    async close() {
      await context.close();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await t.close();
      await rm(profile, { recursive: true, force: true });
    },
  };
}
