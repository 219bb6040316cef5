import { z } from 'zod';
import { FABRIC_KIND_KEYS, FINISHED_MEASUREMENT_KEYS, GARMENT_CATEGORY_KEYS } from '../garments';
import { checkMeasurement, MEASUREMENT_KEYS, type MeasurementKey } from '../measurements';

// At least 0.1 mm: lengths are kept to a tenth of a millimetre, and a vanishing value (5e-324)
// is no length at all — nor can the database's REAL columns hold it.
const mm = z.number({ error: 'must be a length in millimetres' }).min(0.1, 'must be at least 0.1 mm').max(5000, 'must be at most 5 m');

// The fields without defaults: a change (PATCH) must leave out what it does not send, and zod 4's
// .partial() still fills in a field's default, which would erase the saved value.
const patternFields = {
  name: z.string({ error: 'Enter the pattern name' }).trim().min(1, 'Enter the pattern name').max(120, 'Use at most 120 characters'),
  category: z.enum(GARMENT_CATEGORY_KEYS, { error: 'Choose a garment category from the list' }),
  fabricKind: z.enum(FABRIC_KIND_KEYS, { error: 'Choose woven, woven with stretch, or knit' }),
  minStretchPct: z.number().int('Use a whole percentage').min(0).max(200, 'Use at most 200 %').nullable(),
  notes: z.string().trim().max(5000, 'Use at most 5000 characters').nullable(),
  /** Made for children, whatever the category: the children's safety cautions apply. */
  childrensWear: z.boolean({ error: 'must be true or false' }),
};

export const patternFieldsSchema = z.object({
  ...patternFields,
  minStretchPct: patternFields.minStretchPct.default(null),
  notes: patternFields.notes.default(null),
  childrensWear: patternFields.childrensWear.default(false),
});

/** Creating a pattern; a knit must say how much stretch it needs. */
export const createPatternSchema = patternFieldsSchema.superRefine((p, ctx) => {
  if (p.fabricKind === 'knit' && p.minStretchPct == null) {
    ctx.addIssue({ code: 'custom', path: ['minStretchPct'], message: 'A knit pattern needs its minimum stretch in %' });
  }
});
export type CreatePatternInput = z.input<typeof createPatternSchema>;

export const updatePatternSchema = z
  .object(patternFields)
  .partial()
  .extend({ archived: z.boolean({ error: 'must be true or false' }).optional() });

/**
 * A whole size chart, saved at once: the sizes in order (an id keeps a size's identity across a
 * rename or a move), the chosen columns, the drafted height and the variants. Variant values are
 * keyed by size id or, for a size new in this request, by its label.
 */
