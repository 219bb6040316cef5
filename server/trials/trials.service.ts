import { Op, type Transaction } from 'sequelize';
import type { z } from 'zod';
import { Application, Enrollment, Membership, Milestone, Pattern, PatternSize, PatternVariant, Studio, Trial, User } from '../../db/models';
import { bestWaitlisted, coverageGrid, proposeSelection, type Applicant, type CoverageTargets } from '../domain/coverage';
import type { createTrialSchema, decideSchema, updateTrialSchema } from '../domain/schemas/trials';
import { formatInZone } from '../domain/time-zones';
import { MILESTONE_KINDS, milestoneOrderProblems, type MilestoneKind } from '../domain/trials';
import type { LengthUnit } from '../domain/units';
import { badRequest, conflict, notFound } from '../errors';
import { removeEnrollmentPhotos } from '../photos/photos.service';

const ZERO_UUID = '00000000-0000-0000-0000-000000000000';

function slugify(title: string): string {
  return (
    title
      .normalize('NFKD')
      .replace(/[\u0300-\u036f]/g, '')
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .slice(0, 70) || 'trial'
  );
}

async function uniqueSlug(title: string, transaction: Transaction): Promise<string> {
  const base = slugify(title);
  for (let n = 1; ; n += 1) {
    const slug = n === 1 ? base : `${base}-${n}`;
    if (!(await Trial.findOne({ where: { slug }, transaction }))) return slug;
  }
}

/**
 * A trial of the studio with its milestones and its pattern's sizes (in order) and variants, in
 * separate small queries: one join of all three multiplies the rows (milestones × sizes × variants).
 */
export async function loadTrial(studioId: string, trialId: string, transaction?: Transaction) {
  const trial = await Trial.findOne({ where: { id: trialId, studioId }, transaction });
  if (!trial) throw notFound('trial');
  // One after another: inside a transaction they share its one connection.
  const milestones = await Milestone.findAll({ where: { trialId: trial.id }, transaction });
  const pattern = await Pattern.findByPk(trial.patternId, { transaction });
  if (pattern) {
    const sizes = await PatternSize.findAll({ where: { patternId: pattern.id }, order: [['position', 'ASC']], transaction });
    const variants = await PatternVariant.findAll({ where: { patternId: pattern.id }, transaction });
    pattern.setDataValue('sizes' as never, sizes as never);
    pattern.setDataValue('variants' as never, variants as never);
    Object.assign(pattern, { sizes, variants });
  }
  trial.setDataValue('milestones' as never, milestones as never);
  trial.setDataValue('pattern' as never, pattern as never);
  Object.assign(trial, { milestones, pattern: pattern ?? undefined });
  return trial;
}

/** Coverage targets and milestones must name sizes and variants of the trial's own pattern. */
function checkAgainstPattern(pattern: Pattern, coverage: z.output<typeof createTrialSchema>['coverage'] | undefined) {
  if (!coverage) return;
  const sizeIds = new Set((pattern.sizes ?? []).map((s) => s.id));
  const variantIds = new Set((pattern.variants ?? []).map((v) => v.id));
  const fields: Record<string, string> = {};
  coverage.sizes.forEach((s, i) => {
    if (!sizeIds.has(s.sizeId)) fields[`coverage.sizes.${i}.sizeId`] = 'is not a size of the pattern';
  });
  coverage.variants.forEach((v, i) => {
    if (!variantIds.has(v)) fields[`coverage.variants.${i}`] = 'is not a variant of the pattern';
  });
  const bands = [...coverage.heightBands];
  bands.forEach((b, i) => {
    if (b.minMm != null && b.maxMm != null && b.minMm >= b.maxMm) fields[`coverage.heightBands.${i}.maxMm`] = 'must be above the band’s lower limit';
  });
  if (Object.keys(fields).length) throw badRequest('The coverage targets do not fit the pattern.', fields);
}

