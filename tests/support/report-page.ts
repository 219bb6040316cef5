import type { BrowserContext, Page } from 'playwright-core';
import type { BrowserHarness } from './browser';

/**
 * Waits until the server has every change of the report: the status says "Saved at …" and this
 * browser holds no unsaved change any more. Any change turns the status to "Saving…" at once,
 * and the second check reads the device's own record, so a "Saved" left over from an earlier
 * save cannot pass for the latest one.
 */
export async function savedAll(page: Page) {
  const status = page.getByRole('status', { name: 'Save status' });
  await status
    .getByText(/^(Back online: your changes were sent\. )?Saved at \d\d:\d\d\.$/)
    .waitFor({ timeout: 30_000 })
    .catch(async (error: Error) => {
      throw new Error(`${error.message}\nThe save status said: ${await status.innerText()}`);
    });
  await page.waitForFunction(() => !Object.keys(window.localStorage).some((k) => k.startsWith('basted:unsaved:')), undefined, { timeout: 30_000 });
}

/** A slow phone: 390×844 with Chromium's CPU throttled 6× through the DevTools protocol. */
export async function slowPhone(h: BrowserHarness, context: BrowserContext): Promise<Page> {
  const page = await h.newPage(context, { width: 390, height: 844 });
  const cdp = await context.newCDPSession(page);
  await cdp.send('Emulation.setCPUThrottlingRate', { rate: 6 });
  return page;
}
