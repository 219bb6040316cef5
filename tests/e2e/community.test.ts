import path from 'node:path';
import { Trial } from '../../db/models';
import { SCREENSHOT_DIR, startBrowserHarness, type BrowserHarness } from '../support/browser';
import { TEST_PASSWORD } from '../support/factories';
import { waitForMessage } from '../support/inbox';
import { createReleaseWorld } from '../support/release-world';

const WIDE = { width: 1280, height: 800 };
const PHONE = { width: 390, height: 844 };
const shot = (name: string) => path.join(SCREENSHOT_DIR, name);

describe('the studio and its testers in Chromium', () => {
  let h: BrowserHarness;
  beforeAll(async () => {
    h = await startBrowserHarness();
  });
  afterAll(() => h?.close());

  it('the owner sets the reply address; a coordinator messages the finishers of one size and invites testers from the pool; testers read it in My trials', async () => {
    const w = await createReleaseWorld(h.t.storage, 'Tide');
    const owner = await h.newContext();
    expect((await owner.request.post('/api/auth/sign-in', { data: { email: w.owner.email, password: TEST_PASSWORD } })).status()).toBe(200);
    const settings = await h.newPage(owner, PHONE);
    await settings.goto('/members');
    await settings.getByLabel('Contact address for testers’ replies').fill('studio@tide.test');
    await settings.getByRole('radiogroup', { name: 'Testers’ photos after a release' }).getByRole('radio', { name: 'Remove after a number of days' }).click();
    await settings.getByLabel('Days to keep photos after the release').fill('90');
    await settings.getByLabel('Days to keep photos after the release').scrollIntoViewIfNeeded();
    await settings.getByRole('button', { name: 'Save', exact: true }).click();
    await settings.getByText('Saved.').waitFor();
    await settings.screenshot({ path: shot('studio-reply-and-photos-phone.png') });

    const staff = await h.newContext();
    expect((await staff.request.post('/api/auth/sign-in', { data: { email: w.coordinator.email, password: TEST_PASSWORD } })).status()).toBe(200);
    const page = await h.newPage(staff, WIDE);
    await page.goto(`/trials/${w.trial.id}`);
    await page.getByLabel('Subject').fill('Launch on Friday');
    await page.getByRole('textbox', { name: 'Message' }).fill('The pattern launches on Friday.\n\nThank you for your fit photos!');
    await page.getByRole('group', { name: 'To testers who are' }).getByRole('checkbox', { name: 'Still sewing' }).click();
    await page.getByRole('group', { name: 'Only these sizes (none chosen: every size)' }).getByRole('checkbox', { name: '10' }).click();
    await page.getByRole('button', { name: 'Send the message' }).click();
    await page.getByText('Sent to 3 testers; their replies go to studio@tide.test.').waitFor();
    await page.getByText('Launch on Friday', { exact: true }).scrollIntoViewIfNeeded();
    await page.screenshot({ path: shot('trial-messages-wide.png') });

    const size10 = w.finishers.filter((f) => f.enrollment.sizeId === w.sizes[1].id);
    expect(size10).toHaveLength(3);
    for (const f of size10) expect((await waitForMessage(f.user.email, 'Launch on Friday')).text).toContain('Thank you for your fit photos!');
    const reader = await h.newContext();
    expect((await reader.request.post('/api/auth/sign-in', { data: { email: size10[0].user.email, password: TEST_PASSWORD } })).status()).toBe(200);
    const mine = await h.newPage(reader, PHONE);
    await mine.goto('/my-trials');
    await mine.getByText('Messages from studios').waitFor();
    await mine.getByText('Reply to the e-mail, or write to studio@tide.test.').waitFor();
    await mine.screenshot({ path: shot('my-trials-messages-phone.png') });

    // The pool: the tall testers who finished, invited to a new open call.
    const call = await Trial.create({ studioId: w.studio.id, patternId: w.pattern.id, slug: `tide-second-${Date.now()}`, title: 'Tide trousers, second round', state: 'open', coverage: w.trial.coverage });
    await page.getByRole('link', { name: 'Testers' }).click();
    await page.getByText('9 people').waitFor();
    await page.getByRole('radiogroup', { name: 'Height band' }).getByRole('radio', { name: /^180 cm/ }).click();
    await page.getByRole('group', { name: 'Record' }).getByRole('checkbox', { name: 'Finished a trial' }).click();
    await page.getByText('1 person').waitFor();
    await page.getByRole('checkbox', { name: 'Tide Tester 8' }).click();
    await page.getByRole('radiogroup', { name: 'Call' }).getByRole('radio', { name: 'Tide trousers, second round' }).click();
    await page.getByRole('button', { name: 'Invite 1 to apply' }).click();
    await page.getByText('1 invited by e-mail.').waitFor();
    await page.screenshot({ path: shot('tester-pool-wide.png') });
    const invited = await waitForMessage(w.finishers[7].user.email, 'Invitation to apply: Tide trousers, second round');
    expect(invited.text).toContain(`/call/${call.slug}`);

    const phone = await h.newPage(staff, PHONE);
    await phone.goto('/testers');
    await phone.getByText('9 people').waitFor();
    await phone.screenshot({ path: shot('tester-pool-phone.png') });
    expect(h.errors).toEqual([]);
  });
});
