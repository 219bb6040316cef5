import path from 'node:path';
import { Milestone, OutboxMessage, Pattern, PatternSize, Report, Trial, type User } from '../../db/models';
import { addMember, createStudio, createUser, TEST_PASSWORD, enrolTester } from '../support/factories';
import { SCREENSHOT_DIR, startBrowserHarness, type BrowserHarness } from '../support/browser';
import { waitForMessage } from '../support/inbox';

const IN = 25.4;
const PHONE = { width: 390, height: 844 };
const WIDE = { width: 1280, height: 900 };

describe('the findings screen and the trial’s mail, in Chromium', () => {
  let h: BrowserHarness;
  beforeAll(async () => {
    h = await startBrowserHarness();
  });
  afterAll(() => h?.close());

  it('the grader triages a whole-draft finding and leaves a note; the coordinator resends a failed message', async () => {
    const studio = await createStudio('Findings Studio');
    const [grader, coordinator] = [await createUser('findings-grader'), await createUser('mail-coordinator')];
    await addMember(studio, grader, 'grader');
    await addMember(studio, coordinator, 'coordinator');
    const pattern = await Pattern.create({ studioId: studio.id, name: 'Quay trousers', category: 'trousers', fabricKind: 'woven', bodyColumns: ['hip', 'inseam'] });
    const sizes = await Promise.all(['8', '10', '12'].map((label, position) => PatternSize.create({ patternId: pattern.id, label, position, bodyMm: { hip: (37 + 1.5 * position) * IN, inseam: 30 * IN } })));
    const trial = await Trial.create({ studioId: studio.id, patternId: pattern.id, slug: `quay-${Date.now()}`, title: 'Quay trousers', state: 'running', coverage: { sizes: sizes.map((s) => ({ sizeId: s.id, target: 3 })), heightBands: [], variants: [] } });
    await Milestone.create({ trialId: trial.id, kind: 'final-report', dueAt: new Date(Date.now() + 5 * 86_400_000) });
    // Nine testers, three per size; eight lengthen the back crotch: a whole-draft problem.
    let first: User | null = null;
    for (let i = 0; i < 9; i += 1) {
      const user = await createUser(`quay-${i}`);
      first ??= user;
      await addMember(studio, user, 'tester');
      const size = sizes[i % 3];
      const { enrollment: e } = await enrolTester(trial.id, user.id, size.id, { plannedFabric: 'Drill' });
      const alterations = i < 8 ? [{ area: 'rise' as const, kind: 'back-rise', amountMm: 0.75 * IN, where: 'back' as const, note: '', otherText: '' }] : [];
      await Report.create({ enrollmentId: e.id, stage: 'final', submittedAt: new Date(), content: { sizeSewn: size.label, draftVersion: 1, fit: { rise: -1 }, alterations, verdict: 'Short in the back rise.' } });
    }

    const staff = await h.newContext();
    expect((await staff.request.post('/api/auth/sign-in', { data: { email: grader.email, password: TEST_PASSWORD } })).status()).toBe(200);
    const page = await h.newPage(staff, WIDE);
    await page.goto(`/findings/${trial.id}`);
    const row = page.getByRole('button', { name: /^Back crotch length, added: Whole draft, 8 of 9 testers/ });
    await row.click();
    await page.getByRole('radiogroup', { name: 'Triage of Back crotch length, added' }).getByRole('radio', { name: 'Will fix' }).click();
    await page.getByRole('button', { name: 'Save the triage' }).click();
    await page.getByText(/^Triage: Will fix · /).waitFor();
    // The change table follows the triage at once: the median, 3/4 in, at every size.
    const changes = page.getByTestId('changes-back-rise|add');
    await changes.waitFor();
    expect(await changes.getByText('3/4 in', { exact: true }).count()).toBe(3);
    await page.getByLabel('Note on Back crotch length, added').fill('Add 3/4 in at the back crotch point in draft 2.');
    await page.getByRole('button', { name: 'Add the note' }).click();
    // The note appears in the list (a div, not the cleared text box).
    await page.locator('div', { hasText: /^Add 3\/4 in at the back crotch point in draft 2\.$/ }).first().waitFor();
    expect(await page.getByLabel('Note on Back crotch length, added').inputValue()).toBe('');
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'findings-wide.png') });

    // On a phone after a reload: the decision and the note are kept.
    const phone = await h.newPage(staff, PHONE);
    await phone.goto(`/findings/${trial.id}`);
    await phone.getByRole('button', { name: /^Back crotch length, added: Whole draft/ }).click();
    await phone.locator('div', { hasText: /^Add 3\/4 in at the back crotch point in draft 2\.$/ }).first().waitFor();
    expect(await phone.getByRole('radiogroup', { name: 'Triage of Back crotch length, added' }).getByRole('radio', { name: 'Will fix' }).getAttribute('aria-checked')).toBe('true');
    await phone.screenshot({ path: path.join(SCREENSHOT_DIR, 'findings-phone.png') });
    await phone.getByTestId('changes-back-rise|add').scrollIntoViewIfNeeded();
    await phone.screenshot({ path: path.join(SCREENSHOT_DIR, 'findings-changes-phone.png') });

    // The trial page shows the same finding in the same words, and opens onto its reasons.
    await phone.goto(`/trials/${trial.id}`);
    await phone.getByRole('button', { name: /^Back crotch length, added: Whole draft, 8 of 9 testers/ }).click();
    await phone.getByText(/^• 8 of 9 testers on draft 1 \(89%.*made “back crotch length, added”, median 3\/4 in\.$/).waitFor();
    await phone.screenshot({ path: path.join(SCREENSHOT_DIR, 'trial-findings-phone.png') });

    // A message the SMTP server refused earlier: the coordinator sees why and sends it again.
    const subject = `Due tomorrow: final report, Quay trousers ${Date.now()}`;
    await OutboxMessage.create({
      idempotencyKey: `e2e-${Date.now()}`,
      recipientId: first!.id,
      recipientEmail: first!.email,
      template: 'reminder-1d',
      category: 'reminders',
      studioId: studio.id,
      trialId: trial.id,
      subject,
      text: 'Your final report for "Quay trousers" is due tomorrow.',
      html: null,
      status: 'failed',
      attempts: 5,
      nextAttemptAt: new Date(),
      lastError: 'connect ECONNREFUSED 127.0.0.1:1025',
    });
    const office = await h.newContext();
    expect((await office.request.post('/api/auth/sign-in', { data: { email: coordinator.email, password: TEST_PASSWORD } })).status()).toBe(200);
    const trialPage = await h.newPage(office, WIDE);
    await trialPage.goto(`/trials/${trial.id}`);
    await trialPage.getByText('Reason: connect ECONNREFUSED 127.0.0.1:1025').waitFor();
    await trialPage.getByRole('button', { name: `Send again: ${subject} to ${first!.email}` }).click();
    await waitForMessage(first!.email, subject);
    await trialPage.getByText(/^Sent · /).first().waitFor();
    expect((await OutboxMessage.findOne({ where: { subject } }))?.status).toBe('sent');
    expect(h.errors).toEqual([]);
  });
});
