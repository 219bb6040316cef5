import path from 'node:path';
import { Application, Draft, Enrollment, Membership, Milestone, Pattern, PatternSize, Report, Trial, type User } from '../../db/models';
import { addMember, createStudio, createUser, enrolTester, TEST_PASSWORD } from '../support/factories';
import { optOutUrl } from '../../server/mail/opt-out';
import { SCREENSHOT_DIR, startBrowserHarness, type BrowserHarness } from '../support/browser';

const PHONE = { width: 390, height: 844 };
const WIDE = { width: 1280, height: 800 };
const DAY = 86_400_000;

describe('My trials after finishing, and steps that ask before they act', () => {
  let h: BrowserHarness;
  beforeAll(async () => {
    h = await startBrowserHarness();
  });
  afterAll(() => h?.close());

  async function signedIn(user: User) {
    const context = await h.newContext();
    expect((await context.request.post('/api/auth/sign-in', { data: { email: user.email, password: TEST_PASSWORD } })).status()).toBe(200);
    return context;
  }

  async function world(name: string) {
    const studio = await createStudio(`${name} Studio`);
    const pattern = await Pattern.create({ studioId: studio.id, name: `${name} skirt`, category: 'skirt', fabricKind: 'woven', bodyColumns: ['hip'] });
    const size = await PatternSize.create({ patternId: pattern.id, label: '14', position: 0, bodyMm: { hip: 1040 } });
    await Draft.create({ patternId: pattern.id, version: 1, changeNote: 'First draft' });
    const trial = await Trial.create({ studioId: studio.id, patternId: pattern.id, slug: `${name.toLowerCase()}-${Date.now()}`, title: `${name} skirt`, state: 'running', coverage: { sizes: [{ sizeId: size.id, target: 3 }], heightBands: [], variants: [] } });
    await Milestone.create({ trialId: trial.id, kind: 'toile-check-in', dueAt: new Date(Date.now() + 3 * DAY) });
    await Milestone.create({ trialId: trial.id, kind: 'final-report', dueAt: new Date(Date.now() + 9 * DAY) });
    return { studio, size, trial };
  }

  it('a finished tester keeps the draft files, sees when each report was received in their own zone, opens a report as sent, and is not offered to withdraw', async () => {
    const { studio, size, trial } = await world('Pleat');
    const user = await createUser('finished-tester');
    await user.update({ timeZone: 'Europe/London' });
    await addMember(studio, user, 'tester');
    const { enrollment } = await enrolTester(trial.id, user.id, size.id);
    const content = { sizeSewn: '14', draftVersion: 1, fit: { waist: 0 }, verdict: 'Sits well at the waist.' };
    await Report.create({ enrollmentId: enrollment.id, stage: 'check-in', content, submittedAt: new Date('2026-06-01T09:30:00Z') });
    await Report.create({ enrollmentId: enrollment.id, stage: 'final', content, submittedAt: new Date('2026-06-08T17:05:00Z') });
    await enrollment.update({ status: 'finished' });

    const page = await h.newPage(await signedIn(user), PHONE);
    await page.goto('/my-trials');
    await page.getByText('Finished: thank you for testing · size 14 · Pleat Studio').waitFor();
    await page.getByText('Draft 1 (newest): First draft').waitFor();
    // 09:30 UTC is 10:30 in London in June (summer time).
    await page.getByText('Received Monday 1 June 2026, 10:30 (Europe/London)').waitFor();
    await page.getByText('Received Monday 8 June 2026, 18:05 (Europe/London)').waitFor();
    expect(await page.getByRole('button', { name: `Withdraw from ${trial.title}` }).count()).toBe(0);
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'my-trials-finished-phone.png'), fullPage: true });

    await page.getByRole('link', { name: 'Final report' }).click();
    await page.getByText('Received Monday 8 June 2026, 18:05 (Europe/London).').waitFor();
    expect(await page.getByLabel('Overall verdict').inputValue()).toBe('Sits well at the waist.');
    expect(await page.getByLabel('Overall verdict').isEditable()).toBe(false);
    expect(await page.getByRole('button', { name: 'Submit again with these changes' }).count()).toBe(0);
    await page.getByRole('button', { name: 'Change my answers' }).click();
    expect(await page.getByLabel('Overall verdict').isEditable()).toBe(true);
    expect(h.errors).toEqual([]);
  });

  it('withdrawing says what will happen and waits for a yes; keeping the place changes nothing', async () => {
    const { studio, size, trial } = await world('Yoke');
    const user = await createUser('withdrawing-tester');
    await addMember(studio, user, 'tester');
    const { application } = await enrolTester(trial.id, user.id, size.id);
    const page = await h.newPage(await signedIn(user), PHONE);
    await page.goto('/my-trials');
    await page.getByRole('button', { name: `Withdraw from ${trial.title}` }).click();
    const ask = page.getByRole('group', { name: `Withdraw from ${trial.title}?` });
    await ask.getByText('• You give up your place; it may be offered to someone on the waiting list.').waitFor();
    await ask.getByText('• This cannot be undone.').waitFor();
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'withdraw-confirm-phone.png'), fullPage: true });
    await ask.getByRole('button', { name: 'Keep my place' }).click();
    await ask.waitFor({ state: 'detached' });
    expect((await Application.findByPk(application.id))!.status).toBe('selected');

    await page.getByRole('button', { name: `Withdraw from ${trial.title}` }).click();
    await page.getByRole('button', { name: 'Yes, withdraw' }).click();
    await page.getByText(/^Withdrawn · size 14/).waitFor();
    expect((await Application.findByPk(application.id))!.status).toBe('withdrawn');
    expect((await Enrollment.findOne({ where: { applicationId: application.id } }))!.status).toBe('dropped');
  });

  it('an owner changes a role and removes a member only after a confirmation that says what follows', async () => {
    const studio = await createStudio('Roles Studio');
    const owner = await createUser('roles-owner');
    const grader = await createUser('roles-grader');
    const coordinator = await createUser('roles-coordinator');
    await addMember(studio, owner, 'owner');
    const graderMembership = await addMember(studio, grader, 'grader');
    const coordinatorMembership = await addMember(studio, coordinator, 'coordinator');
    const page = await h.newPage(await signedIn(owner), WIDE);
    await page.goto('/members');

    await page.getByRole('radiogroup', { name: `Role of ${grader.name}` }).getByRole('radio', { name: 'Coordinator' }).click();
    const ask = page.getByRole('group', { name: `Make ${grader.name} coordinator?` });
    await ask.getByText(`• ${grader.name} will run trials and patterns, but not members or deletion.`).waitFor();
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'role-confirm-wide.png'), fullPage: true });
    // Nothing changed yet.
    expect((await Membership.findByPk(graderMembership.id))!.role).toBe('grader');
    await ask.getByRole('button', { name: 'Cancel' }).click();
    expect(await page.getByRole('radiogroup', { name: `Role of ${grader.name}` }).getByRole('radio', { name: 'Grader' }).getAttribute('aria-checked')).toBe('true');
    await page.getByRole('radiogroup', { name: `Role of ${grader.name}` }).getByRole('radio', { name: 'Coordinator' }).click();
    await page.getByRole('button', { name: 'Yes, make coordinator' }).click();
    await page.getByText(`${grader.email} · Coordinator`).waitFor();
    expect((await Membership.findByPk(graderMembership.id))!.role).toBe('coordinator');

    await page.getByRole('button', { name: `Remove from the studio: ${coordinator.name}` }).click();
    await page.getByRole('group', { name: `Remove ${coordinator.name} from the studio?` }).getByText('• To have them back, send a new invitation.').waitFor();
    expect(await Membership.findByPk(coordinatorMembership.id)).not.toBeNull();
    await page.getByRole('button', { name: 'Yes, remove' }).click();
    await page.getByText(coordinator.email).waitFor({ state: 'detached' });
    expect(await Membership.findByPk(coordinatorMembership.id)).toBeNull();
    expect(h.errors).toEqual([]);
  });

  it('the opt-out link in a reminder opens a page that asks; the button stops the reminders', async () => {
    const user = await createUser('opt-out-reader');
    const context = await h.newContext();
    const page = await h.newPage(context, PHONE);
    await page.goto(optOutUrl(h.t.config, user.id, 'reminders'));
    await page.getByRole('heading', { name: 'Stop reminders about due dates?' }).waitFor();
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'opt-out-ask-phone.png'), fullPage: true });
    expect((await user.reload()).mailReminders).toBe(true);
    await page.getByRole('button', { name: 'Stop reminders about due dates' }).click();
    await page.getByRole('heading', { name: 'Done: no more of this mail' }).waitFor();
    expect((await user.reload()).mailReminders).toBe(false);
    expect(h.errors).toEqual([]);
  });
});
