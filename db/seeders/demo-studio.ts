import bcrypt from 'bcryptjs';
import dayjs from 'dayjs';
import timezone from 'dayjs/plugin/timezone';
import utc from 'dayjs/plugin/utc';
import type { Sequelize, Transaction } from 'sequelize';
import type { Role } from '../../server/domain/roles';
import { proposeSelection } from '../../server/domain/coverage';
import type { MeasurementKey } from '../../server/domain/measurements';
import { adviseSize } from '../../server/domain/size-advice';
import { Application, Enrollment, FabricNeed, Membership, Milestone, Pattern, PatternSize, PatternVariant, Studio, TesterProfile, Trial, User } from '../models';
import { seedDemoReleasedTrial } from './demo-release';
import { seedDemoReports } from './demo-reports';

dayjs.extend(utc);
dayjs.extend(timezone);

/**
 * The demo studio: an invented small pattern brand with its staff and a few volunteer testers.
 * Every name and address is made up; `.test` is a domain reserved for testing (RFC 2606).
 */
export const DEMO_STUDIO = { name: 'Tern & Thimble (demo)', slug: 'tern-and-thimble', timeZone: 'Europe/Lisbon' };
export const DEMO_PASSWORD = 'basted-demo';
export const DEMO_ACCOUNTS: { email: string; name: string; role: Role }[] = [
  { email: 'designer@demo.basted.test', name: 'Demo Designer', role: 'owner' },
  { email: 'coordinator@demo.basted.test', name: 'Demo Coordinator', role: 'coordinator' },
  { email: 'grader@demo.basted.test', name: 'Demo Grader', role: 'grader' },
  { email: 'tester1@demo.basted.test', name: 'Demo Tester One', role: 'tester' },
  { email: 'tester2@demo.basted.test', name: 'Demo Tester Two', role: 'tester' },
  { email: 'tester3@demo.basted.test', name: 'Demo Tester Three', role: 'tester' },
];

const IN = 25.4; // mm per inch, exact
const YD = 914.4; // mm per yard, exact
// Invented chart of the demo trousers, in inches: a progressive grade (1 in steps to size 8,
// 1 1/2 in to 16, then 2 in), the inseam ungraded (height is handled by leg advice).
const DEMO_SIZES = ['0', '2', '4', '6', '8', '10', '12', '14', '16', '18', '20'];
const DEMO_HIP = [34, 35, 36, 37, 38, 39.5, 41, 42.5, 44, 46, 48];
/** Where the invented applicants live, so reminders go out on several mornings. */
const APPLICANT_ZONES = ['Europe/Lisbon', 'Europe/Berlin', 'America/New_York', 'America/Los_Angeles', 'Australia/Melbourne', 'Pacific/Auckland'];
export const DEMO_PATTERN_NAME = 'Wide-leg trousers (demo)';

async function seedDemoPattern(studio: Studio, transaction: Transaction) {
  const existing = await Pattern.findOne({ where: { studioId: studio.id, name: DEMO_PATTERN_NAME }, transaction });
  if (existing) return;
  const pattern = await Pattern.create(
    {
      studioId: studio.id,
      name: DEMO_PATTERN_NAME,
      category: 'trousers',
      fabricKind: 'woven',
      notes: 'High-waisted, wide leg, side-seam pockets, fly front. Drafted in size 10 for a height of 5 ft 6 in.',
      draftedHeightMm: 66 * IN,
      bodyColumns: ['waist', 'hip', 'thigh', 'inseam'],
      finishedColumns: ['waist', 'hip', 'thigh', 'inseam'],
    },
    { transaction },
  );
  const sizes = [];
  for (const [position, label] of DEMO_SIZES.entries()) {
    const hip = DEMO_HIP[position];
    const thigh = Math.round(hip * 0.58 * 8) / 8;
    sizes.push(
      await PatternSize.create(
        {
          patternId: pattern.id,
          label,
          position,
          bodyMm: { waist: (hip - 10) * IN, hip: hip * IN, thigh: thigh * IN, inseam: 30 * IN },
          finishedMm: { waist: (hip - 9) * IN, hip: (hip + 2) * IN, thigh: (thigh + 2.5) * IN, inseam: 31 * IN },
        },
        { transaction },
      ),
    );
  }
  await PatternVariant.create(
    {
      patternId: pattern.id,
      name: 'Fuller belly front',
      kind: 'fuller-belly',
      position: 0,
      columns: ['waist'],
      valuesMm: Object.fromEntries(sizes.slice(5).map((s, i) => [s.id, { waist: (DEMO_HIP[i + 5] - 8.5) * IN }])),
    },
    { transaction },
  );
  const needs = sizes.flatMap((s, i) => [
    { widthMm: 45 * IN, napped: false, lengthMm: (2.5 + i * 0.125) * YD },
    { widthMm: 45 * IN, napped: true, lengthMm: (2.875 + i * 0.125) * YD },
    { widthMm: 60 * IN, napped: false, lengthMm: (2 + i * 0.125) * YD },
  ].map((n) => ({ ...n, patternId: pattern.id, sizeId: s.id })));
  await FabricNeed.bulkCreate(needs, { transaction });
}

