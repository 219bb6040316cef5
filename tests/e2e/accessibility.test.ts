import path from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { Enrollment, Milestone, Pattern, PatternSize, Report, Studio, Trial, User } from '../../db/models';
import { DEMO_RELEASED_SLUG } from '../../db/seeders/demo-release';
import { DEMO_PASSWORD, DEMO_STUDIO, DEMO_TRIAL_SLUG, seedDemoStudio } from '../../db/seeders/demo-studio';
import { axeProblems, layoutProblems, overlapArea } from '../support/a11y';
import { SCREENSHOT_DIR, startBrowserHarness, type BrowserHarness } from '../support/browser';
import { createUser, TEST_PASSWORD } from '../support/factories';
import { firstLink, waitForMessage } from '../support/inbox';
import { ownMailDatabase } from '../server/api/mail-support';

const PHONE = { width: 390, height: 844 };
const WIDE = { width: 1280, height: 800 };
const SIZES = [
  ['phone', PHONE],
  ['wide', WIDE],
] as const;

jest.setTimeout(600_000);

type Screenful = { name: string; path: string; heading: string | RegExp; before?: (page: Page) => Promise<void> };

/**
 * Every main screen, as the person who uses it, on the demo studio (a running trial with two
 * drafts, reports, photos and findings of every class, and a released trial): axe-core finds no
 * critical, serious or moderate problem at 390×844 or 1280×800, nothing reaches past the window's
 * right edge outside a sideways-scrolling grid, and no text is cut short.
 */
