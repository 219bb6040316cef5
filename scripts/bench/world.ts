// Invented trials of any size for the benchmarks, written with multi-row INSERTs (the app's own
// paths would take minutes for 10,000 testers). Every name and address is made up (*.test).
import { randomUUID } from 'node:crypto';
import bcrypt from 'bcryptjs';
import type { Sequelize } from 'sequelize';

/** A small deterministic generator, so every run benchmarks the same data. */
export function prng(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export type BenchWorld = {
  studioId: string;
  trialId: string;
  patternId: string;
  ownerId: string;
  /** Testers with a submitted final report. */
  submitted: string[];
  /** Testers (user ids) with a complete final report saved but not submitted, and their enrolments. */
  ready: { userId: string; enrollmentId: string }[];
};

const SIZES = Array.from({ length: 21 }, (_, i) => String(i * 2));
const IN = 25.4;

async function insert(sequelize: Sequelize, table: string, columns: string[], rows: unknown[][]) {
  for (let at = 0; at < rows.length; at += 500) {
    const chunk = rows.slice(at, at + 500);
    const bind: unknown[] = [];
    const values = chunk.map((row) => `(${row.map((v) => {
      bind.push(v);
      return `$${bind.length}`;
    }).join(', ')})`);
    await sequelize.query(`INSERT INTO ${table} (${columns.join(', ')}) VALUES ${values.join(', ')}`, { bind });
  }
}

let passwordHash: string | undefined;

/**
 * One studio with a running trial of trousers in 21 sizes and `testers` submitted final reports
 * (alterations with a draft-wide back rise, leg length following the tester's inseam, a waist
 * problem in one size, fit ratings and fabric), plus `ready` testers whose complete report waits
 * to be submitted. Returns the ids the benchmarks need.
 */
export async function seedBenchTrial(sequelize: Sequelize, options: { testers: number; ready?: number; label?: string; zones?: string[]; dueAt?: Date }): Promise<BenchWorld> {
  const random = prng(options.testers * 7 + (options.ready ?? 0));
  const now = new Date();
  const tag = `${options.label ?? 'bench'}-${randomUUID().slice(0, 8)}`;
  passwordHash ??= await bcrypt.hash('bench password', 4);
  const studioId = randomUUID();
  const ownerId = randomUUID();
  const patternId = randomUUID();
  const trialId = randomUUID();
  await insert(sequelize, 'studios', ['id', 'name', 'slug', 'time_zone', 'settings', 'created_at', 'updated_at'], [[studioId, `Bench studio ${tag}`, tag, 'Europe/London', '{}', now, now]]);
  const zones = options.zones ?? ['UTC'];
  await insert(sequelize, 'users', ['id', 'email', 'name', 'password_hash', 'time_zone', 'created_at', 'updated_at'], [[ownerId, `owner-${tag}@bench.test`, 'Bench owner', passwordHash, 'Europe/London', now, now]]);
  await insert(sequelize, 'memberships', ['id', 'studio_id', 'user_id', 'role', 'created_at', 'updated_at'], [[randomUUID(), studioId, ownerId, 'owner', now, now]]);
  await insert(sequelize, 'patterns', ['id', 'studio_id', 'name', 'category', 'fabric_kind', 'body_columns', 'created_at', 'updated_at'], [[patternId, studioId, 'Bench trousers', 'trousers', 'woven', JSON.stringify(['waist', 'hip', 'inseam']), now, now]]);
  const sizeIds = SIZES.map(() => randomUUID());
  const chart = SIZES.map((_, i) => ({ waist: (26 + i) * IN, hip: (36 + i) * IN, inseam: 30 * IN }));
  await insert(
    sequelize,
    'pattern_sizes',
    ['id', 'pattern_id', 'label', 'position', 'body_mm', 'created_at', 'updated_at'],
    SIZES.map((label, i) => [sizeIds[i], patternId, label, i, JSON.stringify(chart[i]), now, now]),
  );
  await insert(
    sequelize,
    'trials',
    ['id', 'studio_id', 'pattern_id', 'slug', 'title', 'call_text', 'requirements', 'state', 'coverage', 'created_at', 'updated_at'],
    [[trialId, studioId, patternId, tag, 'Bench trousers trial', 'Sew the bench trousers.', '', 'running', JSON.stringify({ sizes: sizeIds.map((sizeId) => ({ sizeId, target: 1000 })), heightBands: [], variants: [] }), now, now]],
  );
  const due = options.dueAt ?? new Date(now.getTime() + 10 * 86_400_000);
  await insert(sequelize, 'milestones', ['id', 'trial_id', 'kind', 'due_at', 'created_at', 'updated_at'], [[randomUUID(), trialId, 'final-report', due, now, now]]);

  const total = options.testers + (options.ready ?? 0);
  const users: unknown[][] = [];
  const members: unknown[][] = [];
  const applications: unknown[][] = [];
  const enrollments: unknown[][] = [];
  const reports: unknown[][] = [];
  const world: BenchWorld = { studioId, trialId, patternId, ownerId, submitted: [], ready: [] };
  for (let i = 0; i < total; i += 1) {
    const userId = randomUUID();
    const applicationId = randomUUID();
    const enrollmentId = randomUUID();
    const s = Math.floor(random() * SIZES.length);
    const body = { waist: chart[s].waist + (random() - 0.5) * 40, hip: chart[s].hip + (random() - 0.5) * 40, inseam: (28 + random() * 6) * IN };
    const at = new Date(now.getTime() - (total - i) * 1000);
    users.push([userId, `tester-${i}-${tag}@bench.test`, `Tester ${i}`, passwordHash, zones[i % zones.length], at, at]);
    members.push([randomUUID(), studioId, userId, 'tester', at, at]);
    applications.push([applicationId, trialId, userId, 'selected', sizeIds[s], JSON.stringify({ measurementsMm: body }), 'Cotton twill', 'confident', 'staff-only', at, at, at]);
    enrollments.push([enrollmentId, trialId, applicationId, userId, sizeIds[s], 'active', at, at]);
    const alterations: object[] = [];
    if (random() < 0.7) alterations.push({ area: 'rise', kind: 'back-rise', amountMm: 15 + random() * 10, where: 'back', note: 'Added at the back crotch.', otherText: '' });
    const legDelta = body.inseam - chart[s].inseam;
    if (Math.abs(legDelta) > 20) alterations.push({ area: 'leg', kind: 'leg-length', amountMm: Math.round(legDelta), where: 'both', note: 'To my inseam.', otherText: '' });
    if (s === 5 && random() < 0.8) alterations.push({ area: 'waist', kind: 'waist', amountMm: -20, where: 'back', note: 'Took in the waist.', otherText: '' });
    if (random() < 0.15) alterations.push({ area: 'thigh', kind: 'thigh', amountMm: random() < 0.5 ? 10 : -10, where: 'both', note: 'Thigh.', otherText: '' });
    if (random() < 0.1) alterations.push({ area: 'hem', kind: 'hem-length', amountMm: -15, where: 'both', note: 'Hem.', otherText: '' });
    const content = {
      sizeSewn: SIZES[s],
      variantSewn: null,
      draftVersion: 1,
      fit: { waist: Math.round(random() * 2 - 1), rise: -1, leg: 0 },
      alterations,
      fabric: { kind: 'Twill', fibre: 'Cotton', widthMm: 1500, usedMm: 2200 + s * 40 + Math.round(random() * 200), stretchPct: 0, napped: false },
      unclearSteps: random() < 0.05 ? [{ step: '14', problem: 'The fly front order was unclear.' }] : [],
      verdict: 'Sewn and worn; notes above.',
      wouldMakeAgain: true,
    };
    const isReady = i >= options.testers;
    reports.push([randomUUID(), enrollmentId, 'final', JSON.stringify(content), isReady ? null : at, at, at]);
    if (isReady) world.ready.push({ userId, enrollmentId });
    else world.submitted.push(userId);
  }
  await insert(sequelize, 'users', ['id', 'email', 'name', 'password_hash', 'time_zone', 'created_at', 'updated_at'], users);
  await insert(sequelize, 'memberships', ['id', 'studio_id', 'user_id', 'role', 'created_at', 'updated_at'], members);
  await insert(
    sequelize,
    'applications',
    ['id', 'trial_id', 'user_id', 'status', 'size_id', 'profile_snapshot', 'planned_fabric', 'experience', 'photo_consent', 'applied_at', 'created_at', 'updated_at'],
    applications,
  );
  await insert(sequelize, 'enrollments', ['id', 'trial_id', 'application_id', 'user_id', 'size_id', 'status', 'created_at', 'updated_at'], enrollments);
  await insert(sequelize, 'reports', ['id', 'enrollment_id', 'stage', 'content', 'submitted_at', 'created_at', 'updated_at'], reports);
  return world;
}
