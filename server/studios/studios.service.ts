import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { Membership, Studio, User } from '../../db/models';
import type { z } from 'zod';
import type { createStudioSchema, updateStudioSchema } from '../domain/schemas/studios';
import { STAFF_ROLES } from '../domain/roles';
import { mergeAnalysisSettings } from '../domain/studio-settings';
import { notFound } from '../errors';
import { serializeStudio, serializeUser } from '../serializers';
import { purgeSoon, scheduleDeletions } from '../storage/object-deletions';
import type { Storage } from '../storage/storage';

function slugify(name: string): string {
  const base = name
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/&/g, ' and ')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60);
  return base || 'studio';
}

async function uniqueSlug(name: string, transaction: Transaction): Promise<string> {
  const base = slugify(name);
  for (let n = 1; ; n += 1) {
    const slug = n === 1 ? base : `${base}-${n}`;
    if (!(await Studio.findOne({ where: { slug }, transaction }))) return slug;
  }
}

export async function createStudio(user: User, input: z.output<typeof createStudioSchema>): Promise<Studio> {
  return Studio.sequelize!.transaction(async (transaction) => {
    const studio = await Studio.create(
      { name: input.name, timeZone: input.timeZone, slug: await uniqueSlug(input.name, transaction) },
      { transaction },
    );
    await Membership.create({ studioId: studio.id, userId: user.id, role: 'owner' }, { transaction });
    await user.update({ currentStudioId: studio.id }, { transaction });
    return studio;
  });
}

export async function updateStudio(studioId: string, input: z.output<typeof updateStudioSchema>): Promise<Studio> {
  const studio = await Studio.findByPk(studioId);
  if (!studio) throw notFound('studio');
  const { settings, ...fields } = input;
  if (!settings) return studio.update(fields);
  const { analysis, ...plain } = settings;
  const merged = { ...studio.settings, ...plain, ...(analysis ? { analysis: mergeAnalysisSettings(studio.settings, analysis) } : {}) };
  return studio.update({ ...fields, settings: merged });
}

/**
 * Deletes the studio with everything in it. Its stored objects (draft files, testers' photos)
 * are recorded for removal in the same transaction and removed after it, or by the job once a
 * store that is down answers again: nothing is left in the buckets.
 */
export async function deleteStudio(studioId: string, deps: { sequelize: Sequelize; storage: Storage }): Promise<void> {
  await deps.sequelize.transaction(async (transaction) => {
    const photos = await deps.sequelize.query<{ full_key: string; thumb_key: string }>(
      `SELECT p.full_key, p.thumb_key FROM photos p JOIN enrollments e ON e.id = p.enrollment_id JOIN trials t ON t.id = e.trial_id WHERE t.studio_id = $1`,
      { bind: [studioId], type: QueryTypes.SELECT, transaction },
    );
    const files = await deps.sequelize.query<{ object_key: string }>(
      `SELECT f.object_key FROM draft_files f JOIN drafts d ON d.id = f.draft_id JOIN patterns p ON p.id = d.pattern_id WHERE p.studio_id = $1`,
      { bind: [studioId], type: QueryTypes.SELECT, transaction },
    );
    await scheduleDeletions(
      deps.sequelize,
      [
        ...photos.flatMap((p) => [{ bucket: 'photos' as const, key: p.full_key }, { bucket: 'photos' as const, key: p.thumb_key }]),
        ...files.map((f) => ({ bucket: 'drafts' as const, key: f.object_key })),
      ],
      transaction,
    );
    await Studio.destroy({ where: { id: studioId }, transaction });
  });
  await purgeSoon(deps.sequelize, deps.storage);
}

export async function getStudio(studioId: string): Promise<Studio> {
  const studio = await Studio.findByPk(studioId);
  if (!studio) throw notFound('studio');
  return studio;
}

export async function myStudios(user: User) {
  const memberships = await Membership.findAll({
    where: { userId: user.id },
    include: [{ model: Studio, as: 'studio' }],
    order: [[{ model: Studio, as: 'studio' }, 'name', 'ASC']],
  });
  return memberships.map((m) => serializeStudio(m.studio!, m.role));
}

/**
 * What the app needs after sign-in: who you are, your studios with your role in each, and the
 * studio you are working in (the last one you chose, else your first staff studio, else any).
 */
export async function sessionFor(user: User) {
  const studios = await myStudios(user);
  const current =
    studios.find((s) => s.id === user.currentStudioId) ??
    studios.find((s) => s.role && STAFF_ROLES.includes(s.role)) ??
    studios[0] ??
    null;
  return { user: serializeUser(user), studios, currentStudioId: current?.id ?? null };
}

export async function chooseStudio(user: User, studioId: string) {
  const membership = await Membership.findOne({ where: { userId: user.id, studioId } });
  if (!membership) throw notFound('studio');
  await user.update({ currentStudioId: studioId });
  return sessionFor(user);
}
