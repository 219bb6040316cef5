import path from 'node:path';
import { uniqueEmail } from '../support/factories';
import { confirmSignUpInBrowser, SCREENSHOT_DIR, startBrowserHarness, type BrowserHarness } from '../support/browser';
import { firstLink, waitForMessage } from '../support/inbox';

const WIDE = { width: 1280, height: 800 };
const PHONE = { width: 390, height: 844 };

describe('a designer starts a studio and invites a grader, in Chromium', () => {
  let h: BrowserHarness;
  beforeAll(async () => {
    h = await startBrowserHarness();
  });
  afterAll(() => h?.close());

  it('sign up → create a studio → invite a grader → the grader accepts from the e-mailed link and sees a read-only studio', async () => {
    const designerEmail = uniqueEmail('designer');
    const graderEmail = uniqueEmail('grader');

    // The designer, on a wide screen.
    const designer = await h.newContext();
    const page = await h.newPage(designer, WIDE);
    await page.goto('/sign-up');
    await page.getByLabel('Your name').fill('Dana Designer');
    await page.getByLabel('E-mail').fill(designerEmail);
    await page.getByLabel('Password').fill('pins and needles');
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.getByRole('heading', { name: 'Check your e-mail' }).waitFor();
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'sign-up-check-email-wide.png') });
    await confirmSignUpInBrowser(page, designerEmail);

    await page.getByRole('heading', { name: 'Your studios' }).waitFor();
    await page.getByLabel('Studio name').fill('Slipstitch Studio');
    await page.getByLabel('Time zone').fill('Europe/Lisbon');
    await page.getByRole('button', { name: 'Create studio' }).click();
    await page.getByRole('heading', { name: 'Trials', level: 1 }).waitFor();
    await page.getByText('Slipstitch Studio · Owner').waitFor();

    await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Members' }).click();
    await page.getByRole('heading', { name: 'Members', level: 1 }).waitFor();
    // A bad address is refused beside the field, before anything is sent.
    await page.getByLabel('E-mail').fill('not an address');
    await page.getByRole('button', { name: 'Send invitation' }).click();
    await page.getByText('E-mail: Enter an e-mail address such as name@example.com').waitFor();

    await page.getByLabel('E-mail').fill(graderEmail);
    await page.getByRole('radiogroup', { name: 'Role', exact: true }).getByRole('radio', { name: 'Grader' }).click();
    await page.getByRole('button', { name: 'Send invitation' }).click();
    await page.getByText(`Invitation sent to ${graderEmail}.`).waitFor();
    await page.getByText(`${graderEmail} · Grader`).waitFor();
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'invite-members-wide.png'), fullPage: true });

    // The grader, on a phone, with the link from the local inbox.
    const mail = await waitForMessage(graderEmail, 'Invitation to the studio “Slipstitch Studio”');
    const link = firstLink(mail.text, '/invitations/');
    expect(link.startsWith(h.baseUrl)).toBe(true);

    const grader = await h.newContext();
    const phone = await h.newPage(grader, PHONE);
    await phone.goto(link);
    await phone.getByRole('heading', { name: 'Join Slipstitch Studio' }).waitFor();
    await phone.getByText('You are invited as grader').waitFor();
    await phone.getByRole('link', { name: 'Create an account' }).click();

    await phone.getByRole('heading', { name: 'Create an account' }).waitFor();
    await phone.getByLabel('Your name').fill('Gale Grader');
    await phone.getByLabel('E-mail').fill(graderEmail);
    await phone.getByLabel('Password').fill('grade rules rule');
    await phone.getByRole('button', { name: 'Create account' }).click();
    await phone.getByRole('heading', { name: 'Check your e-mail' }).waitFor();
    await phone.screenshot({ path: path.join(SCREENSHOT_DIR, 'sign-up-check-email-phone.png') });
    // The link in the confirmation e-mail brings the grader back to the invitation, signed in.
    await confirmSignUpInBrowser(phone, graderEmail);

    await phone.getByRole('button', { name: 'Accept the invitation' }).click();
    await phone.getByRole('heading', { name: 'Trials', level: 1 }).waitFor();
    await phone.getByText('Slipstitch Studio · Grader').waitFor();
    await phone.getByText('Triage and notes').waitFor();
    const nav = phone.getByRole('navigation', { name: 'Sections' });
    for (const section of ['Trials', 'Patterns', 'Findings']) {
      expect(await nav.getByRole('link', { name: section }).count()).toBe(1);
    }
    expect(await nav.getByRole('link', { name: 'Members' }).count()).toBe(0);
    await phone.screenshot({ path: path.join(SCREENSHOT_DIR, 'grader-badge-phone.png') });

    // Typing the address of a page the role may not use shows nothing of it.
    await phone.goto('/members');
    await phone.getByText('Could not load this: A grader of this studio may not see the member list.').first().waitFor();

    // A spent or mistyped confirmation link says so and offers the way forward.
    await phone.goto(`/verify-email?token=${'x'.repeat(43)}`);
    await phone.getByText('This link has expired or was used already. Create the account again to get a new one.').waitFor();
    await phone.getByRole('link', { name: 'Create the account again' }).waitFor();
    await phone.screenshot({ path: path.join(SCREENSHOT_DIR, 'verify-email-spent-phone.png') });

    // Back with the designer: the grader is now a member.
    await page.reload();
    await page.getByLabel('Gale Grader, Grader').waitFor();
    expect(h.errors).toEqual([]);
  });
});
