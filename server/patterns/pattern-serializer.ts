import type { Pattern } from '../../db/models';

/** A pattern as the API returns it: fields, the chart in order, variants and fabric needs. */
export function serializePatternSummary(pattern: Pattern) {
  return {
    id: pattern.id,
    name: pattern.name,
    category: pattern.category,
    childrensWear: pattern.childrensWear,
    fabricKind: pattern.fabricKind,
    minStretchPct: pattern.minStretchPct,
    archived: pattern.archivedAt !== null,
    sizes: (pattern.sizes ?? []).map((s) => s.label),
    updatedAt: pattern.updatedAt,
  };
}

export function serializeChart(pattern: Pattern) {
  return {
    draftedHeightMm: pattern.draftedHeightMm,
    bodyColumns: pattern.bodyColumns,
    finishedColumns: pattern.finishedColumns,
    sizes: (pattern.sizes ?? []).map((s) => ({ id: s.id, label: s.label, bodyMm: s.bodyMm, finishedMm: s.finishedMm })),
    variants: (pattern.variants ?? []).map((v) => ({ id: v.id, name: v.name, kind: v.kind, columns: v.columns, valuesMm: v.valuesMm })),
  };
}

export function serializePattern(pattern: Pattern) {
  return {
    ...serializePatternSummary(pattern),
    notes: pattern.notes,
    chart: serializeChart(pattern),
    fabricNeeds: (pattern.fabricNeeds ?? []).map((n) => ({ sizeId: n.sizeId, widthMm: n.widthMm, napped: n.napped, lengthMm: n.lengthMm })),
  };
}
