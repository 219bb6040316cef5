import path from 'node:path';
import request from 'supertest';
import { Trial } from '../../db/models';
import { addMember, bearer, createStudio, createUser, TEST_PASSWORD, enrolTester } from '../support/factories';
import { SCREENSHOT_DIR, startBrowserHarness, type BrowserHarness } from '../support/browser';
import { waitForMessage } from '../support/inbox';
import { tinyPdf } from '../support/sample-files';

const WIDE = { width: 1280, height: 800 };
const PHONE = { width: 390, height: 844 };
// A small valid PDF built in code (see tests/support/sample-files.ts).
const PDF = tinyPdf();

describe('draft files in Chromium', () => {
  let h: BrowserHarness;
  beforeAll(async () => {
    h = await startBrowserHarness();
  });
  afterAll(() => h?.close());

  it('a coordinator uploads a draft on the pattern page; the enrolled tester is told and downloads it from My trials', async () => {
    const studio = await createStudio('Draft Studio');
    const coordinator = await createUser('draft-coord');
    const tester = await createUser('draft-tester');
    await addMember(studio, coordinator, 'coordinator');
    await addMember(studio, tester, 'tester');
    const auth = { Authorization: bearer(coordinator, h.t.config) };
    const pattern = await request(h.t.app).post(`/api/studios/${studio.id}/patterns`).set(auth).send({ name: 'Camp shirt', category: 'shirt', fabricKind: 'woven' }).expect(201);
    const chart = await request(h.t.app)
      .put(`/api/studios/${studio.id}/patterns/${pattern.body.id}/chart`)
      .set(auth)
      .send({ draftedHeightMm: null, bodyColumns: ['bust'], finishedColumns: [], sizes: [{ label: 'M', bodyMm: { bust: 960 } }], variants: [] })
      .expect(200);
    const sizeId = chart.body.chart.sizes[0].id;
    const trial = await Trial.create({ studioId: studio.id, patternId: pattern.body.id, slug: `camp-${Date.now()}`, title: 'Camp shirt round one', state: 'running', coverage: { sizes: [{ sizeId, target: 1 }], heightBands: [], variants: [] } });
    await enrolTester(trial.id, tester.id, sizeId, { plannedFabric: 'Rayon', experience: 'advanced' });

    const staff = await h.newContext();
    expect((await staff.request.post('/api/auth/sign-in', { data: { email: coordinator.email, password: TEST_PASSWORD } })).status()).toBe(200);
    const page = await h.newPage(staff, WIDE);
    await page.goto(`/patterns/${pattern.body.id}`);
    await page.getByRole('heading', { name: 'Camp shirt', level: 1 }).waitFor();
    await page.getByLabel('What changed').fill('First draft: collar stand widened');
    await page.getByLabel('Print at home, A4 (PDF)').setInputFiles({ name: 'camp-shirt-a4.pdf', mimeType: 'application/pdf', buffer: PDF });
    await page.getByRole('button', { name: 'Upload draft' }).click();
    await page.getByText('Draft 1 uploaded; its testers were told by e-mail.').waitFor();
    await page.getByText('Not downloaded yet').waitFor();

    await waitForMessage(tester.email, 'New draft 1: Camp shirt round one');
    const testerContext = await h.newContext();
    expect((await testerContext.request.post('/api/auth/sign-in', { data: { email: tester.email, password: TEST_PASSWORD } })).status()).toBe(200);
    const phone = await h.newPage(testerContext, PHONE);
    await phone.goto('/my-trials');
    await phone.getByText('Draft 1 (newest): First draft: collar stand widened').waitFor();
    const [download] = await Promise.all([
      phone.waitForEvent('download'),
      phone.getByRole('button', { name: 'Download camp-shirt-a4.pdf, draft 1' }).click(),
    ]);
    expect(download.suggestedFilename()).toBe('camp-shirt-a4.pdf');
    await phone.screenshot({ path: path.join(SCREENSHOT_DIR, 'my-trials-drafts-phone.png'), fullPage: true });

    await page.reload();
    await page.getByText(`Downloaded by ${tester.name}`).waitFor();
    expect(h.errors).toEqual([]);
  });
});
