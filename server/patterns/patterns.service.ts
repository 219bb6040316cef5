import { Op, type Transaction } from 'sequelize';
import type { z } from 'zod';
import { Enrollment, FabricNeed, Pattern, PatternSize, PatternVariant } from '../../db/models';
import type { chartSchema, createPatternSchema, fabricNeedsSchema, updatePatternSchema } from '../domain/schemas/patterns';
import { nappedBelowPlain } from '../domain/fabric-needs';
import type { FabricUnit, LengthUnit } from '../domain/units';
import { badRequest, conflict, notFound } from '../errors';

export type ChartOutput = z.output<typeof chartSchema>;

const ORDERED_SIZES = [{ model: PatternSize, as: 'sizes' }] as const;

export async function listPatterns(studioId: string, includeArchived: boolean) {
  return Pattern.findAll({
    where: { studioId, ...(includeArchived ? {} : { archivedAt: null }) },
    include: [...ORDERED_SIZES],
    order: [
      ['name', 'ASC'],
      [{ model: PatternSize, as: 'sizes' }, 'position', 'ASC'],
    ],
  });
}

/** The pattern with its chart, variants and fabric needs, in order; 404 when it is not this studio's. */
export async function loadPattern(studioId: string, patternId: string, transaction?: Transaction) {
  const pattern = await Pattern.findOne({
    where: { id: patternId, studioId },
    include: [
      { model: PatternSize, as: 'sizes' },
      { model: PatternVariant, as: 'variants' },
      { model: FabricNeed, as: 'fabricNeeds' },
    ],
    order: [
      [{ model: PatternSize, as: 'sizes' }, 'position', 'ASC'],
      [{ model: PatternVariant, as: 'variants' }, 'position', 'ASC'],
    ],
    transaction,
  });
  if (!pattern) throw notFound('pattern');
  return pattern;
}

export async function createPattern(studioId: string, input: z.output<typeof createPatternSchema>) {
  const pattern = await Pattern.create({ studioId, ...input });
  return loadPattern(studioId, pattern.id);
}

export async function updatePattern(studioId: string, patternId: string, input: z.output<typeof updatePatternSchema>) {
  const pattern = await loadPattern(studioId, patternId);
  const { archived, ...fields } = input;
  const next = { ...fields, ...(archived === undefined ? {} : { archivedAt: archived ? (pattern.archivedAt ?? new Date()) : null }) };
  const fabricKind = next.fabricKind ?? pattern.fabricKind;
  const stretch = next.minStretchPct === undefined ? pattern.minStretchPct : next.minStretchPct;
  if (fabricKind === 'knit' && stretch == null) {
    throw badRequest('A knit pattern needs its minimum stretch.', { minStretchPct: 'A knit pattern needs its minimum stretch in %' });
  }
  await pattern.update(next);
  return loadPattern(studioId, patternId);
}

const present = <T extends Record<string, number | null | undefined>>(values: T) =>
  Object.fromEntries(Object.entries(values).filter(([, v]) => v != null)) as Record<string, number>;

/**
 * Replaces the chart in one transaction. Sizes keep their ids (and so everything that refers to
 * them) across renames and moves; sizes left out are removed with their fabric needs.
 */