describe('every main screen in Chromium, on a phone and a wide window', () => {
  let h: BrowserHarness;
  let db: Awaited<ReturnType<typeof ownMailDatabase>>;
  let previousUrl: string | undefined;
  const ids = { trial: '', released: '', pattern: '', midReport: '', openCall: '', invitation: '' };
  const contexts: Record<string, BrowserContext> = {};

  async function signedIn(email: string, password = DEMO_PASSWORD): Promise<BrowserContext> {
    const context = await h.browser.newContext({ baseURL: h.baseUrl, bypassCSP: true });
    const res = await context.request.post('/api/auth/sign-in', { data: { email, password } });
    expect(res.status()).toBe(200);
    return context;
  }

  beforeAll(async () => {
    // A database of this file's own, with the demo loaded, so the screens are full ones.
    db = await ownMailDatabase();
    previousUrl = process.env.DATABASE_URL;
    process.env.DATABASE_URL = db.url;
    h = await startBrowserHarness();
    await seedDemoStudio(h.t.sequelize, 4);

    const trial = (await Trial.findOne({ where: { slug: DEMO_TRIAL_SLUG } }))!;
    const released = (await Trial.findOne({ where: { slug: DEMO_RELEASED_SLUG } }))!;
    ids.trial = trial.id;
    ids.released = released.id;
    ids.pattern = trial.patternId;
    // A tester of the demo trial whose final report is begun but not sent.
    const enrolments = await Enrollment.findAll({ where: { trialId: trial.id }, include: [{ model: Report, as: 'reports' }, { model: User, as: 'user' }] });
    const mid = enrolments.find((e) => (e as Enrollment & { reports: Report[] }).reports.some((r) => r.stage === 'final' && r.submittedAt === null))!;
    ids.midReport = mid.id;
    const midEmail = (mid as Enrollment & { user: User }).user.email;

    // A call that is open, for the application form.
    const studio = (await Studio.findOne({ where: { slug: DEMO_STUDIO.slug } }))!;
    const pattern = await Pattern.create({ studioId: studio.id, name: 'Raglan tee (a11y)', category: 'top', fabricKind: 'knit', minStretchPct: 30, bodyColumns: ['bust', 'waist', 'hip'] });
    const sizes = await Promise.all(
      ['S', 'M', 'L'].map((label, position) => PatternSize.create({ patternId: pattern.id, label, position, bodyMm: { bust: 860 + 60 * position, waist: 700 + 60 * position, hip: 920 + 60 * position } })),
    );
    const open = await Trial.create({
      studioId: studio.id,
      patternId: pattern.id,
      slug: `raglan-a11y-${Date.now()}`,
      title: 'Raglan tee: call for testers',
      callText: 'A relaxed raglan tee in a light jersey.',
      state: 'open',
      coverage: { sizes: sizes.map((s) => ({ sizeId: s.id, target: 2 })), heightBands: [], variants: [] },
    });
    ids.openCall = open.slug;
    const day = 86_400_000;
    await Milestone.create({ trialId: open.id, kind: 'applications-close', dueAt: new Date(Date.now() + 10 * day) });
    await Milestone.create({ trialId: open.id, kind: 'toile-check-in', dueAt: new Date(Date.now() + 20 * day) });
    await Milestone.create({ trialId: open.id, kind: 'final-report', dueAt: new Date(Date.now() + 30 * day) });

    contexts.visitor = await h.browser.newContext({ baseURL: h.baseUrl, bypassCSP: true });
    contexts.designer = await signedIn('designer@demo.basted.test');
    contexts.grader = await signedIn('grader@demo.basted.test');
    contexts.midTester = await signedIn(midEmail);
    contexts.finisher = await signedIn('tester1@demo.basted.test');
    const applicant = await createUser('a11y-applicant');
    contexts.applicant = await signedIn(applicant.email, TEST_PASSWORD);

    // An invitation's page, from the link in its e-mail.
    const invitee = `invitee-${Date.now()}@example.test`;
    const sent = await contexts.designer.request.post(`/api/studios/${studio.id}/invitations`, { data: { email: invitee, role: 'grader' } });
    expect(sent.status()).toBe(201);
    ids.invitation = new URL(firstLink((await waitForMessage(invitee, 'Invitation')).text, '/invitations/')).pathname;
  });

  afterAll(async () => {
    await h?.close();
    process.env.DATABASE_URL = previousUrl;
    await db?.drop();
  });

  /** Opens a screen, waits until it has loaded, and returns its problems (none expected). */
  async function check(page: Page, screen: Screenful, size: string) {
    await page.goto(screen.path);
    await page.getByRole('heading', { level: 1, name: screen.heading }).first().waitFor({ timeout: 30_000 });
    // Loaded: no progress bar left (lists and panels load on their own).
    await page.waitForFunction(() => document.querySelectorAll('[role="progressbar"]').length === 0, undefined, { timeout: 30_000 });
    await screen.before?.(page);
    await page.waitForTimeout(300);
    const problems = { axe: await axeProblems(page), layout: await layoutProblems(page) };
    await tallScreenshot(page, `a11y-${screen.name}-${size}.png`);
    return problems;
  }

  const audiences: { who: string; screens: () => Screenful[] }[] = [
    {
      who: 'visitor',
      screens: () => [
        { name: 'home', path: '/', heading: 'Basted' },
        { name: 'sign-in', path: '/sign-in', heading: 'Sign in' },
        { name: 'sign-up', path: '/sign-up', heading: 'Create an account' },
        { name: 'reset-password', path: '/reset-password', heading: /password/i },
        { name: 'call-running', path: `/call/${DEMO_TRIAL_SLUG}`, heading: /Wide-leg trousers/ },
        { name: 'call-open', path: `/call/${ids.openCall}`, heading: 'Raglan tee: call for testers' },
        { name: 'invitation', path: ids.invitation, heading: /Join/ },
        { name: 'verify-email-spent', path: `/verify-email?token=${'x'.repeat(43)}`, heading: /.+/ },
        { name: 'account-deleted', path: '/account-deleted', heading: 'Your account is deleted' },
        { name: 'not-found', path: '/no/such/page', heading: 'Page not found' },
      ],
    },
    { who: 'applicant', screens: () => [{ name: 'apply', path: `/call/${ids.openCall}`, heading: 'Raglan tee: call for testers' }] },
    {
      who: 'midTester',
      screens: () => [
        { name: 'my-trials', path: '/my-trials', heading: 'My trials' },
        { name: 'final-report', path: `/report/${ids.midReport}/final`, heading: /^Final report/ },
        { name: 'check-in-sent', path: `/report/${ids.midReport}/check-in`, heading: /^Toile check-in/ },
        { name: 'size-advice', path: `/size-advice/${ids.pattern}`, heading: /.+/ },
        { name: 'tester-profile', path: '/profile', heading: 'Profile' },
      ],
    },
    { who: 'finisher', screens: () => [{ name: 'my-trials-released', path: '/my-trials', heading: 'My trials' }] },
    {
      who: 'designer',
      screens: () => [
        { name: 'trials', path: '/trials', heading: 'Trials' },
        { name: 'trial', path: `/trials/${ids.trial}`, heading: /^Wide-leg trousers/ },
        { name: 'trial-released', path: `/trials/${ids.released}`, heading: /^Boxy top/ },
        { name: 'findings-list', path: '/findings', heading: 'Findings' },
        {
          name: 'findings',
          path: `/findings/${ids.trial}`,
          heading: /^Findings: /,
          // One finding open: its reasons, both charts, the triage and the notes.
          before: async (page) => {
            await page.getByRole('button', { name: /^Scoop the crotch curve, added:/ }).click();
            await page.getByRole('radiogroup', { name: /^Triage of / }).first().waitFor();
          },
        },
        { name: 'patterns', path: '/patterns', heading: 'Patterns' },
        { name: 'pattern', path: `/patterns/${ids.pattern}`, heading: /Wide-leg trousers/ },
        { name: 'members', path: '/members', heading: /Members/ },
        { name: 'tester-pool', path: '/testers', heading: 'Tester pool' },
        { name: 'release', path: `/release/${ids.trial}`, heading: /^Release/ },
        { name: 'summary', path: `/summary/${ids.released}`, heading: /Summary/ },
        { name: 'studios', path: '/studios', heading: 'Your studios' },
        { name: 'staff-profile', path: '/profile', heading: 'Profile' },
      ],
    },
    { who: 'grader', screens: () => [{ name: 'findings-grader', path: `/findings/${ids.trial}`, heading: /^Findings: / }] },
  ];

  for (const [size, viewport] of SIZES) {
    for (const audience of audiences) {
      it(`${size}: the ${audience.who}’s screens have no accessibility problem, nothing off the window and no text cut short`, async () => {
        const page = await h.newPage(contexts[audience.who], viewport);
        const found: Record<string, unknown> = {};
        for (const screen of audience.screens()) {
          const problems = await check(page, screen, size);
          if (problems.axe.length || problems.layout.length) found[screen.name] = problems;
        }
        await page.close();
        expect(found).toEqual({});
        expect(h.errors).toEqual([]);
      });
    }
  }

  it('phone: the findings screen draws every card apart (no two overlap), fit ratings, fabric and unclear steps included', async () => {
    const page = await h.newPage(contexts.designer, PHONE);
    await page.goto(`/findings/${ids.trial}`);
    await page.getByRole('heading', { level: 1, name: /^Findings: / }).waitFor();
    await page.waitForFunction(() => document.querySelectorAll('[role="progressbar"]').length === 0);
    for (const title of ['Fit ratings by size and area', 'Fabric used against the stated need', 'Unclear instruction steps']) {
      await page.getByRole('heading', { level: 2, name: title }).waitFor();
    }
    // Each card is the box around its heading; a card inside another is not an overlap.
    const cards = await page.evaluate(() =>
      Array.from(document.querySelectorAll('[role="heading"][aria-level="2"]')).map((heading) => {
        const card = heading.parentElement!;
        const r = card.getBoundingClientRect();
        return { title: heading.textContent ?? '', box: { x: r.x, y: r.y, width: r.width, height: r.height }, id: Array.from(document.querySelectorAll('*')).indexOf(card) };
      }),
    );
    const nested = await page.evaluate(() => {
      const all = Array.from(document.querySelectorAll('*'));
      const cardsEls = Array.from(document.querySelectorAll('[role="heading"][aria-level="2"]')).map((h) => h.parentElement!);
      return cardsEls.flatMap((a) => cardsEls.filter((b) => a !== b && a.contains(b)).map((b) => [all.indexOf(a), all.indexOf(b)]));
    });
    const isNested = (a: number, b: number) => nested.some(([x, y]) => (x === a && y === b) || (x === b && y === a));
    expect(cards.length).toBeGreaterThanOrEqual(8);
    const overlaps: string[] = [];
    for (const [i, a] of cards.entries()) {
      expect(a.box.height).toBeGreaterThan(40);
      expect(a.box.x).toBeGreaterThanOrEqual(0);
      expect(a.box.x + a.box.width).toBeLessThanOrEqual(PHONE.width);
      for (const b of cards.slice(i + 1)) {
        if (!isNested(a.id, b.id) && overlapArea(a.box, b.box) > 0) overlaps.push(`${a.title} / ${b.title}`);
      }
    }
    expect(overlaps).toEqual([]);
    // The three cards stand one under the other, in the phone's single column.
    const [fit, fabric, steps] = ['Fit ratings by size and area', 'Fabric used against the stated need', 'Unclear instruction steps'].map((t) => cards.find((c) => c.title === t)!.box);
    expect(fabric.y).toBeGreaterThanOrEqual(fit.y + fit.height);
    expect(steps.y).toBeGreaterThanOrEqual(fabric.y + fabric.height);
    // The heat grid says it scrolls sideways, and the keyboard reaches it.
    const grid = page.getByRole('region', { name: /^Alterations by size, sizes 0 to 20, scrolls sideways$/ });
    await grid.focus();
    expect(await grid.evaluate((el) => el === document.activeElement)).toBe(true);
    await page.keyboard.press('ArrowRight');
    await page.keyboard.press('End');
    await page.waitForFunction(() => {
      const el = document.activeElement as HTMLElement | null;
      return !!el && el.scrollLeft > 0;
    });
    await page.getByText(/^Sizes 0 to 20: scroll sideways for the rest/).waitFor();
    await tallScreenshot(page, 'findings-cards-phone.png');
    await page.close();
  });
});

/**
 * A screenshot of the whole screen on a window as tall as its content (the app scrolls inside its
 * own column, so the browser's full-page capture would show one window's height only).
 */
async function tallScreenshot(page: Page, file: string) {
  const viewport = page.viewportSize()!;
  const height = await page.evaluate(() => {
    const scrollers = Array.from(document.querySelectorAll('main, [role="main"]')).flatMap((m) => [m, ...Array.from(m.querySelectorAll('*'))]);
    return Math.max(window.innerHeight, ...scrollers.map((el) => el.scrollHeight - el.clientHeight + window.innerHeight));
  });
  await page.setViewportSize({ width: viewport.width, height: Math.min(height, 12_000) });
  await page.waitForTimeout(200);
  await page.screenshot({ path: path.join(SCREENSHOT_DIR, file) });
  await page.setViewportSize(viewport);
}