export const DEMO_TRIAL_SLUG = 'wide-leg-trousers-demo';
const APPLICANTS = 40;
/** Testers wanted per size: two, and a third in the drafted size 10 (the sample size). */
const targetOf = (label: string) => (label === '10' ? 3 : 2);

/**
 * The demo trial of the demo trousers: forty invented applicants spread over the size range and
 * heights (a deterministic spread, no randomness), two testers wanted per size (three in size 10), and the automatic
 * selection's picks selected. Dates are set relative to the moment the demo is first loaded.
 */
async function seedDemoTrial(studio: Studio, passwordHash: string, transaction: Transaction) {
  if (await Trial.findOne({ where: { slug: DEMO_TRIAL_SLUG }, transaction })) return;
  const pattern = (await Pattern.findOne({
    where: { studioId: studio.id, name: DEMO_PATTERN_NAME },
    include: [{ model: PatternSize, as: 'sizes' }, { model: PatternVariant, as: 'variants' }],
    order: [[{ model: PatternSize, as: 'sizes' }, 'position', 'ASC']],
    transaction,
  }))!;
  const sizes = pattern.sizes!;
  const day = 86_400_000;
  const now = Date.now();
  const trial = await Trial.create(
    {
      studioId: studio.id,
      patternId: pattern.id,
      slug: DEMO_TRIAL_SLUG,
      title: 'Wide-leg trousers: first fit round (demo)',
      callText: 'We are testing our high-waisted wide-leg trousers in sizes 0 to 20 and would love testers of every height.',
      requirements: 'A mid-weight woven with drape (linen, viscose twill, tencel). Photos front, side and back of the toile and the finished pair.',
      state: 'running',
      coverage: {
        sizes: sizes.map((s) => ({ sizeId: s.id, target: targetOf(s.label) })),
        heightBands: [
          { id: 'petite', label: 'Petite', minMm: null, maxMm: 1600 },
          { id: 'regular', label: 'Regular', minMm: 1600, maxMm: 1720 },
          { id: 'tall', label: 'Tall', minMm: 1720, maxMm: null },
        ],
        variants: (pattern.variants ?? []).map((v) => v.id),
      },
    },
    { transaction },
  );
  // Days from the moment of seeding. The final report is due tomorrow, so the reminders have
  // something to remind of.
  const dates: [string, number][] = [
    ['applications-close', -14],
    ['selection', -12],
    ['drafts-out', -10],
    ['toile-check-in', -4],
    ['final-report', 1],
    ['release', 30],
  ];
  for (const [kind, offset] of dates) {
    // The final report is due at 8 in the evening, studio time, of the day after loading: each
    // tester's reminders then fall on their own mornings (testers live in several zones).
    const dueAt = kind === 'final-report' ? dayjs(now).tz(DEMO_STUDIO.timeZone).add(1, 'day').hour(20).minute(0).second(0).millisecond(0).toDate() : new Date(now + offset * day);
    await Milestone.create({ trialId: trial.id, kind: kind as never, dueAt }, { transaction });
  }
  const chart = {
    sizes: sizes.map((s) => ({ id: s.id, label: s.label, bodyMm: s.bodyMm as Partial<Record<MeasurementKey, number>> })),
    draftedHeightMm: pattern.draftedHeightMm,
    variants: [],
  };
  const applicants = [];
  for (let i = 0; i < APPLICANTS; i += 1) {
    const n = String(i + 1).padStart(2, '0');
    // Hips from 33 to 49 in, heights from 150 to 186 cm, interleaved so sizes and heights mix.
    const hipIn = 33 + ((i * 7) % 41) * 0.4;
    const heightMm = 1500 + ((i * 13) % 37) * 10;
    const measurementsMm = { hip: hipIn * IN, waist: (hipIn - 9.5 - (i % 3) * 0.5) * IN, height: heightMm, inseam: (heightMm * 0.45) };
    const [user] = await User.findOrCreate({
      where: { email: `applicant${n}@demo.basted.test` },
      defaults: { email: `applicant${n}@demo.basted.test`, name: `Demo Applicant ${n}`, passwordHash, emailVerifiedAt: new Date(), timeZone: APPLICANT_ZONES[i % APPLICANT_ZONES.length] },
      transaction,
    });
    await TesterProfile.findOrCreate({ where: { userId: user.id }, defaults: { userId: user.id, measurementsMm, experience: ['beginner', 'confident', 'advanced'][i % 3] }, transaction });
    const advice = adviseSize({ category: 'trousers', fabricKind: 'woven', chart, body: measurementsMm, settings: { fullerBellyMarginMm: 25.4 }, unit: 'in' });
    const app = await Application.create(
      {
        trialId: trial.id,
        userId: user.id,
        sizeId: advice.size?.id ?? null,
        variantId: null,
        profileSnapshot: { name: user.name, email: user.email, measurementsMm },
        adviceSnapshot: advice as unknown as Record<string, unknown>,
        plannedFabric: ['Mid-weight linen', 'Viscose twill', 'Tencel twill', 'Cotton drill'][i % 4],
        experience: ['beginner', 'confident', 'advanced'][i % 3],
        photoConsent: i % 4 === 0 ? 'may-share' : 'staff-only',
        appliedAt: new Date(now - (20 - (i % 5)) * day + i * 60_000),
      },
      { transaction },
    );
    applicants.push({ app, heightMm });
  }
  const proposal = proposeSelection(
    { sizes: sizes.map((s) => ({ id: s.id, label: s.label, target: targetOf(s.label) })), heightBands: trial.coverage.heightBands, variants: [] },
    applicants.map(({ app, heightMm }) => ({
      id: app.id,
      appliedAt: app.appliedAt.toISOString(),
      status: 'applied' as const,
      sizeId: app.sizeId,
      variantId: null,
      heightMm,
      reliability: { finishedOnTime: 0, enrolled: 0 },
    })),
  );
  for (const pick of proposal.picks) {
    const { app } = applicants.find((a) => a.app.id === pick.applicantId)!;
    await app.update({ status: 'selected', decidedAt: new Date(now - 12 * day), decisionReason: pick.reason.slice(0, 500) }, { transaction });
    await Enrollment.create({ trialId: trial.id, applicationId: app.id, userId: app.userId, sizeId: app.sizeId!, variantId: null }, { transaction });
    await Membership.findOrCreate({ where: { studioId: studio.id, userId: app.userId }, defaults: { studioId: studio.id, userId: app.userId, role: 'tester' }, transaction });
  }
  for (const left of proposal.leftOut.filter((l) => l.waitlistRank !== null && l.waitlistRank <= 2)) {
    await applicants.find((a) => a.app.id === left.applicantId)!.app.update({ status: 'waitlisted', decidedAt: new Date(now - 12 * day) }, { transaction });
  }
}

/** Creates whatever of the demo studio is missing; running it again changes nothing. */
export async function seedDemoStudio(sequelize: Sequelize, bcryptCost = 10): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    const [studio] = await Studio.findOrCreate({
      where: { slug: DEMO_STUDIO.slug },
      defaults: DEMO_STUDIO,
      transaction,
    });
    const passwordHash = await bcrypt.hash(DEMO_PASSWORD, bcryptCost);
    for (const account of DEMO_ACCOUNTS) {
      const [user] = await User.findOrCreate({
        where: { email: account.email },
        defaults: { email: account.email, name: account.name, passwordHash, emailVerifiedAt: new Date() },
        transaction,
      });
      await Membership.findOrCreate({
        where: { studioId: studio.id, userId: user.id },
        defaults: { studioId: studio.id, userId: user.id, role: account.role },
        transaction,
      });
    }
    await seedDemoPattern(studio, transaction);
    await seedDemoTrial(studio, passwordHash, transaction);
  });
  await seedDemoReports(sequelize);
  await seedDemoReleasedTrial(sequelize);
}
