import { randomUUID } from 'node:crypto';
import bcrypt from 'bcryptjs';
import { Application, Enrollment, Membership, Studio, User } from '../../db/models';
import { issueSessionToken } from '../../server/auth/session-token';
import type { Config } from '../../server/config';
import type { Role } from '../../server/domain/roles';

export const TEST_PASSWORD = 'correct horse battery';
let hash: Promise<string> | undefined;

export function uniqueEmail(prefix: string): string {
  return `${prefix}-${randomUUID().slice(0, 8)}@example.test`;
}

/** A user with a confirmed address (as every account made through the sign-up link has), unless `verified: false`. */
export async function createUser(prefix = 'user', extra: Partial<{ name: string; email: string; verified: boolean }> = {}): Promise<User> {
  const passwordHash = await (hash ??= bcrypt.hash(TEST_PASSWORD, 4));
  const user = await User.create({
    email: extra.email ?? uniqueEmail(prefix),
    name: extra.name ?? `Test ${prefix}`,
    passwordHash,
    emailVerifiedAt: extra.verified === false ? null : new Date(),
  });
  return (await User.findByPk(user.id))!;
}

export async function createStudio(name = 'Test studio'): Promise<Studio> {
  return Studio.create({ name, slug: `test-${randomUUID()}`, timeZone: 'Europe/Lisbon' });
}

export async function addMember(studio: Studio, user: User, role: Role): Promise<Membership> {
  return Membership.create({ studioId: studio.id, userId: user.id, role });
}

export function bearer(user: User, config: Config): string {
  return `Bearer ${issueSessionToken(user, config.auth)}`;
}

/** Two studios with every role in the first and an owner and a tester in the second. */
export async function createStudioWorld() {
  const studio = await createStudio('Studio here');
  const otherStudio = await createStudio('Studio elsewhere');
  const [owner, coordinator, grader, tester, otherOwner, otherTester] = await Promise.all(
    ['owner', 'coordinator', 'grader', 'tester', 'other-owner', 'other-tester'].map((p) => createUser(p)),
  );
  const memberships = {
    owner: await addMember(studio, owner, 'owner'),
    coordinator: await addMember(studio, coordinator, 'coordinator'),
    grader: await addMember(studio, grader, 'grader'),
    tester: await addMember(studio, tester, 'tester'),
    otherOwner: await addMember(otherStudio, otherOwner, 'owner'),
    otherTester: await addMember(otherStudio, otherTester, 'tester'),
  };
  return { studio, otherStudio, users: { owner, coordinator, grader, tester, otherOwner, otherTester }, memberships };
}
export type StudioWorld = Awaited<ReturnType<typeof createStudioWorld>>;

/**
 * A tester chosen for a trial: their application (status selected) and the enrolment that follows.
 * The profile snapshot carries the measurements the findings compare with the chart.
 */
export async function enrolTester(
  trialId: string,
  userId: string,
  sizeId: string,
  extra: { profileSnapshot?: Record<string, unknown>; plannedFabric?: string; experience?: 'beginner' | 'confident' | 'advanced' } = {},
) {
  const application = await Application.create({
    trialId,
    userId,
    sizeId,
    variantId: null,
    profileSnapshot: extra.profileSnapshot ?? {},
    adviceSnapshot: null,
    plannedFabric: extra.plannedFabric ?? 'Linen',
    experience: extra.experience ?? 'confident',
    photoConsent: 'staff-only',
    appliedAt: new Date(),
    status: 'selected',
  });
  const enrollment = await Enrollment.create({ trialId, applicationId: application.id, userId, sizeId, variantId: null });
  return { application, enrollment };
}