/** The trial's dates after this change, in order, or a 400 naming each date out of order. */
async function checkMilestoneOrder(studioId: string, trialId: string | null, changes: Partial<Record<MilestoneKind, string>>) {
  const current = trialId ? await Milestone.findAll({ where: { trialId } }) : [];
  const dates: Partial<Record<MilestoneKind, Date | string>> = Object.fromEntries(current.map((m) => [m.kind, m.dueAt]));
  Object.assign(dates, changes);
  const zone = (await Studio.findByPk(studioId))?.timeZone ?? 'UTC';
  const problems = milestoneOrderProblems(dates, (at) => formatInZone(at, zone));
  if (Object.keys(problems).length) throw badRequest('The dates are out of order: each must come on or after the one before it.', problems);
}

async function saveMilestones(trialId: string, milestones: Partial<Record<MilestoneKind, string>>, transaction: Transaction) {
  for (const [kind, iso] of Object.entries(milestones)) {
    const existing = await Milestone.findOne({ where: { trialId, kind }, transaction });
    if (existing) await existing.update({ dueAt: new Date(iso) }, { transaction });
    else await Milestone.create({ trialId, kind: kind as MilestoneKind, dueAt: new Date(iso) }, { transaction });
  }
}

export async function createTrial(studioId: string, input: z.output<typeof createTrialSchema>) {
  const pattern = await Pattern.findOne({
    where: { id: input.patternId, studioId },
    include: [
      { model: PatternSize, as: 'sizes' },
      { model: PatternVariant, as: 'variants' },
    ],
  });
  if (!pattern) throw badRequest('Choose one of the studio’s patterns.', { patternId: 'is not a pattern of this studio' });
  checkAgainstPattern(pattern, input.coverage);
  await checkMilestoneOrder(studioId, null, input.milestones);
  const id = await Trial.sequelize!.transaction(async (transaction) => {
    const trial = await Trial.create(
      {
        studioId,
        patternId: pattern.id,
        slug: await uniqueSlug(input.title, transaction),
        title: input.title,
        callText: input.callText,
        requirements: input.requirements,
        coverage: input.coverage,
      },
      { transaction },
    );
    await saveMilestones(trial.id, input.milestones, transaction);
    return trial.id;
  });
  return loadTrial(studioId, id);
}

export async function updateTrial(studioId: string, trialId: string, input: z.output<typeof updateTrialSchema>) {
  const trial = await loadTrial(studioId, trialId);
  checkAgainstPattern(trial.pattern!, input.coverage);
  if (input.state === 'open' && !(trial.coverage.sizes.length || input.coverage?.sizes.length)) {
    throw badRequest('Say which sizes the trial wants before opening the call.', { state: 'set the coverage targets first' });
  }
  if (input.milestones) await checkMilestoneOrder(studioId, trial.id, input.milestones);
  await Trial.sequelize!.transaction(async (transaction) => {
    const { milestones, ...fields } = input;
    await trial.update(fields, { transaction });
    if (milestones) await saveMilestones(trial.id, milestones, transaction);
  });
  return loadTrial(studioId, trialId);
}

export async function listTrials(studioId: string) {
  return Trial.findAll({
    where: { studioId },
    include: [{ model: Pattern, as: 'pattern' }, { model: Milestone, as: 'milestones' }],
    order: [['createdAt', 'DESC']],
  });
}

/** The trial's targets in the form the coverage engine takes, labels from the pattern. */
export function targetsOf(trial: Trial): CoverageTargets {
  const sizes = trial.pattern?.sizes ?? [];
  const variants = trial.pattern?.variants ?? [];
  return {
    sizes: sizes
      .map((s) => ({ id: s.id, label: s.label, target: trial.coverage.sizes.find((c) => c.sizeId === s.id)?.target ?? 0 }))
      .filter((s) => s.target > 0),
    heightBands: trial.coverage.heightBands,
    variants: variants.filter((v) => trial.coverage.variants.includes(v.id)).map((v) => ({ id: v.id, name: v.name })),
  };
}

