import type { Transaction } from 'sequelize';
import { Membership, Studio, User } from '../../db/models';
import type { z } from 'zod';
import type { createStudioSchema, updateStudioSchema } from '../domain/schemas/studios';
import { STAFF_ROLES } from '../domain/roles';
import { mergeAnalysisSettings } from '../domain/studio-settings';
import { notFound } from '../errors';
import { serializeStudio, serializeUser } from '../serializers';

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

export async function deleteStudio(studioId: string): Promise<void> {
  await Studio.destroy({ where: { id: studioId } });
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
