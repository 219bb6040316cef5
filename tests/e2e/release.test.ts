import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { OutboxMessage, Trial } from '../../db/models';
import { SCREENSHOT_DIR, startBrowserHarness, type BrowserHarness } from '../support/browser';
import { TEST_PASSWORD } from '../support/factories';
import { firstLink, messagesTo, waitForMessage } from '../support/inbox';
import { createReleaseWorld } from '../support/release-world';
import { tinyPdf } from '../support/sample-files';

const WIDE = { width: 1280, height: 800 };
const PHONE = { width: 390, height: 844 };
const shot = (name: string) => path.join(SCREENSHOT_DIR, name);

describe('closing a trial in Chromium', () => {
  let h: BrowserHarness;
  beforeAll(async () => {
    h = await startBrowserHarness();
  });
  afterAll(() => h?.close());

  it('a designer releases through the checklist; each finisher gets the files, a thank-you and one code; a second release sends nothing twice', async () => {
    const w = await createReleaseWorld(h.t.storage, 'Harbour');
    const staff = await h.newContext();
    expect((await staff.request.post('/api/auth/sign-in', { data: { email: w.owner.email, password: TEST_PASSWORD } })).status()).toBe(200);
    const page = await h.newPage(staff, WIDE);

    // From the trial page to its checklist: four items open, each saying why.
    await page.goto(`/trials/${w.trial.id}`);
    await page.getByText('4 of 5 release checklist items open.').waitFor();
    await page.getByRole('link', { name: 'Release checklist' }).click();
    await page.getByText('4 of 5 items still open.').waitFor();
    await page.getByText('• Back crotch length, added (whole draft): still open').waitFor();
    await page.getByText('• Size 12: 2 of 3 finished').waitFor();
    await page.screenshot({ path: shot('release-checklist-open-wide.png') });
    const phone = await h.newPage(staff, PHONE);
    await phone.goto(`/release/${w.trial.id}`);
    await phone.getByText('4 of 5 items still open.').waitFor();
    await phone.screenshot({ path: shot('release-checklist-open-phone.png') });

    // The finding: decided on the findings screen, reached from the item's own link.
    await page.getByRole('link', { name: 'Triage the findings' }).click();
    await page.getByRole('button', { name: /^Back crotch length, added: Whole draft/ }).click();
    await page.getByRole('radiogroup', { name: 'Triage of Back crotch length, added' }).getByRole('radio', { name: 'Will fix' }).click();
    await page.getByRole('button', { name: 'Save the triage' }).click();
    await page.getByText(/^Triage: Will fix · /).waitFor();

    // "Will fix" now wants a later draft: uploaded on the pattern's page, reached from the checklist.
    await page.goto(`/release/${w.trial.id}`);
    await page.getByText('• Back crotch length, added: found in draft 1, no draft after it yet').waitFor();
    await page.getByRole('link', { name: 'Upload a draft' }).click();
    await page.getByLabel('What changed').fill('Back crotch lengthened by 3/4 in; final pattern');
    await page.getByLabel('Print at home, A4 (PDF)').setInputFiles({ name: 'harbour-final-a4.pdf', mimeType: 'application/pdf', buffer: tinyPdf() });
    await page.getByRole('button', { name: 'Upload draft' }).click();
    await page.getByText('Draft 2 uploaded; its testers were told by e-mail.').waitFor();

    // The rest on the release page itself: the final draft, the gap, the tester who stopped, the codes.
    await page.goto(`/release/${w.trial.id}`);
    await page.getByRole('radiogroup', { name: 'The final draft' }).getByRole('radio', { name: /^Draft 2/ }).click();
    await page.getByTestId('check-final-draft').getByText('Done').waitFor();
    await page.getByLabel('Why the gap is acceptable').fill('Size 12 had two finishers whose fit agrees with size 10.');
    await page.getByRole('button', { name: 'Save the note' }).click();
    await page.getByText('Note saved.').waitFor();
    await page.getByLabel(`Note on ${w.straggler.user.name} (optional)`).fill('Moved house mid-trial');
    await page.getByRole('button', { name: `Excuse ${w.straggler.user.name} from finishing` }).click();
    await page.getByText(`${w.straggler.user.name} · size 12 · excused`).waitFor();
    const codes = Array.from({ length: 9 }, (_, i) => `HARBOUR-${String(i + 1).padStart(2, '0')}`);
    await page.getByLabel('Or paste codes').fill(`code\n${codes.join('\n')}`);
    await page.getByRole('button', { name: 'Import the codes' }).click();
    await page.getByText('9 codes added; 9 not given yet.').waitFor();
    await page.getByText('Every item of the checklist holds.').waitFor();
    await page.screenshot({ path: shot('release-checklist-ready-wide.png'), fullPage: true });

    await page.getByRole('button', { name: 'Release the trial' }).click();
    await page.getByText(/^Released on /).waitFor();
    await page.getByText('Sent: 8 thank-you e-mails with the final files, 1 closing notes, 8 reward codes.').waitFor();
    await page.screenshot({ path: shot('release-done-wide.png') });

    // Every finisher: a thank-you with the way to the files, and exactly one code of their own.
    const given = new Set<string>();
    for (const f of w.finishers) {
      await waitForMessage(f.user.email, `Released, with thanks: ${w.trial.title}`);
      const code = await waitForMessage(f.user.email, `Your reward code: ${w.trial.title}`);
      given.add(/HARBOUR-\d\d/.exec(code.text)![0]);
      expect((await messagesTo(f.user.email)).filter((m) => m.subject.startsWith('Your reward code')).length).toBe(1);
    }
    expect(given.size).toBe(8);
    await waitForMessage(w.straggler.user.email, `Closing: ${w.trial.title}`);

    // A second release is refused and sends nothing, however often it is tried.
    const before = await Promise.all([...w.finishers, w.straggler].map(async (f) => (await messagesTo(f.user.email)).length));
    const rows = await OutboxMessage.count({ where: { trialId: w.trial.id } });
    for (let i = 0; i < 2; i += 1) {
      const again = await staff.request.post(`/api/studios/${w.studio.id}/trials/${w.trial.id}/release`, { data: {} });
      expect(again.status()).toBe(409);
    }
    await page.reload();
    await page.getByText(/^Released on /).waitFor();
    expect(await page.getByRole('button', { name: /^Release/ }).count()).toBe(0);
    await new Promise((r) => setTimeout(r, 500));
    expect(await Promise.all([...w.finishers, w.straggler].map(async (f) => (await messagesTo(f.user.email)).length))).toEqual(before);
    expect(await OutboxMessage.count({ where: { trialId: w.trial.id } })).toBe(rows);
    expect((await Trial.findByPk(w.trial.id))!.releasedAt).not.toBeNull();

    // A finisher follows the e-mail on a phone: thanks, the final file through a short-lived link, the code.
    const finisher = w.finishers[3];
    const thanks = await waitForMessage(finisher.user.email, `Released, with thanks: ${w.trial.title}`);
    const tester = await h.newContext();
    expect((await tester.request.post('/api/auth/sign-in', { data: { email: finisher.user.email, password: TEST_PASSWORD } })).status()).toBe(200);
    const mine = await h.newPage(tester, PHONE);
    await mine.goto(new URL(firstLink(thanks.text, '/my-trials')).pathname);
    await mine.getByText(`Released: ${w.trial.title}`).waitFor();
    await mine.getByText('The final pattern (draft 2)').waitFor();
    const myCode = /HARBOUR-\d\d/.exec((await waitForMessage(finisher.user.email, 'Your reward code')).text)![0];
    await mine.getByText(myCode, { exact: true }).waitFor();
    await mine.screenshot({ path: shot('my-trials-released-phone.png') });
    const [download] = await Promise.all([mine.waitForEvent('download'), mine.getByRole('button', { name: 'Download harbour-final-a4.pdf, final pattern' }).click()]);
    expect(download.suggestedFilename()).toBe('harbour-final-a4.pdf');
    expect((await readFile((await download.path())!)).subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const wideMine = await h.newPage(tester, WIDE);
    await wideMine.goto('/my-trials');
    await wideMine.getByText(myCode, { exact: true }).waitFor();
    await wideMine.screenshot({ path: shot('my-trials-released-wide.png') });

    // The summary: readable on a phone and wide, and printable without the app around it.
    await phone.goto(`/summary/${w.trial.id}`);
    await phone.getByText('8 of 9 places filled by testers who finished (9 enrolled).').waitFor();
    await phone.screenshot({ path: shot('summary-phone.png') });
    await phone.screenshot({ path: shot('summary-phone-full.png'), fullPage: true });
    await page.goto(`/summary/${w.trial.id}`);
    await page.getByText('Gap accepted: Size 12 had two finishers whose fit agrees with size 10.').first().waitFor();
    await page.getByTestId('summary-changes').waitFor();
    await page.screenshot({ path: shot('summary-wide.png') });
    await page.emulateMedia({ media: 'print' });
    const nav = page.locator('[role="navigation"]');
    expect(await nav.count()).toBe(1);
    expect(await nav.isVisible()).toBe(false);
    expect(await page.getByRole('button', { name: 'Download the PDF' }).isVisible()).toBe(false);
    await page.screenshot({ path: shot('summary-print-wide.png'), fullPage: true });
    await page.emulateMedia({ media: 'screen' });
    const pdf = await staff.request.get(`/api/studios/${w.studio.id}/trials/${w.trial.id}/summary.pdf`);
    expect(pdf.status()).toBe(200);
    expect((await pdf.body()).subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(h.errors).toEqual([]);
  });
});