/** Each applicant with their record in the studio's other trials (for the reliability tie-break). */
export async function applicantsOf(trial: Trial, transaction?: Transaction): Promise<{ applicants: Applicant[]; rows: Application[] }> {
  const rows = await Application.findAll({
    where: { trialId: trial.id },
    include: [{ model: User, as: 'user' }],
    order: [['appliedAt', 'ASC']],
    transaction,
  });
  const past = await Enrollment.findAll({
    where: { userId: { [Op.in]: [...rows.map((r) => r.userId), ZERO_UUID] }, trialId: { [Op.ne]: trial.id } },
    include: [{ model: Trial, as: 'trial', where: { studioId: trial.studioId, state: 'closed' }, required: true }],
    transaction,
  });
  const record = (userId: string) => {
    const mine = past.filter((e) => e.userId === userId);
    // On time = finished; the final-report timestamps that refine this arrive with reports.
    return { enrolled: mine.length, finishedOnTime: mine.filter((e) => e.status === 'finished').length };
  };
  return {
    rows,
    applicants: rows.map((r) => ({
      id: r.id,
      appliedAt: r.appliedAt.toISOString(),
      status: r.status,
      sizeId: r.sizeId,
      variantId: r.variantId,
      heightMm: typeof (r.profileSnapshot.measurementsMm as Record<string, number> | undefined)?.height === 'number'
        ? (r.profileSnapshot.measurementsMm as Record<string, number>).height
        : null,
      reliability: record(r.userId),
    })),
  };
}

export async function coverageOf(trial: Trial, unit: LengthUnit) {
  const { applicants } = await applicantsOf(trial);
  return coverageGrid(targetsOf(trial), applicants, { unit });
}

export async function proposalFor(trial: Trial, unit: LengthUnit) {
  const { applicants } = await applicantsOf(trial);
  return proposeSelection(targetsOf(trial), applicants, { unit });
}

/**
 * A selected applicant's enrolment: created, or made active again when an earlier decision had
 * dropped it (selected, declined, then selected again). A selected tester belongs to the studio's
 * testers from then on.
 */
async function enrol(app: Application, transaction: Transaction) {
  const trial = (await Trial.findByPk(app.trialId, { transaction }))!;
  const [enrollment, created] = await Enrollment.findOrCreate({
    where: { applicationId: app.id },
    defaults: { trialId: trial.id, applicationId: app.id, userId: app.userId, sizeId: app.sizeId!, variantId: app.variantId, status: 'active' },
    transaction,
  });
  if (!created && enrollment.status === 'dropped') {
    await enrollment.update({ status: 'active', sizeId: app.sizeId!, variantId: app.variantId }, { transaction });
  }
  await Membership.findOrCreate({ where: { studioId: trial.studioId, userId: app.userId }, defaults: { studioId: trial.studioId, userId: app.userId, role: 'tester' }, transaction });
}

/**
 * A tester who is no longer in any of the studio's trials (declined after selection, or withdrawn)
 * stops being one of its members. Staff roles are kept: they were given by invitation, not by a
 * selection.
 */
export async function releaseTesterMembership(studioId: string, userId: string, transaction: Transaction) {
  const stillIn = await Enrollment.count({
    where: { userId, status: { [Op.in]: ['active', 'finished'] } },
    include: [{ model: Trial, as: 'trial', where: { studioId }, required: true }],
    transaction,
  });
  if (stillIn === 0) await Membership.destroy({ where: { studioId, userId, role: 'tester' }, transaction });
}

export type DecisionEffects = { selected: Application[]; waitlisted: Application[]; declined: Application[] };

/**
 * Applies one decision to several applications. The trial row is locked for the whole
 * transaction, so two coordinators selecting at once are serialised and a size's target is
 * never exceeded: a selection that would pass it is refused naming the size.
 */
