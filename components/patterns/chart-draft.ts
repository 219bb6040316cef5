import type { ChartInput } from '@/server/domain/schemas/patterns';
import type { Chart } from '@/hooks/use-patterns';

/**
 * The chart as the editor holds it before saving. Every size and variant has a local key, since a
 * size added in the editor has no id yet; variant values are keyed by that local key.
 */
export type DraftSize = { key: string; id?: string; label: string; bodyMm: Record<string, number | null>; finishedMm: Record<string, number | null> };
export type DraftVariant = {
  key: string;
  id?: string;
  name: string;
  kind: 'fuller-belly' | 'cup' | 'other';
  columns: string[];
  values: Record<string, Record<string, number | null>>;
};
export type ChartDraft = {
  draftedHeightMm: number | null;
  bodyColumns: string[];
  finishedColumns: string[];
  sizes: DraftSize[];
  variants: DraftVariant[];
};

let counter = 0;
export const newKey = () => `new-${(counter += 1)}`;

export function draftFromChart(chart: Chart): ChartDraft {
  return {
    draftedHeightMm: chart.draftedHeightMm,
    bodyColumns: [...chart.bodyColumns],
    finishedColumns: [...chart.finishedColumns],
    sizes: chart.sizes.map((s) => ({ key: s.id, id: s.id, label: s.label, bodyMm: { ...s.bodyMm }, finishedMm: { ...s.finishedMm } })),
    variants: chart.variants.map((v) => ({ key: v.id, id: v.id, name: v.name, kind: v.kind, columns: [...v.columns], values: structuredClone(v.valuesMm) })),
  };
}

const present = (values: Record<string, number | null>, columns: string[]) =>
  Object.fromEntries(Object.entries(values).filter(([k, v]) => v != null && columns.includes(k))) as Record<string, number>;

export function chartInputFromDraft(draft: ChartDraft): ChartInput {
  const refOf = new Map(draft.sizes.map((s) => [s.key, s.id ?? s.label.trim()]));
  return {
    draftedHeightMm: draft.draftedHeightMm,
    bodyColumns: draft.bodyColumns as ChartInput['bodyColumns'],
    finishedColumns: draft.finishedColumns as ChartInput['finishedColumns'],
    sizes: draft.sizes.map((s) => ({
      ...(s.id ? { id: s.id } : {}),
      label: s.label.trim(),
      bodyMm: present(s.bodyMm, draft.bodyColumns),
      finishedMm: present(s.finishedMm, draft.finishedColumns),
    })),
    variants: draft.variants.map((v) => ({
      ...(v.id ? { id: v.id } : {}),
      name: v.name.trim(),
      kind: v.kind,
      columns: v.columns.filter((c) => draft.bodyColumns.includes(c)) as ChartInput['bodyColumns'],
      valuesMm: Object.fromEntries(
        Object.entries(v.values)
          .filter(([sizeKey]) => refOf.has(sizeKey))
          .map(([sizeKey, values]) => [refOf.get(sizeKey)!, present(values, v.columns)]),
      ),
    })),
  };
}

/** The next label after the last: 12 → 14 for even numeric runs, else the last plus one, else "New". */
export function nextSizeLabel(labels: string[]): string {
  const nums = labels.map(Number).filter((n) => Number.isFinite(n));
  if (nums.length >= 2 && nums.length === labels.length) {
    const step = nums[nums.length - 1] - nums[nums.length - 2];
    return String(nums[nums.length - 1] + (step > 0 ? step : 1));
  }
  if (nums.length === labels.length && nums.length === 1) return String(nums[0] + 2);
  let n = labels.length + 1;
  while (labels.includes(`New ${n}`)) n += 1;
  return `New ${n}`;
}

/** A server error path (sizes.2.bodyMm.hip) in words a person recognises (Size 12 · hip). */
export function describeChartPath(path: string, draft: ChartDraft): string {
  const parts = path.split('.');
  if (parts[0] === 'sizes' && parts[1] !== undefined) {
    const size = draft.sizes[Number(parts[1])];
    return [`Size ${size?.label ?? Number(parts[1]) + 1}`, ...parts.slice(2).filter((p) => p !== 'bodyMm' && p !== 'finishedMm')].join(' · ');
  }
  if (parts[0] === 'variants' && parts[1] !== undefined) {
    return [`Variant ${draft.variants[Number(parts[1])]?.name ?? Number(parts[1]) + 1}`, ...parts.slice(2)].join(' · ');
  }
  return path;
}