export async function saveChart(studioId: string, patternId: string, chart: ChartOutput) {
  return Pattern.sequelize!.transaction(async (transaction) => {
    const pattern = await loadPattern(studioId, patternId, transaction);
    const existing = new Map((pattern.sizes ?? []).map((s) => [s.id, s]));
    for (const [i, size] of chart.sizes.entries()) {
      if (size.id && !existing.has(size.id)) {
        throw badRequest('A size in the chart does not belong to this pattern.', { [`sizes.${i}.id`]: 'is not a size of this pattern' });
      }
    }
    const keptIds = new Set(chart.sizes.flatMap((s) => (s.id ? [s.id] : [])));
    // A size testers are enrolled in stays: their reports refer to it.
    const removed = [...existing.values()].filter((s) => !keptIds.has(s.id));
    if (removed.length) {
      const inUse = await Enrollment.findAll({ where: { sizeId: removed.map((s) => s.id) }, transaction });
      const labels = [...new Set(inUse.map((e) => existing.get(e.sizeId)!.label))];
      if (labels.length) {
        throw conflict(`Testers are enrolled in size ${labels.join(', ')}: keep ${labels.length === 1 ? 'it' : 'them'} in the chart (rename if needed).`, {
          sizes: `size ${labels.join(', ')} has enrolled testers`,
        });
      }
    }
    await PatternSize.destroy({ where: { patternId, id: { [Op.notIn]: [...keptIds, '00000000-0000-0000-0000-000000000000'] } }, transaction });
    // Park the kept sizes on placeholder labels first, so swapping two labels never collides.
    for (const id of keptIds) await existing.get(id)!.update({ label: `~${id.slice(0, 18)}` }, { transaction });

    const refToId = new Map<string, string>();
    for (const [position, size] of chart.sizes.entries()) {
      const values = { label: size.label, position, bodyMm: present(size.bodyMm), finishedMm: present(size.finishedMm) };
      const row = size.id
        ? await existing.get(size.id)!.update(values, { transaction })
        : await PatternSize.create({ patternId, ...values }, { transaction });
      refToId.set(row.id, row.id);
      refToId.set(size.label.toLowerCase(), row.id);
    }

    const oldVariants = new Map((pattern.variants ?? []).map((v) => [v.id, v]));
    const keptVariants = new Set(chart.variants.flatMap((v) => (v.id && oldVariants.has(v.id) ? [v.id] : [])));
    await PatternVariant.destroy({ where: { patternId, id: { [Op.notIn]: [...keptVariants, '00000000-0000-0000-0000-000000000000'] } }, transaction });
    for (const id of keptVariants) await oldVariants.get(id)!.update({ name: `~${id.slice(0, 18)}` }, { transaction });
    for (const [position, variant] of chart.variants.entries()) {
      const valuesMm: Record<string, Record<string, number>> = {};
      for (const [ref, values] of Object.entries(variant.valuesMm)) {
        const sizeId = refToId.get(ref) ?? refToId.get(ref.toLowerCase());
        if (sizeId) valuesMm[sizeId] = present(values);
      }
      const values = { name: variant.name, kind: variant.kind, position, columns: variant.columns, valuesMm };
      if (variant.id && keptVariants.has(variant.id)) await oldVariants.get(variant.id)!.update(values, { transaction });
      else await PatternVariant.create({ patternId, ...values }, { transaction });
    }

    await pattern.update(
      { draftedHeightMm: chart.draftedHeightMm, bodyColumns: chart.bodyColumns, finishedColumns: chart.finishedColumns },
      { transaction },
    );
    return loadPattern(studioId, patternId, transaction);
  });
}

/**
 * Replaces the fabric needs; sizes are named by id or label. A one-way (napped) need below the
 * plain need for the same size and width is refused, naming the cell, and nothing is saved.
 * `units` words the refusal in the caller's units.
 */
export async function saveFabricNeeds(
  studioId: string,
  patternId: string,
  input: z.output<typeof fabricNeedsSchema>,
  units: { lengthUnit: LengthUnit; fabricUnit: FabricUnit } = { lengthUnit: 'cm', fabricUnit: 'm' },
) {
  return Pattern.sequelize!.transaction(async (transaction) => {
    const pattern = await loadPattern(studioId, patternId, transaction);
    const sizes = pattern.sizes ?? [];
    const fields: Record<string, string> = {};
    const seen = new Set<string>();
    const rows = input.needs.map((need, i) => {
      const size = sizes.find((s) => s.id === need.size || s.label.toLowerCase() === need.size.toLowerCase());
      if (!size) fields[`needs.${i}.size`] = `"${need.size}" is not a size of this pattern`;
      const key = `${size?.id}:${Math.round(need.widthMm)}:${need.napped}`;
      if (size && seen.has(key)) fields[`needs.${i}`] = 'this size, width and layout appear twice';
      seen.add(key);
      return { patternId, sizeId: size?.id ?? '', widthMm: need.widthMm, napped: need.napped, lengthMm: need.lengthMm };
    });
    if (!Object.keys(fields).length) {
      const cells = rows.map((r, i) => ({ ...r, sizeKey: r.sizeId, sizeLabel: sizes.find((s) => s.id === r.sizeId)?.label ?? input.needs[i].size }));
      for (const problem of nappedBelowPlain(cells, units)) fields[`needs.${problem.index}.lengthMm`] = problem.message;
    }
    if (Object.keys(fields).length) throw badRequest('Some fabric needs could not be saved; nothing was changed.', fields);
    await FabricNeed.destroy({ where: { patternId }, transaction });
    await FabricNeed.bulkCreate(rows, { transaction });
    return loadPattern(studioId, patternId, transaction);
  });
}