export async function decide(studioId: string, trialId: string, input: z.output<typeof decideSchema>): Promise<DecisionEffects> {
  return Trial.sequelize!.transaction(async (transaction) => {
    await Trial.findOne({ where: { id: trialId, studioId }, lock: transaction.LOCK.UPDATE, transaction });
    const trial = await loadTrial(studioId, trialId, transaction);
    const apps = await Application.findAll({ where: { trialId, id: { [Op.in]: input.applicationIds } }, transaction });
    if (apps.length !== new Set(input.applicationIds).size) throw notFound('application');
    const withdrawn = apps.find((a) => a.status === 'withdrawn');
    if (withdrawn) throw conflict('A withdrawn application cannot be decided on.', { applicationIds: 'includes a withdrawn application' });

    const effects: DecisionEffects = { selected: [], waitlisted: [], declined: [] };
    if (input.status === 'selected') {
      const targets = targetsOf(trial);
      const fields: Record<string, string> = {};
      for (const size of targets.sizes) {
        const already = await Application.count({ where: { trialId, sizeId: size.id, status: 'selected' }, transaction });
        const adding = apps.filter((a) => a.sizeId === size.id && a.status !== 'selected').length;
        if (already + adding > size.target) fields[`size ${size.label}`] = `has ${already} of ${size.target} places taken; ${adding} more do not fit`;
      }
      const unwanted = apps.filter((a) => !a.sizeId || !targets.sizes.some((s) => s.id === a.sizeId));
      if (unwanted.length) fields.applicationIds = 'includes applicants whose size this trial does not want';
      if (Object.keys(fields).length) throw conflict('That selection would go past the places the trial has.', fields);
    }
    for (const app of apps) {
      const was = app.status;
      if (was === input.status) continue;
      await app.update({ status: input.status, decidedAt: new Date() }, { transaction });
      if (input.status === 'selected') {
        await enrol(app, transaction);
        effects.selected.push(app);
      } else {
        if (was === 'selected') {
          await Enrollment.update({ status: 'dropped' }, { where: { applicationId: app.id }, transaction });
          await releaseTesterMembership(studioId, app.userId, transaction);
        }
        if (input.status === 'waitlisted') effects.waitlisted.push(app);
        if (input.status === 'declined') effects.declined.push(app);
      }
    }
    return effects;
  });
}

/**
 * A tester withdraws. A selected tester's seat is freed and offered to the best waitlisted
 * applicant of the same size (and height band where possible), who is selected in their place.
 */
export async function withdraw(user: User, applicationId: string) {
  return Trial.sequelize!.transaction(async (transaction) => {
    const app = await Application.findOne({ where: { id: applicationId, userId: user.id }, transaction });
    if (!app) throw notFound('application');
    await Trial.findByPk(app.trialId, { lock: transaction.LOCK.UPDATE, transaction });
    if (app.status === 'withdrawn') return { application: app, offered: null as Application | null, offerReason: null as string | null };
    const wasSelected = app.status === 'selected';
    await app.update({ status: 'withdrawn', decidedAt: new Date() }, { transaction });
    await Enrollment.update({ status: 'dropped' }, { where: { applicationId: app.id }, transaction });
    // The tester takes their photos with them, in this same transaction (objects removed after it).
    const enrollment = await Enrollment.findOne({ where: { applicationId: app.id }, transaction });
    if (enrollment) await removeEnrollmentPhotos(enrollment.id, transaction);
    await releaseTesterMembership((await Trial.findByPk(app.trialId, { transaction }))!.studioId, app.userId, transaction);
    if (!wasSelected || !app.sizeId) return { application: app, offered: null, offerReason: null };

    const trial = (await Trial.findByPk(app.trialId, { transaction }))!;
    const full = await loadTrial(trial.studioId, trial.id, transaction);
    const { applicants, rows } = await applicantsOf(full, transaction);
    const mine = applicants.find((a) => a.id === app.id);
    const targets = targetsOf(full);
    const band = mine?.heightMm != null ? targets.heightBands.find((b) => (b.minMm == null || mine.heightMm! >= b.minMm) && (b.maxMm == null || mine.heightMm! < b.maxMm)) : undefined;
    const offer = bestWaitlisted(targets, applicants, app.sizeId, band?.id ?? null);
    if (!offer) return { application: app, offered: null, offerReason: null };
    const next = rows.find((r) => r.id === offer.applicantId)!;
    await next.update({ status: 'selected', decidedAt: new Date(), decisionReason: offer.reason.slice(0, 500) }, { transaction });
    await enrol(next, transaction);
    return { application: app, offered: next, offerReason: offer.reason };
  });
}

export async function studioOf(trial: Trial) {
  return (await Studio.findByPk(trial.studioId))!;
}

export function milestoneMap(trial: Trial): Partial<Record<MilestoneKind, Date>> {
  const map: Partial<Record<MilestoneKind, Date>> = {};
  for (const m of trial.milestones ?? []) map[m.kind] = m.dueAt;
  return map;
}

export function orderedMilestones(trial: Trial) {
  const map = milestoneMap(trial);
  return MILESTONE_KINDS.flatMap((kind) => (map[kind] ? [{ kind, dueAt: map[kind]! }] : []));
}
