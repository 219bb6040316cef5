import bcrypt from 'bcryptjs';
import type { Sequelize, Transaction } from 'sequelize';
import type { Role } from '../../server/domain/roles';
import { FabricNeed, Membership, Pattern, PatternSize, PatternVariant, Studio, User } from '../models';

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
        defaults: { email: account.email, name: account.name, passwordHash },
        transaction,
      });
      await Membership.findOrCreate({
        where: { studioId: studio.id, userId: user.id },
        defaults: { studioId: studio.id, userId: user.id, role: account.role },
        transaction,
      });
    }
    await seedDemoPattern(studio, transaction);
  });
}