export const chartSchema = z
  .object({
    draftedHeightMm: mm.nullable(),
    bodyColumns: z.array(z.enum(MEASUREMENT_KEYS, { error: 'is not a body measurement Basted knows' })).max(MEASUREMENT_KEYS.length),
    finishedColumns: z.array(z.enum(FINISHED_MEASUREMENT_KEYS, { error: 'is not a finished measurement Basted knows' })).max(FINISHED_MEASUREMENT_KEYS.length),
    sizes: z
      .array(
        z.object({
          id: z.uuid().optional(),
          label: z.string({ error: 'Enter a size label' }).trim().min(1, 'Enter a size label').max(20, 'Use at most 20 characters'),
          bodyMm: z.partialRecord(z.enum(MEASUREMENT_KEYS), mm.nullable()).default({}),
          finishedMm: z.partialRecord(z.enum(FINISHED_MEASUREMENT_KEYS), mm.nullable()).default({}),
        }),
      )
      .min(1, 'A chart needs at least one size')
      .max(60, 'A chart has at most 60 sizes'),
    variants: z
      .array(
        z.object({
          id: z.uuid().optional(),
          name: z.string({ error: 'Enter the variant name' }).trim().min(1, 'Enter the variant name').max(80),
          kind: z.enum(['fuller-belly', 'cup', 'other'], { error: 'Choose fuller belly, cup or other' }),
          columns: z.array(z.enum(MEASUREMENT_KEYS, { error: 'is not a body measurement Basted knows' })),
          valuesMm: z.record(z.string(), z.partialRecord(z.enum(MEASUREMENT_KEYS), mm.nullable())).default({}),
        }),
      )
      .max(20)
      .default([]),
  })
  .superRefine((chart, ctx) => {
    const labels = new Map<string, number>();
    chart.sizes.forEach((size, i) => {
      const key = size.label.toLowerCase();
      if (labels.has(key)) ctx.addIssue({ code: 'custom', path: ['sizes', i, 'label'], message: `Size "${size.label}" appears twice` });
      labels.set(key, i);
      for (const [k, value] of Object.entries(size.bodyMm)) {
        if (value == null) continue;
        if (!chart.bodyColumns.includes(k as MeasurementKey)) {
          ctx.addIssue({ code: 'custom', path: ['sizes', i, 'bodyMm', k], message: 'is not one of the chart’s columns' });
          continue;
        }
        const problem = checkMeasurement(k as MeasurementKey, value);
        if (problem) ctx.addIssue({ code: 'custom', path: ['sizes', i, 'bodyMm', k], message: problem });
      }
      for (const k of Object.keys(size.finishedMm)) {
        if (size.finishedMm[k as keyof typeof size.finishedMm] != null && !chart.finishedColumns.includes(k as (typeof chart.finishedColumns)[number])) {
          ctx.addIssue({ code: 'custom', path: ['sizes', i, 'finishedMm', k], message: 'is not one of the chart’s finished columns' });
        }
      }
    });
    const sizeRefs = new Set([...chart.sizes.flatMap((s) => (s.id ? [s.id] : [])), ...chart.sizes.map((s) => s.label.toLowerCase())]);
    const names = new Set<string>();
    chart.variants.forEach((variant, v) => {
      if (names.has(variant.name.toLowerCase())) ctx.addIssue({ code: 'custom', path: ['variants', v, 'name'], message: 'Two variants have this name' });
      names.add(variant.name.toLowerCase());
      variant.columns.forEach((c, j) => {
        if (!chart.bodyColumns.includes(c)) ctx.addIssue({ code: 'custom', path: ['variants', v, 'columns', j], message: 'is not one of the chart’s columns' });
      });
      for (const [ref, values] of Object.entries(variant.valuesMm)) {
        if (!sizeRefs.has(ref) && !sizeRefs.has(ref.toLowerCase())) {
          ctx.addIssue({ code: 'custom', path: ['variants', v, 'valuesMm', ref], message: 'is not a size of this chart' });
        }
        for (const k of Object.keys(values)) {
          if (!variant.columns.includes(k as MeasurementKey)) {
            ctx.addIssue({ code: 'custom', path: ['variants', v, 'valuesMm', ref, k], message: 'is not a column this variant overrides' });
          }
        }
      }
    });
  });
export type ChartInput = z.input<typeof chartSchema>;

export const fabricNeedsSchema = z.object({
  needs: z
    .array(
      z.object({
        size: z.string({ error: 'Name the size (its id or label)' }).min(1),
        widthMm: z.number({ error: 'must be a width in millimetres' }).min(300, 'A fabric is at least 30 cm wide').max(4000, 'A fabric is at most 4 m wide'),
        napped: z.boolean({ error: 'must be true or false' }),
        lengthMm: z.number({ error: 'must be a length in millimetres' }).min(1, 'must be at least 1 mm').max(50000, 'must be at most 50 m'),
      }),
    )
    .max(2000),
});
export type FabricNeedsInput = z.input<typeof fabricNeedsSchema>;

export const adviceRequestSchema = z.object({
  measurementsMm: z.partialRecord(z.enum(MEASUREMENT_KEYS, { error: 'is not a body measurement Basted knows' }), mm),
  variantsAllowed: z.boolean().optional(),
});
