import request from 'supertest';
import { Application, Draft, DraftFile, Invitation, OutboxMessage, Pattern, PatternSize, Photo, Trial } from '../../../db/models';
import { newSecretToken } from '../../../server/auth/secret-token';
import { bearer, createStudioWorld, createUser, TEST_PASSWORD, uniqueEmail, type StudioWorld, enrolTester } from '../../support/factories';
import { registeredRoutes } from '../../support/routes';
import { buildTestApp, type TestApp } from '../../support/test-app';

/**
 * Every API route, called as each kind of caller, against the policy: allowed callers get
 * past the access checks (any answer but 401/403/404); the rest are refused with 401 when
 * anonymous, 404 when not a member of the studio in the URL, 403 when their role may not.
 * A route registered without a row here fails the first test: extend the table with it.
 */
const PERSONAS = ['anonymous', 'testerHere', 'testerElsewhere', 'grader', 'coordinator', 'owner', 'memberElsewhere'] as const;
type Persona = (typeof PERSONAS)[number];

type Ctx = StudioWorld & {
  persona: Persona;
  inviteToken: string;
  invitationId: string;
  patternId: string;
  sizeId: string;
  trialId: string;
  trialSlug: string;
  enrollmentId: string;
  otherApplicationId: string;
  draftFileId: string;
  photoId: string;
  /** A failed message in the trial's outbox. */
  messageId: string;
  /** An application of the caller's own (every signed-in persona has one). */
  ownApplicationId: string | null;
};
type Row = {
  allow: readonly Persona[];
  call: (ctx: Ctx) => { path: string; body?: object };
  /** Refused by ownership (not by role): every signed-in caller who is not allowed gets 403 and nothing of it. */
  hidden?: boolean;
};

const EVERYONE = PERSONAS;
const SIGNED_IN = PERSONAS.filter((p) => p !== 'anonymous');
const MEMBERS_HERE = ['testerHere', 'grader', 'coordinator', 'owner'] as const;
const MANAGERS = ['coordinator', 'owner'] as const;
const OWNER = ['owner'] as const;
const STAFF = ['grader', 'coordinator', 'owner'] as const;

