import useSWR, { mutate } from 'swr';
import type { ChartInput, CreatePatternInput } from '@/server/domain/schemas/patterns';
import { api } from './api';

export type PatternSummary = {
  id: string;
  name: string;
  category: string;
  childrensWear: boolean;
  fabricKind: string;
  minStretchPct: number | null;
  archived: boolean;
  sizes: string[];
  updatedAt: string;
};
export type ChartSize = { id: string; label: string; bodyMm: Record<string, number>; finishedMm: Record<string, number> };
export type ChartVariant = { id: string; name: string; kind: 'fuller-belly' | 'cup' | 'other'; columns: string[]; valuesMm: Record<string, Record<string, number>> };
export type Chart = {
  draftedHeightMm: number | null;
  bodyColumns: string[];
  finishedColumns: string[];
  sizes: ChartSize[];
  variants: ChartVariant[];
};
export type FabricNeedRow = { sizeId: string; widthMm: number; napped: boolean; lengthMm: number };
export type PatternDetail = PatternSummary & { notes: string | null; chart: Chart; fabricNeeds: FabricNeedRow[] };

export const patternKeys = {
  list: (studioId: string) => `/api/studios/${studioId}/patterns`,
  one: (studioId: string, patternId: string) => `/api/studios/${studioId}/patterns/${patternId}`,
};

export function usePatterns(studioId: string | null | undefined) {
  return useSWR<PatternSummary[]>(studioId ? patternKeys.list(studioId) : null);
}

export function usePattern(studioId: string | null | undefined, patternId: string | undefined) {
  return useSWR<PatternDetail>(studioId && patternId ? patternKeys.one(studioId, patternId) : null);
}

async function store(studioId: string, pattern: PatternDetail) {
  await mutate(patternKeys.one(studioId, pattern.id), pattern, { revalidate: false });
  await mutate(patternKeys.list(studioId));
  return pattern;
}

export async function createPattern(studioId: string, body: CreatePatternInput) {
  return store(studioId, await api<PatternDetail>(patternKeys.list(studioId), { method: 'POST', body }));
}

export async function updatePattern(studioId: string, patternId: string, body: Partial<CreatePatternInput> & { archived?: boolean }) {
  return store(studioId, await api<PatternDetail>(patternKeys.one(studioId, patternId), { method: 'PATCH', body }));
}

export async function saveChart(studioId: string, patternId: string, body: ChartInput) {
  return store(studioId, await api<PatternDetail>(`${patternKeys.one(studioId, patternId)}/chart`, { method: 'PUT', body }));
}

export async function saveFabricNeeds(studioId: string, patternId: string, needs: { size: string; widthMm: number; napped: boolean; lengthMm: number }[]) {
  return store(studioId, await api<PatternDetail>(`${patternKeys.one(studioId, patternId)}/fabric-needs`, { method: 'PUT', body: { needs } }));
}

/** Sends CSV text; a file with problems comes back as an ApiError whose fields name row and column. */
export async function importChartCsv(studioId: string, patternId: string, csv: string) {
  const url = `${patternKeys.one(studioId, patternId)}/chart.csv`;
  return store(studioId, await api<PatternDetail>(url, { method: 'POST', text: { content: csv, type: 'text/csv' } }));
}
