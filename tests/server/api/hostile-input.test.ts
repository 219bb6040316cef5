import { mkdir, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { assert as checkProperty, asyncProperty, jsonValue, nat } from 'fast-check';
import { QueryTypes } from 'sequelize';
import request from 'supertest';
import { Application, Draft, DraftFile, Invitation, Milestone, OutboxMessage, Pattern, PatternSize, Photo, Trial, type User } from '../../../db/models';
import { newSecretToken } from '../../../server/auth/secret-token';
import { settleBackgroundWork } from '../../../server/background';
import { bearer, createStudioWorld, createUser, enrolTester, uniqueEmail, type StudioWorld } from '../../support/factories';
import { registeredRoutes } from '../../support/routes';
import { jpegWithGpsAndOrientation, tinyPdf } from '../../support/sample-files';
import { buildTestApp, type TestApp } from '../../support/test-app';
import { ownMailDatabase } from './mail-support';

/**
 * Every write route of the API, each field of a valid body replaced in turn by each hostile value
 * below (then by random JSON from fast-check): the answer is never a 5xx, and a refusal leaves
 * every table exactly as it was. Runs on a database of its own, so "as it was" can be measured
 * over all tables.
 */

// Each value as JSON text, so the malformed ones (lone surrogates, runaway nesting) are sent as such.
const HOSTILE: [string, string][] = [
  ['NUL', JSON.stringify('a\u0000b')],
  ['NUL alone', '"\\u0000"'],
  ['lone high surrogate', '"a\\ud800b"'],
  ['lone low surrogate', '"\\udc00"'],
  ['1 MB string', JSON.stringify('x'.repeat(1_048_576))],
  ['200 000 characters', JSON.stringify('é'.repeat(200_000))],
  ['empty string', '""'],
  ['spaces only', '"   "'],
  ['deep array', `${'['.repeat(3000)}${']'.repeat(3000)}`],
  ['deep object', `${'{"a":'.repeat(300)}1${'}'.repeat(300)}`],
  ['__proto__ key', '{"__proto__":{"isAdmin":true}}'],
  ['constructor key', '{"constructor":{"prototype":{"isAdmin":true}}}'],
  ['1e308', '1e308'],
  ['-1e308', '-1e308'],
  ['5e-324', '5e-324'],
  ['-0', '-0'],
  ['2^53 + 1', '9007199254740993'],
  ['1e21', '1e21'],
  ['-1', '-1'],
  ['year 0000', '"0000-01-01T00:00:00Z"'],
  ['year 9999', '"9999-12-31T23:59:59Z"'],
  ['year +275760', '"+275760-09-13T00:00:00Z"'],
  ['true', 'true'],
  ['null', 'null'],
  ['empty array', '[]'],
  ['empty object', '{}'],
  ['number as text', '"12"'],
  ['id of nothing', '"00000000-0000-4000-8000-000000000000"'],
  ['SQL-like', JSON.stringify("' OR 1=1; DROP TABLE users; --")],
  ['markup', JSON.stringify('<img src=x onerror=alert(1)>')],
  ['emoji', JSON.stringify('🧵'.repeat(60))],
  ['right-to-left override', JSON.stringify('\u202Egnp.exe')],
];
/**
 * For fields nested two or more levels down, the values that differ by kind rather than by size
 * (the long strings and extreme numbers are sent to the fields above them and to every leaf of
 * the first level): keeps the suite to a few minutes on a shared 2-core machine.
 */
const CORE = new Set(['NUL', 'lone high surrogate', 'lone low surrogate', '200 000 characters', 'deep array', '__proto__ key', '1e308', '5e-324', '-1', 'year 0000', 'true', 'null', 'empty object', 'SQL-like']);
/** For form fields and CSV text, which carry text only. */
const HOSTILE_TEXT = HOSTILE.filter(([, json]) => json.startsWith('"')).map(([label, json]) => [label, JSON.parse(json) as string] as const);

type Ctx = StudioWorld & {
  inviteToken: string;
  invitationId: string;
  patternId: string;
  sizeId: string;
  trialId: string;
  trialSlug: string;
  enrollmentId: string;
  applicationId: string;
  otherApplicationId: string;
  draftFileId: string;
  photoId: string;
  messageId: string;
  tester: User;
};
type Caller = 'anonymous' | 'owner' | 'tester';
type Route = {
  as: Caller;
  path: (c: Ctx) => string;
  body?: (c: Ctx) => unknown;
  kind?: 'json' | 'multipart' | 'csv';
  /** Changes the world for the rest (deletes, withdraws, signs out): run after the others. */
  last?: boolean;
};

const DAY = 86_400_000;
const future = (days: number) => new Date(Date.now() + days * DAY).toISOString();

const ROUTES: Record<string, Route> = {
  'POST /api/auth/sign-up': { as: 'anonymous', path: () => '/api/auth/sign-up', body: () => ({ name: 'New Person', email: uniqueEmail('fuzz'), password: 'a long enough pass', next: '/my-trials' }) },
  'POST /api/auth/verify-email': { as: 'anonymous', path: () => '/api/auth/verify-email', body: () => ({ token: 'x'.repeat(43) }) },
  'POST /api/auth/sign-in': { as: 'anonymous', path: () => '/api/auth/sign-in', body: (c) => ({ email: c.users.grader.email, password: 'correct horse battery' }) },
  'POST /api/auth/sign-out': { as: 'tester', path: () => '/api/auth/sign-out', last: true },
  'PUT /api/auth/session/studio': { as: 'owner', path: () => '/api/auth/session/studio', body: (c) => ({ studioId: c.studio.id }) },
  'POST /api/auth/password-reset': { as: 'anonymous', path: () => '/api/auth/password-reset', body: () => ({ email: uniqueEmail('nobody') }) },
  'POST /api/auth/password-reset/confirm': { as: 'anonymous', path: () => '/api/auth/password-reset/confirm', body: () => ({ token: 'y'.repeat(43), password: 'a long enough pass' }) },
  'POST /api/studios': { as: 'owner', path: () => '/api/studios', body: () => ({ name: 'Another studio', timeZone: 'Europe/Lisbon' }) },
  'PATCH /api/studios/:studioId': {
    as: 'owner',
    path: (c) => `/api/studios/${c.studio.id}`,
    body: () => ({ name: 'Renamed studio', timeZone: 'Europe/Berlin', settings: { fullerBellyMarginMm: 20, analysis: { minTesters: null } } }),
  },
  'DELETE /api/studios/:studioId': { as: 'owner', path: (c) => `/api/studios/${c.otherStudio.id}`, last: true },
  'DELETE /api/studios/:studioId/membership': { as: 'tester', path: (c) => `/api/studios/${c.studio.id}/membership`, last: true },
  'PATCH /api/studios/:studioId/members/:membershipId': { as: 'owner', path: (c) => `/api/studios/${c.studio.id}/members/${c.memberships.grader.id}`, body: () => ({ role: 'grader' }) },
  'DELETE /api/studios/:studioId/members/:membershipId': { as: 'owner', path: (c) => `/api/studios/${c.studio.id}/members/${c.memberships.coordinator.id}`, last: true },
  'POST /api/studios/:studioId/invitations': { as: 'owner', path: (c) => `/api/studios/${c.studio.id}/invitations`, body: () => ({ email: uniqueEmail('invitee'), role: 'tester' }) },
  'DELETE /api/studios/:studioId/invitations/:invitationId': { as: 'owner', path: (c) => `/api/studios/${c.studio.id}/invitations/${c.invitationId}`, last: true },
  'POST /api/invitations/:token/accept': { as: 'tester', path: (c) => `/api/invitations/${c.inviteToken}/accept`, last: true },
  'PATCH /api/me/profile': {
    as: 'tester',
    path: () => '/api/me/profile',
    body: () => ({ name: 'Tess Tester', lengthUnit: 'cm', fabricUnit: 'm', timeZone: 'Europe/Lisbon', experience: 'confident', fitNotes: 'Long torso', measurementsMm: { hip: 1020, height: 1650 }, mail: { reminders: true, trialNews: false, digest: true } }),
  },
  'POST /api/studios/:studioId/patterns': { as: 'owner', path: (c) => `/api/studios/${c.studio.id}/patterns`, body: () => ({ name: 'Shorts', category: 'shorts', fabricKind: 'knit', minStretchPct: 20, notes: 'Pockets' }) },
  'PATCH /api/studios/:studioId/patterns/:patternId': { as: 'owner', path: (c) => `/api/studios/${c.studio.id}/patterns/${c.patternId}`, body: () => ({ name: 'Trousers', notes: 'Pockets moved', archived: false }) },
  'PUT /api/studios/:studioId/patterns/:patternId/chart': {
    as: 'owner',
    path: (c) => `/api/studios/${c.studio.id}/patterns/${c.patternId}/chart`,
    body: (c) => ({
      draftedHeightMm: 1680,
      bodyColumns: ['hip', 'waist'],
      finishedColumns: ['hip'],
      sizes: [{ id: c.sizeId, label: 'M', bodyMm: { hip: 1000, waist: 800 }, finishedMm: { hip: 1060 } }],
      variants: [{ name: 'Fuller belly', kind: 'fuller-belly', columns: ['waist'], valuesMm: { [c.sizeId]: { waist: 850 } } }],
    }),
  },
  'PUT /api/studios/:studioId/patterns/:patternId/fabric-needs': {
    as: 'owner',
    path: (c) => `/api/studios/${c.studio.id}/patterns/${c.patternId}/fabric-needs`,
    body: () => ({ needs: [{ size: 'M', widthMm: 1500, napped: false, lengthMm: 1800 }] }),
  },
  'POST /api/studios/:studioId/patterns/:patternId/chart.csv': { as: 'owner', kind: 'csv', path: (c) => `/api/studios/${c.studio.id}/patterns/${c.patternId}/chart.csv` },
  'POST /api/studios/:studioId/patterns/:patternId/size-advice': {
    as: 'owner',
    path: (c) => `/api/studios/${c.studio.id}/patterns/${c.patternId}/size-advice`,
    body: () => ({ measurementsMm: { hip: 1000, waist: 800 }, variantsAllowed: true }),
  },
  'POST /api/studios/:studioId/trials': {
    as: 'owner',
    path: (c) => `/api/studios/${c.studio.id}/trials`,
    body: (c) => ({
      patternId: c.patternId,
      title: 'Second round',
      callText: 'Looking for testers',
      requirements: 'Daylight photos',
      coverage: { sizes: [{ sizeId: c.sizeId, target: 2 }], heightBands: [{ id: 'tall', label: 'Tall', minMm: 1700, maxMm: null }], variants: [] },
      milestones: { 'applications-close': future(5), 'final-report': future(20) },
    }),
  },
  'PATCH /api/studios/:studioId/trials/:trialId': {
    as: 'owner',
    path: (c) => `/api/studios/${c.studio.id}/trials/${c.trialId}`,
    body: (c) => ({
      title: 'Matrix trial',
      requirements: 'Photos in daylight.',
      coverage: { sizes: [{ sizeId: c.sizeId, target: 3 }], heightBands: [{ id: 'short', label: 'Under 160 cm', minMm: null, maxMm: 1600 }], variants: [] },
      milestones: { 'final-report': future(20) },
    }),
  },
  'POST /api/studios/:studioId/trials/:trialId/selection/proposal': { as: 'owner', path: (c) => `/api/studios/${c.studio.id}/trials/${c.trialId}/selection/proposal` },
  'POST /api/studios/:studioId/trials/:trialId/decisions': {
    as: 'owner',
    path: (c) => `/api/studios/${c.studio.id}/trials/${c.trialId}/decisions`,
    body: (c) => ({ applicationIds: [c.otherApplicationId], status: 'shortlisted' }),
  },
  'PATCH /api/studios/:studioId/trials/:trialId/enrollments/:enrollmentId/due': {
    as: 'owner',
    path: (c) => `/api/studios/${c.studio.id}/trials/${c.trialId}/enrollments/${c.enrollmentId}/due`,
    body: () => ({ kind: 'final-report', dueAt: future(30) }),
  },
  'POST /api/studios/:studioId/patterns/:patternId/drafts': { as: 'owner', kind: 'multipart', path: (c) => `/api/studios/${c.studio.id}/patterns/${c.patternId}/drafts` },
  'POST /api/draft-files/:fileId/link': { as: 'tester', path: (c) => `/api/draft-files/${c.draftFileId}/link` },
  'POST /api/me/enrollments/:enrollmentId/photos': { as: 'tester', kind: 'multipart', path: (c) => `/api/me/enrollments/${c.enrollmentId}/photos` },
  'DELETE /api/me/photos/:photoId': { as: 'tester', path: (c) => `/api/me/photos/${c.photoId}`, last: true },
  'POST /api/photos/:photoId/link': { as: 'tester', path: (c) => `/api/photos/${c.photoId}/link` },
  'PATCH /api/me/photos/:photoId': { as: 'tester', path: (c) => `/api/me/photos/${c.photoId}`, body: () => ({ consent: 'may-share' }) },
  'PUT /api/me/enrollments/:enrollmentId/reports/:stage': {
    as: 'tester',
    path: (c) => `/api/me/enrollments/${c.enrollmentId}/reports/final`,
    body: () => ({
      sizeSewn: 'M',
      variantSewn: null,
      draftVersion: 1,
      fit: { waist: -1, rise: 1 },
      alterations: [{ area: 'rise', kind: 'back-rise', amountMm: 19.05, where: 'back', note: 'a little', otherText: '' }],
      fabric: { kind: 'Linen', fibre: '100% linen', widthMm: 1400, usedMm: 2300, stretchPct: null, napped: false },
      unclearSteps: [{ step: '7', problem: 'The fly front order' }],
      verdict: 'Comfortable; the rise is a touch short.',
      wouldMakeAgain: true,
    }),
  },
  'POST /api/me/enrollments/:enrollmentId/reports/:stage/submit': { as: 'tester', path: (c) => `/api/me/enrollments/${c.enrollmentId}/reports/final/submit` },
  'PUT /api/studios/:studioId/trials/:trialId/findings/triage': {
    as: 'owner',
    path: (c) => `/api/studios/${c.studio.id}/trials/${c.trialId}/findings/triage`,
    body: () => ({ kind: 'back-rise', direction: 'add', state: 'fixed', fixedInDraft: 2 }),
  },
  'PATCH /api/studios/:studioId/trials/:trialId/release': {
    as: 'owner',
    path: (c) => `/api/studios/${c.studio.id}/trials/${c.trialId}/release`,
    body: () => ({ finalDraftId: null, coverageGapNote: 'Size 20 had no tester; accepted.' }),
  },
  // Releasing closes the trial for the routes after it.
  'POST /api/studios/:studioId/trials/:trialId/release': {
    as: 'owner',
    path: (c) => `/api/studios/${c.studio.id}/trials/${c.trialId}/release`,
    body: () => ({ confirmOpenItems: ['findings-triaged'] }),
    last: true,
  },
  'PATCH /api/studios/:studioId/trials/:trialId/enrollments/:enrollmentId/excuse': {
    as: 'owner',
    path: (c) => `/api/studios/${c.studio.id}/trials/${c.trialId}/enrollments/${c.enrollmentId}/excuse`,
    body: () => ({ excused: false, note: null }),
  },
  'POST /api/studios/:studioId/trials/:trialId/reward-codes': {
    as: 'owner',
    path: (c) => `/api/studios/${c.studio.id}/trials/${c.trialId}/reward-codes`,
    body: () => ({ csv: 'code\nTHANKS-0001\n' }),
  },
  'POST /api/studios/:studioId/trials/:trialId/reward-codes/send': { as: 'owner', path: (c) => `/api/studios/${c.studio.id}/trials/${c.trialId}/reward-codes/send` },
  'POST /api/studios/:studioId/trials/:trialId/announcements': {
    as: 'owner',
    path: (c) => `/api/studios/${c.studio.id}/trials/${c.trialId}/announcements`,
    body: (c) => ({ subject: 'Draft 2 is out', body: 'Please download draft 2.', statuses: ['active'], sizeIds: [c.sizeId] }),
  },
  'POST /api/studios/:studioId/trials/:trialId/copy': {
    as: 'owner',
    path: (c) => `/api/studios/${c.studio.id}/trials/${c.trialId}/copy`,
    body: () => ({ title: 'Second round', shiftDays: 42, inviteFinishers: false }),
  },
  'POST /api/studios/:studioId/pool/invitations': {
    as: 'owner',
    path: (c) => `/api/studios/${c.studio.id}/pool/invitations`,
    body: (c) => ({ trialId: c.trialId, userIds: [c.tester.id] }),
  },
  'POST /api/me/final-files/:fileId/link': { as: 'tester', path: (c) => `/api/me/final-files/${c.draftFileId}/link` },
  'POST /api/me/calendar/feed': { as: 'tester', path: () => '/api/me/calendar/feed' },
  'DELETE /api/me/calendar/feed': { as: 'tester', path: () => '/api/me/calendar/feed' },
  // A wrong password: every case is refused, so the tester's account stays for the other routes.
  'DELETE /api/me/account': { as: 'tester', path: () => '/api/me/account', body: () => ({ password: 'not the password', confirm: 'delete' }) },
  'POST /api/studios/:studioId/trials/:trialId/findings/notes': {
    as: 'owner',
    path: (c) => `/api/studios/${c.studio.id}/trials/${c.trialId}/findings/notes`,
    body: () => ({ kind: 'back-rise', direction: 'add', body: 'Check the back crotch point.' }),
  },
  'PUT /api/studios/:studioId/trials/:trialId/other-alterations': {
    as: 'owner',
    path: (c) => `/api/studios/${c.studio.id}/trials/${c.trialId}/other-alterations`,
    body: () => ({ text: 'took in the back waist', kind: 'waist' }),
  },
  'POST /api/calls/:slug/applications': {
    as: 'tester',
    path: (c) => `/api/calls/${c.trialSlug}/applications`,
    body: (c) => ({ sizeId: c.sizeId, variantId: null, plannedFabric: 'Linen', experience: 'confident', deadlinesConfirmed: true, photoConsent: 'staff-only', note: 'Happy to help' }),
  },
  'POST /api/me/applications/:applicationId/withdraw': { as: 'tester', path: (c) => `/api/me/applications/${c.applicationId}/withdraw`, last: true },
  'POST /api/studios/:studioId/trials/:trialId/mail/:messageId/resend': { as: 'owner', path: (c) => `/api/studios/${c.studio.id}/trials/${c.trialId}/mail/${c.messageId}/resend` },
  'POST /api/mail/opt-out/:token': { as: 'anonymous', path: () => '/api/mail/opt-out/not-a-signed-token' },
};

/** Every path to a value inside `body` ("" is the body itself), arrays by their first item. */
function fieldPaths(body: unknown, prefix: (string | number)[] = []): (string | number)[][] {
  const here = [prefix];
  if (Array.isArray(body)) return body.length ? [...here, ...fieldPaths(body[0], [...prefix, 0])] : here;
  if (body && typeof body === 'object') return [...here, ...Object.entries(body).flatMap(([k, v]) => fieldPaths(v, [...prefix, k]))];
  return here;
}

const MARK = '\u2063HOSTILE\u2063';
/** The body as JSON text with the value at `at` replaced by the raw JSON `json`. */
function withValue(body: unknown, at: (string | number)[], json: string): string {
  if (at.length === 0) return json;
  const copy = structuredClone(body) as Record<string | number, unknown>;
  let node = copy;
  for (const key of at.slice(0, -1)) node = node[key] as Record<string | number, unknown>;
  node[at[at.length - 1]!] = MARK;
  return JSON.stringify(copy).replace(JSON.stringify(MARK), json);
}

describe('hostile input on every write route', () => {
  let db: Awaited<ReturnType<typeof ownMailDatabase>>;
  let t: TestApp;
  let ctx: Ctx;
  let previousUrl: string | undefined;
  let digestSql = '';
  const tally = { cases: 0, refused: 0, accepted: 0, fiveHundreds: [] as string[], changedOnRefusal: [] as string[], byStatus: {} as Record<number, number> };

  async function digest(): Promise<string> {
    // Work an earlier request goes on with after its answer (a sign-up's mail) ends first.
    await settleBackgroundWork();
    const [row] = await t.sequelize.query<{ d: string }>(digestSql, { type: QueryTypes.SELECT });
    return row!.d;
  }

  beforeAll(async () => {
    db = await ownMailDatabase();
    previousUrl = process.env.DATABASE_URL;
    process.env.DATABASE_URL = db.url;
    // Generous limits: a 429 would hide what the route itself does with the value.
    t = buildTestApp({ INVITATION_DAILY_LIMIT: '1000000', PHOTO_UPLOAD_HOURLY_LIMIT: '1000000' });
    const tables = await t.sequelize.query<{ name: string }>(
      "SELECT table_name::text AS name FROM information_schema.tables WHERE table_schema = 'public' AND table_name NOT IN ('rate_limits', 'schema_migrations') ORDER BY 1",
      { type: QueryTypes.SELECT },
    );
    // One hash of every row of every table (the rate-limit counters aside, which count refusals too).
    digestSql = `SELECT md5(string_agg(h, '|' ORDER BY h)) AS d FROM (${tables
      .map((x) => `SELECT '${x.name}:' || md5(coalesce(string_agg(t::text, ',' ORDER BY t::text), '')) AS h FROM "${x.name}" t`)
      .join(' UNION ALL ')}) s`;

    const world = await createStudioWorld();
    const { token, hash } = newSecretToken();
    const invitation = await Invitation.create({ studioId: world.studio.id, email: world.users.tester.email, role: 'grader', tokenHash: hash, invitedById: world.users.owner.id, expiresAt: new Date(Date.now() + DAY) });
    const pattern = await Pattern.create({ studioId: world.studio.id, name: 'Trousers', category: 'trousers', fabricKind: 'woven', bodyColumns: ['hip'] });
    const size = await PatternSize.create({ patternId: pattern.id, label: 'M', position: 0, bodyMm: { hip: 1000 } });
    const trial = await Trial.create({ studioId: world.studio.id, patternId: pattern.id, slug: `fuzz-${Date.now()}`, title: 'Matrix trial', state: 'open', coverage: { sizes: [{ sizeId: size.id, target: 3 }], heightBands: [], variants: [] } });
    await Milestone.create({ trialId: trial.id, kind: 'final-report', dueAt: new Date(Date.now() + 10 * DAY) });
    const { application, enrollment } = await enrolTester(trial.id, world.users.tester.id, size.id);
    const other = await createUser('fuzz-other');
    const otherApp = await Application.create({ trialId: trial.id, userId: other.id, sizeId: size.id, variantId: null, profileSnapshot: {}, adviceSnapshot: null, plannedFabric: 'Linen', experience: 'confident', photoConsent: 'staff-only', appliedAt: new Date() });
    const draft = await Draft.create({ patternId: pattern.id, version: 1, changeNote: 'First', createdById: null });
    const draftFile = await DraftFile.create({ draftId: draft.id, kind: 'print-a4', originalName: 'a4.pdf', objectKey: `drafts/${draft.id}.pdf`, bytes: 10 });
    const photo = await Photo.create({ enrollmentId: enrollment.id, stage: 'final', view: 'detail', consent: 'staff-only', fullKey: `photos/${draft.id}.jpg`, thumbKey: `photos/${draft.id}-t.jpg`, width: 10, height: 10 });
    const message = await OutboxMessage.create({ idempotencyKey: `fuzz:${token}`, recipientId: other.id, recipientEmail: other.email, template: 'declined', category: 'trial-news', studioId: world.studio.id, trialId: trial.id, subject: 'Fuzz', text: 'Fuzz', html: null, status: 'failed', attempts: 5, nextAttemptAt: new Date() });
    ctx = {
      ...world,
      inviteToken: token,
      invitationId: invitation.id,
      patternId: pattern.id,
      sizeId: size.id,
      trialId: trial.id,
      trialSlug: trial.slug,
      enrollmentId: enrollment.id,
      applicationId: application.id,
      otherApplicationId: otherApp.id,
      draftFileId: draftFile.id,
      photoId: photo.id,
      messageId: message.id,
      tester: world.users.tester,
    };
  });

  afterAll(async () => {
    const summary = `hostile input: ${tally.cases} cases over ${Object.keys(ROUTES).length} write routes, ${tally.fiveHundreds.length} × 5xx, ${tally.refused} refused (${tally.changedOnRefusal.length} changed stored data), ${tally.accepted} accepted`;
    await mkdir(path.resolve(__dirname, '../../../.artifacts'), { recursive: true });
    await writeFile(path.resolve(__dirname, '../../../.artifacts/hostile-input.json'), JSON.stringify({ summary, ...tally }, null, 2));
    process.stdout.write(`\n${summary}\n`);
    await t.close();
    process.env.DATABASE_URL = previousUrl;
    await db.drop();
  });

  const callerHeaders = (route: Route): Record<string, string> =>
    route.as === 'anonymous' ? {} : { Authorization: bearer(route.as === 'owner' ? ctx.users.owner : ctx.tester, t.config) };

  /** Sends one case; returns its status, counting it. A refusal is checked to have changed nothing. */
  async function send(key: string, route: Route, label: string, build: (req: request.Test) => request.Test, checkUnchanged: boolean, recheck = false): Promise<number> {
    const before = checkUnchanged ? await digest() : '';
    const [method] = key.split(' ') as ['POST' | 'PUT' | 'PATCH' | 'DELETE'];
    const req = request(t.app)[method.toLowerCase() as 'post'](route.path(ctx)).set(callerHeaders(route));
    const res = await build(req);
    if (recheck) {
      // The same case sent again to compare the data on its own: not a new case.
      if (res.status >= 500) tally.fiveHundreds.push(`${key} — ${label}: ${res.status} on the second sending`);
      if (res.status >= 400 && (await digest()) !== before) tally.changedOnRefusal.push(`${key} — ${label}: ${res.status}`);
      return res.status;
    }
    tally.cases += 1;
    tally.byStatus[res.status] = (tally.byStatus[res.status] ?? 0) + 1;
    if (res.status >= 500) tally.fiveHundreds.push(`${key} — ${label}: ${res.status} ${JSON.stringify(res.body).slice(0, 200)}`);
    if (res.status >= 400) {
      tally.refused += 1;
      if (checkUnchanged && (await digest()) !== before) tally.changedOnRefusal.push(`${key} — ${label}: ${res.status}`);
    } else tally.accepted += 1;
    return res.status;
  }

  it('covers every registered write route', () => {
    const writes = registeredRoutes(t.app).filter((r) => !r.startsWith('GET '));
    expect(writes.filter((r) => !(r in ROUTES))).toEqual([]);
    expect(Object.keys(ROUTES).filter((r) => !writes.includes(r))).toEqual([]);
  });

  const ordered = Object.entries(ROUTES).sort(([, a], [, b]) => Number(Boolean(a.last)) - Number(Boolean(b.last)));

  // A test that timed out would go on sending while the next one measures: generous time each.
  it.each(ordered)('%s: each field × each hostile value, never a 5xx, and a refusal changes nothing', async (key, route) => {
    const kind = route.kind ?? 'json';
    if (kind === 'json') {
      const base = route.body?.(ctx) ?? {};
      for (const at of fieldPaths(base)) {
        const where = at.length ? at.join('.') : '(the whole body)';
        const one = (label: string, json: string, check: boolean) =>
          send(key, route, `${where} = ${label}`, (req) => req.set('Content-Type', 'application/json').send(withValue(route.body?.(ctx) ?? base, at, json)), check, check);
        // All values for this field, then one comparison of every table; only when some value was
        // accepted (and so changed things) is each refusal compared on its own, sent again.
        const values = at.length >= 2 ? HOSTILE.filter(([label]) => CORE.has(label)) : HOSTILE;
        const before = await digest();
        const statuses = [];
        for (const [label, json] of values) statuses.push(await one(label, json, false));
        if (statuses.every((status) => status >= 400)) {
          if ((await digest()) !== before) tally.changedOnRefusal.push(`${key} — ${where}: all refused, yet the data changed`);
        } else {
          for (const [i, [label, json]] of values.entries()) if (statuses[i]! >= 400) await one(label, json, true);
        }
      }
      // Hostile text in the query string too.
      for (const [label, text] of HOSTILE_TEXT.slice(0, 4)) {
        await send(key, route, `query = ${label}`, (req) => req.query({ q: text }).set('Content-Type', 'application/json').send(JSON.stringify(route.body?.(ctx) ?? {})), false);
      }
    } else if (kind === 'csv') {
      for (const [label, text] of HOSTILE_TEXT) {
        await send(key, route, `CSV cell = ${label}`, (req) => req.set('Content-Type', 'text/csv').send(`Size,Hip (cm)\n${text.replace(/[\r\n,]/g, ' ')},100\n`), true);
        await send(key, route, `CSV header = ${label}`, (req) => req.set('Content-Type', 'text/csv').send(`Size,${text.replace(/[\r\n,]/g, ' ')}\nM,100\n`), true);
      }
    } else if (key.includes('/drafts')) {
      for (const [label, text] of HOSTILE_TEXT) {
        await send(key, route, `changeNote = ${label}`, (req) => req.field('changeNote', text.slice(0, 100_000)).attach('print-a4', tinyPdf(), 'a4.pdf'), true);
        await send(key, route, `file name = ${label}`, (req) => req.field('changeNote', 'A draft').attach('print-a4', tinyPdf(), `${text.slice(0, 200) || 'x'}.pdf`), false);
      }
    } else {
      const photo = await jpegWithGpsAndOrientation();
      for (const field of ['stage', 'view', 'consent']) {
        for (const [label, text] of HOSTILE_TEXT) {
          const fields: Record<string, string> = { stage: 'final', view: 'detail', consent: 'staff-only', [field]: text.slice(0, 100_000) };
          await send(key, route, `${field} = ${label}`, (req) => req.field('stage', fields.stage!).field('view', fields.view!).field('consent', fields.consent!).attach('photo', photo, 'p.jpg'), true);
        }
      }
    }
    expect(tally.fiveHundreds.filter((f) => f.startsWith(key))).toEqual([]);
    expect(tally.changedOnRefusal.filter((f) => f.startsWith(key))).toEqual([]);
  }, 600_000);

  it('random JSON in random fields of every body route (fast-check): never a 5xx', async () => {
    const jsonRoutes = ordered.filter(([, r]) => (r.kind ?? 'json') === 'json' && r.body && !r.last);
    await checkProperty(
      asyncProperty(nat({ max: jsonRoutes.length - 1 }), nat(), jsonValue({ maxDepth: 4 }), async (r, f, value) => {
        const [key, route] = jsonRoutes[r]!;
        const base = route.body!(ctx);
        const paths = fieldPaths(base);
        const at = paths[f % paths.length]!;
        const status = await send(key, route, `random at ${at.join('.')}`, (req) => req.set('Content-Type', 'application/json').send(withValue(base, at, JSON.stringify(value) ?? 'null')), false);
        return status < 500;
      }),
      { numRuns: 300, seed: 20_251_202 },
    );
  }, 600_000);

  it('reports the count and no 5xx at all', () => {
    expect(tally.cases).toBeGreaterThan(3000);
    expect({ fiveHundreds: tally.fiveHundreds, changedOnRefusal: tally.changedOnRefusal }).toEqual({ fiveHundreds: [], changedOnRefusal: [] });
  });
});