const MATRIX: Record<string, Row> = {
  'GET /api/health': { allow: EVERYONE, call: () => ({ path: '/api/health' }) },
  'GET /api/health/live': { allow: EVERYONE, call: () => ({ path: '/api/health/live' }) },
  'POST /api/auth/sign-up': {
    allow: EVERYONE,
    call: () => ({ path: '/api/auth/sign-up', body: { name: 'New', email: uniqueEmail('m'), password: 'a long password' } }),
  },
  'POST /api/auth/verify-email': {
    allow: EVERYONE,
    call: () => ({ path: '/api/auth/verify-email', body: { token: 'x'.repeat(43) } }),
  },
  'POST /api/auth/sign-in': {
    allow: EVERYONE,
    call: (c) => ({ path: '/api/auth/sign-in', body: { email: c.users.grader.email, password: TEST_PASSWORD } }),
  },
  'POST /api/auth/sign-out': { allow: EVERYONE, call: () => ({ path: '/api/auth/sign-out' }) },
  'GET /api/auth/session': { allow: SIGNED_IN, call: () => ({ path: '/api/auth/session' }) },
  'PUT /api/auth/session/studio': {
    allow: MEMBERS_HERE,
    call: (c) => ({ path: '/api/auth/session/studio', body: { studioId: c.studio.id } }),
  },
  'POST /api/auth/password-reset': {
    allow: EVERYONE,
    call: () => ({ path: '/api/auth/password-reset', body: { email: uniqueEmail('nobody') } }),
  },
  'POST /api/auth/password-reset/confirm': {
    allow: EVERYONE,
    call: () => ({ path: '/api/auth/password-reset/confirm', body: { token: 'x'.repeat(43), password: 'a long password' } }),
  },
  'GET /api/studios': { allow: SIGNED_IN, call: () => ({ path: '/api/studios' }) },
  'POST /api/studios': { allow: SIGNED_IN, call: () => ({ path: '/api/studios', body: { name: 'Another studio' } }) },
  'GET /api/studios/:studioId': { allow: MEMBERS_HERE, call: (c) => ({ path: `/api/studios/${c.studio.id}` }) },
  'PATCH /api/studios/:studioId': {
    allow: OWNER,
    call: (c) => ({ path: `/api/studios/${c.studio.id}`, body: { name: 'Renamed studio' } }),
  },
  'DELETE /api/studios/:studioId': { allow: OWNER, call: (c) => ({ path: `/api/studios/${c.studio.id}` }) },
  'DELETE /api/studios/:studioId/membership': {
    allow: MEMBERS_HERE,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/membership` }),
  },
  'GET /api/studios/:studioId/members': { allow: MANAGERS, call: (c) => ({ path: `/api/studios/${c.studio.id}/members` }) },
  'PATCH /api/studios/:studioId/members/:membershipId': {
    allow: OWNER,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/members/${c.memberships.tester.id}`, body: { role: 'grader' } }),
  },
  'DELETE /api/studios/:studioId/members/:membershipId': {
    allow: OWNER,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/members/${c.memberships.tester.id}` }),
  },
  'GET /api/studios/:studioId/invitations': {
    allow: MANAGERS,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/invitations` }),
  },
  'POST /api/studios/:studioId/invitations': {
    allow: MANAGERS,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/invitations`, body: { email: uniqueEmail('invitee'), role: 'tester' } }),
  },
  'DELETE /api/studios/:studioId/invitations/:invitationId': {
    allow: MANAGERS,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/invitations/${c.invitationId}` }),
  },
  // The link itself is the secret: anyone holding it may read what it offers.
  'GET /api/invitations/:token': { allow: EVERYONE, call: (c) => ({ path: `/api/invitations/${c.inviteToken}` }) },
  'POST /api/invitations/:token/accept': {
    allow: SIGNED_IN,
    call: (c) => ({ path: `/api/invitations/${c.inviteToken}/accept` }),
  },
  'GET /api/me/profile': { allow: SIGNED_IN, call: () => ({ path: '/api/me/profile' }) },
  'PATCH /api/me/profile': {
    allow: SIGNED_IN,
    call: () => ({ path: '/api/me/profile', body: { lengthUnit: 'cm', measurementsMm: { hip: 1020 } } }),
  },
  'GET /api/studios/:studioId/patterns': { allow: STAFF, call: (c) => ({ path: `/api/studios/${c.studio.id}/patterns` }) },
  'POST /api/studios/:studioId/patterns': {
    allow: MANAGERS,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/patterns`, body: { name: 'Shorts', category: 'shorts', fabricKind: 'woven' } }),
  },
  'GET /api/studios/:studioId/patterns/:patternId': {
    allow: STAFF,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/patterns/${c.patternId}` }),
  },
  'PATCH /api/studios/:studioId/patterns/:patternId': {
    allow: MANAGERS,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/patterns/${c.patternId}`, body: { notes: 'Pockets moved' } }),
  },
  'PUT /api/studios/:studioId/patterns/:patternId/chart': {
    allow: MANAGERS,
    call: (c) => ({
      path: `/api/studios/${c.studio.id}/patterns/${c.patternId}/chart`,
      body: { draftedHeightMm: 1680, bodyColumns: ['hip'], finishedColumns: [], sizes: [{ label: 'M', bodyMm: { hip: 1000 } }] },
    }),
  },
  'PUT /api/studios/:studioId/patterns/:patternId/fabric-needs': {
    allow: MANAGERS,
    call: (c) => ({
      path: `/api/studios/${c.studio.id}/patterns/${c.patternId}/fabric-needs`,
      body: { needs: [{ size: 'M', widthMm: 1500, napped: false, lengthMm: 1800 }] },
    }),
  },
  'GET /api/studios/:studioId/patterns/:patternId/chart.csv': {
    allow: STAFF,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/patterns/${c.patternId}/chart.csv` }),
  },
  'POST /api/studios/:studioId/patterns/:patternId/chart.csv': {
    allow: MANAGERS,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/patterns/${c.patternId}/chart.csv`, body: { csv: 'Size,Hip (cm)\nM,100' } }),
  },
  'GET /api/studios/:studioId/patterns/:patternId/size-advice': {
    allow: MEMBERS_HERE,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/patterns/${c.patternId}/size-advice` }),
  },
  'POST /api/studios/:studioId/patterns/:patternId/size-advice': {
    allow: STAFF,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/patterns/${c.patternId}/size-advice`, body: { measurementsMm: { hip: 1000 } } }),
  },
  'GET /api/studios/:studioId/trials': { allow: STAFF, call: (c) => ({ path: `/api/studios/${c.studio.id}/trials` }) },
  'POST /api/studios/:studioId/trials': {
    allow: MANAGERS,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/trials`, body: { patternId: c.patternId, title: 'Second round' } }),
  },
  'GET /api/studios/:studioId/trials/:trialId': { allow: STAFF, call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}` }) },
  'PATCH /api/studios/:studioId/trials/:trialId': {
    allow: MANAGERS,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}`, body: { requirements: 'Photos in daylight.' } }),
  },
  'GET /api/studios/:studioId/trials/:trialId/applications': {
    allow: MANAGERS,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/applications` }),
  },
  'GET /api/studios/:studioId/trials/:trialId/coverage': {
    allow: MANAGERS,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/coverage` }),
  },
  'POST /api/studios/:studioId/trials/:trialId/selection/proposal': {
    allow: MANAGERS,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/selection/proposal` }),
  },
  'POST /api/studios/:studioId/trials/:trialId/decisions': {
    allow: MANAGERS,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/decisions`, body: { applicationIds: [c.otherApplicationId], status: 'shortlisted' } }),
  },
  'GET /api/studios/:studioId/trials/:trialId/enrollments': {
    allow: MANAGERS,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/enrollments` }),
  },
  'PATCH /api/studios/:studioId/trials/:trialId/enrollments/:enrollmentId/due': {
    allow: MANAGERS,
    call: (c) => ({
      path: `/api/studios/${c.studio.id}/trials/${c.trialId}/enrollments/${c.enrollmentId}/due`,
      body: { kind: 'final-report', dueAt: new Date(Date.now() + 30 * 86_400_000).toISOString() },
    }),
  },
  'GET /api/studios/:studioId/patterns/:patternId/drafts': {
    allow: STAFF,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/patterns/${c.patternId}/drafts` }),
  },
  // Without files: allowed callers get past the checks to a 400; the upload itself is tested elsewhere.
  'POST /api/studios/:studioId/patterns/:patternId/drafts': {
    allow: MANAGERS,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/patterns/${c.patternId}/drafts`, body: { changeNote: 'Draft two' } }),
  },
  // Only the trial's staff and its enrolled testers (the "other" enrolment belongs to someone else).
  'GET /api/me/trials/:trialId/drafts': {
    allow: STAFF,
    hidden: true,
    call: (c) => ({ path: `/api/me/trials/${c.trialId}/drafts` }),
  },
  'POST /api/draft-files/:fileId/link': {
    allow: STAFF,
    hidden: true,
    call: (c) => ({ path: `/api/draft-files/${c.draftFileId}/link` }),
  },
  // A tester's own enrolment only: here the enrolment is someone else's, so every caller is refused
  // (allowed callers are exercised in photos.test.ts).
  'GET /api/me/enrollments/:enrollmentId/photos': { allow: [], hidden: true, call: (c) => ({ path: `/api/me/enrollments/${c.enrollmentId}/photos` }) },
  'POST /api/me/enrollments/:enrollmentId/photos': { allow: [], hidden: true, call: (c) => ({ path: `/api/me/enrollments/${c.enrollmentId}/photos`, body: {} }) },
  'DELETE /api/me/photos/:photoId': { allow: [], hidden: true, call: (c) => ({ path: `/api/me/photos/${c.photoId}` }) },
  'POST /api/photos/:photoId/link': { allow: STAFF, hidden: true, call: (c) => ({ path: `/api/photos/${c.photoId}/link` }) },
  // The photo is someone else's for every caller (owners are exercised in photo-wall.test.ts).
  'PATCH /api/me/photos/:photoId': { allow: [], hidden: true, call: (c) => ({ path: `/api/me/photos/${c.photoId}`, body: { consent: 'may-share' } }) },
  'GET /api/studios/:studioId/trials/:trialId/photos': { allow: STAFF, call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/photos` }) },
  'GET /api/me/enrollments/:enrollmentId/reports/:stage': { allow: [], hidden: true, call: (c) => ({ path: `/api/me/enrollments/${c.enrollmentId}/reports/final` }) },
  'PUT /api/me/enrollments/:enrollmentId/reports/:stage': { allow: [], hidden: true, call: (c) => ({ path: `/api/me/enrollments/${c.enrollmentId}/reports/final`, body: { baseVersion: 0, changes: { sizeSewn: 'M' } } }) },
  'POST /api/me/enrollments/:enrollmentId/reports/:stage/submit': { allow: [], hidden: true, call: (c) => ({ path: `/api/me/enrollments/${c.enrollmentId}/reports/final/submit` }) },
  'GET /api/studios/:studioId/trials/:trialId/reports': { allow: STAFF, call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/reports` }) },
  'GET /api/studios/:studioId/trials/:trialId/reports.csv': { allow: STAFF, call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/reports.csv` }) },
  'GET /api/studios/:studioId/trials/:trialId/findings': { allow: STAFF, call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/findings` }) },
  'GET /api/studios/:studioId/trials/:trialId/findings/changes.csv': { allow: STAFF, call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/findings/changes.csv` }) },
  'PUT /api/studios/:studioId/trials/:trialId/findings/triage': {
    allow: STAFF,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/findings/triage`, body: { kind: 'back-rise', direction: 'add', state: 'will-fix' } }),
  },
  'POST /api/studios/:studioId/trials/:trialId/findings/notes': {
    allow: STAFF,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/findings/notes`, body: { kind: 'back-rise', direction: 'add', body: 'Check the back crotch point.' } }),
  },
  'GET /api/studios/:studioId/trials/:trialId/other-alterations': { allow: MANAGERS, call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/other-alterations` }) },
  'PUT /api/studios/:studioId/trials/:trialId/other-alterations': {
    allow: MANAGERS,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/other-alterations`, body: { text: 'took in the back waist', kind: 'waist' } }),
  },
  'GET /api/calls/:slug': { allow: EVERYONE, call: (c) => ({ path: `/api/calls/${c.trialSlug}` }) },
  'GET /api/calls/:slug/my-advice': { allow: SIGNED_IN, call: (c) => ({ path: `/api/calls/${c.trialSlug}/my-advice` }) },
  'POST /api/calls/:slug/applications': {
    allow: SIGNED_IN,
    call: (c) => ({
      path: `/api/calls/${c.trialSlug}/applications`,
      body: { sizeId: c.sizeId, plannedFabric: 'Linen', experience: 'confident', deadlinesConfirmed: true, photoConsent: 'staff-only' },
    }),
  },
  'GET /api/me/trials': { allow: SIGNED_IN, call: () => ({ path: '/api/me/trials' }) },
  // Only one's own application: a signed-in caller without one would get 404, so each persona has one.
  'POST /api/me/applications/:applicationId/withdraw': {
    allow: SIGNED_IN,
    call: (c) => ({ path: `/api/me/applications/${c.ownApplicationId ?? c.enrollmentId}/withdraw` }),
  },
  'GET /api/studios/:studioId/trials/:trialId/mail': { allow: MANAGERS, call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/mail` }) },
  'POST /api/studios/:studioId/trials/:trialId/mail/:messageId/resend': {
    allow: MANAGERS,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/mail/${c.messageId}/resend` }),
  },
  // The signed link is the credential: anyone may open it; a bad one gets a 400 (tested in outbox.test.ts).
  'GET /api/mail/opt-out/:token': { allow: EVERYONE, call: () => ({ path: '/api/mail/opt-out/not-a-signed-token' }) },
  'POST /api/mail/opt-out/:token': { allow: EVERYONE, call: () => ({ path: '/api/mail/opt-out/not-a-signed-token' }) },
  // Closing a trial: the summary and checklist for all staff; changing and releasing for those who run trials.
  'GET /api/studios/:studioId/trials/:trialId/summary': { allow: STAFF, call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/summary` }) },
  'GET /api/studios/:studioId/trials/:trialId/summary.pdf': { allow: STAFF, call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/summary.pdf` }) },
  'GET /api/studios/:studioId/trials/:trialId/summary/:table.csv': { allow: STAFF, call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/summary/findings.csv` }) },
  'GET /api/studios/:studioId/trials/:trialId/release': { allow: STAFF, call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/release` }) },
  'PATCH /api/studios/:studioId/trials/:trialId/release': {
    allow: MANAGERS,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/release`, body: { coverageGapNote: 'Size M is enough.' } }),
  },
  'POST /api/studios/:studioId/trials/:trialId/release': {
    allow: MANAGERS,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/release`, body: { confirmOpenItems: ['findings-triaged', 'will-fix-drafted', 'coverage', 'testers-done', 'final-draft'] } }),
  },
  'PATCH /api/studios/:studioId/trials/:trialId/enrollments/:enrollmentId/excuse': {
    allow: MANAGERS,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/enrollments/${c.enrollmentId}/excuse`, body: { excused: true } }),
  },
  'GET /api/studios/:studioId/trials/:trialId/reward-codes': { allow: MANAGERS, call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/reward-codes` }) },
  'POST /api/studios/:studioId/trials/:trialId/reward-codes': {
    allow: MANAGERS,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/reward-codes`, body: { csv: 'MATRIX-1' } }),
  },
  'POST /api/studios/:studioId/trials/:trialId/reward-codes/send': { allow: MANAGERS, call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/reward-codes/send` }) },
  'GET /api/studios/:studioId/trials/:trialId/announcements': { allow: STAFF, call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/announcements` }) },
  'POST /api/studios/:studioId/trials/:trialId/announcements': {
    allow: MANAGERS,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/announcements`, body: { subject: 'Hello testers', body: 'News.', statuses: ['active'] } }),
  },
  'POST /api/studios/:studioId/trials/:trialId/copy': {
    allow: MANAGERS,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/trials/${c.trialId}/copy`, body: { title: 'Second round', shiftDays: 60 } }),
  },
  // The pool draws on applications: the staff who choose testers.
  'GET /api/studios/:studioId/pool': { allow: MANAGERS, call: (c) => ({ path: `/api/studios/${c.studio.id}/pool` }) },
  'GET /api/studios/:studioId/pool/calls': { allow: MANAGERS, call: (c) => ({ path: `/api/studios/${c.studio.id}/pool/calls` }) },
  'POST /api/studios/:studioId/pool/invitations': {
    allow: MANAGERS,
    call: (c) => ({ path: `/api/studios/${c.studio.id}/pool/invitations`, body: { trialId: c.trialId, userIds: [c.users.otherTester.id] } }),
  },
  // A person's own things: everyone signed in has them (empty when there is nothing).
  'GET /api/me/announcements': { allow: SIGNED_IN, call: () => ({ path: '/api/me/announcements' }) },
  'GET /api/me/releases': { allow: SIGNED_IN, call: () => ({ path: '/api/me/releases' }) },
  // Only finishers of a released trial whose final draft holds the file; nobody here finished one.
  'POST /api/me/final-files/:fileId/link': { allow: [], hidden: true, call: (c) => ({ path: `/api/me/final-files/${c.draftFileId}/link` }) },
  'GET /api/me/calendar': { allow: SIGNED_IN, call: () => ({ path: '/api/me/calendar' }) },
  'POST /api/me/calendar/feed': { allow: SIGNED_IN, call: () => ({ path: '/api/me/calendar/feed' }) },
  'DELETE /api/me/calendar/feed': { allow: SIGNED_IN, call: () => ({ path: '/api/me/calendar/feed' }) },
  'GET /api/me/calendar.ics': { allow: SIGNED_IN, call: () => ({ path: '/api/me/calendar.ics' }) },
  'GET /api/me/export.zip': { allow: SIGNED_IN, call: () => ({ path: '/api/me/export.zip' }) },
  // One's own account; the studio's only owner is refused with 409 (not an access refusal).
  'DELETE /api/me/account': { allow: SIGNED_IN, call: () => ({ path: '/api/me/account', body: { password: TEST_PASSWORD, confirm: 'delete' } }) },
  // The feed address is the credential; a malformed one gets a 400 (tested in me-data.test.ts).
  'GET /api/calendar/:token': { allow: EVERYONE, call: () => ({ path: '/api/calendar/not-a-feed.ics' }) },
};

function userOf(world: StudioWorld, persona: Persona) {
  switch (persona) {
    case 'anonymous':
      return null;
    case 'testerHere':
      return world.users.tester;
    case 'testerElsewhere':
      return world.users.otherTester;
    case 'memberElsewhere':
      return world.users.otherOwner;
    default:
      return world.users[persona];
  }
}

function expectedDenial(persona: Persona, hidden = false): number {
  if (persona === 'anonymous') return 401;
  if (hidden) return 403;
  return (MEMBERS_HERE as readonly string[]).includes(persona) ? 403 : 404;
}

describe('access matrix', () => {
  let t: TestApp;
  beforeAll(() => {
    t = buildTestApp();
  });
  afterAll(() => t.close());

  it('lists every registered API route, and no route that is not registered', () => {
    const routes = registeredRoutes(t.app);
    expect(routes.filter((r) => !(r in MATRIX))).toEqual([]);
    expect(Object.keys(MATRIX).filter((r) => !routes.includes(r))).toEqual([]);
  });

  describe.each(Object.entries(MATRIX))('%s', (route, row) => {
    it.each(PERSONAS)('as %s', async (persona) => {
      // A fresh world for every call: some allowed calls delete what the next would need.
      const world = await createStudioWorld();
      const user = userOf(world, persona);
      const { token, hash } = newSecretToken();
      const invitation = await Invitation.create({
        studioId: world.studio.id,
        email: user?.email ?? (await createUser('invitee')).email,
        role: 'tester',
        tokenHash: hash,
        invitedById: world.users.owner.id,
        expiresAt: new Date(Date.now() + 86_400_000),
      });
      const pattern = await Pattern.create({ studioId: world.studio.id, name: 'Trousers', category: 'trousers', fabricKind: 'woven', bodyColumns: ['hip'] });
      const size = await PatternSize.create({ patternId: pattern.id, label: 'M', position: 0, bodyMm: { hip: 1000 } });
      const trial = await Trial.create({
        studioId: world.studio.id,
        patternId: pattern.id,
        slug: `matrix-${token.slice(0, 12).toLowerCase()}`,
        title: 'Matrix trial',
        state: 'open',
        coverage: { sizes: [{ sizeId: size.id, target: 3 }], heightBands: [], variants: [] },
      });
      // Someone else's enrolment, and for a signed-in caller an application of their own in a second open trial.
      const { application: otherApp, enrollment } = await enrolTester(trial.id, world.users.otherTester.id === user?.id ? world.users.tester.id : world.users.otherTester.id, size.id);
      const draft = await Draft.create({ patternId: pattern.id, version: 1, changeNote: 'First', createdById: null });
      const draftFile = await DraftFile.create({ draftId: draft.id, kind: 'print-a4', originalName: 'a4.pdf', objectKey: `drafts/${draft.id}.pdf`, bytes: 10 });
      const photo = await Photo.create({ enrollmentId: enrollment.id, stage: 'final', view: 'front', consent: 'staff-only', fullKey: `photos/${draft.id}.jpg`, thumbKey: `photos/${draft.id}-t.jpg`, width: 10, height: 10 });
      const message = await OutboxMessage.create({ idempotencyKey: `matrix:${token}`, recipientId: otherApp.userId, recipientEmail: `matrix-${token.slice(0, 8).toLowerCase()}@example.test`, template: 'declined', category: 'trial-news', studioId: world.studio.id, trialId: trial.id, subject: 'Matrix', text: 'Matrix', html: null, status: 'failed', attempts: 5, nextAttemptAt: new Date() });
      let ownApplicationId: string | null = null;
      if (user) {
        const ownTrial = await Trial.create({ studioId: world.studio.id, patternId: pattern.id, slug: `own-${token.slice(0, 12).toLowerCase()}`, title: 'Own', state: 'open', coverage: { sizes: [{ sizeId: size.id, target: 3 }], heightBands: [], variants: [] } });
        ownApplicationId = (
          await Application.create({ trialId: ownTrial.id, userId: user.id, sizeId: size.id, variantId: null, profileSnapshot: {}, adviceSnapshot: null, plannedFabric: 'Linen', experience: 'confident', photoConsent: 'staff-only', appliedAt: new Date() })
        ).id;
      }
      const { path, body } = row.call({
        ...world,
        persona,
        inviteToken: token,
        invitationId: invitation.id,
        patternId: pattern.id,
        sizeId: size.id,
        trialId: trial.id,
        trialSlug: trial.slug,
        enrollmentId: enrollment.id,
        otherApplicationId: otherApp.id,
        draftFileId: draftFile.id,
        photoId: photo.id,
        messageId: message.id,
        ownApplicationId,
      });
      const [method] = route.split(' ');
      let req = request(t.app)[method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete'](path);
      if (user) req = req.set('Authorization', bearer(user, t.config));
      const res = await (body ? req.send(body) : req);

      if (row.allow.includes(persona)) {
        expect({ persona, status: res.status, denied: [401, 403, 404].includes(res.status) }).toMatchObject({ denied: false });
        expect(res.status).toBeLessThan(500);
      } else {
        expect({ persona, status: res.status }).toEqual({ persona, status: expectedDenial(persona, row.hidden) });
        expect(res.body.error.code).toEqual(expect.any(String));
      }
    });
  });
});
