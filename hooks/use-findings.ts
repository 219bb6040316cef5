import { useMemo } from 'react';
import useSWR, { useSWRConfig } from 'swr';
import type { AnalysisOutput, Direction, Finding } from '@/server/analysis/types';
import { api } from './api';
import { trialKeys } from './use-trials';

export type TriageState = 'open' | 'will-fix' | 'personal-fit' | 'fixed';
/** Who changed something: the API may send a name or a small person object. */
export type Person = string | { id?: string; name?: string } | null;
export type FindingTriage = { state: TriageState; fixedInDraft?: number | null; updatedAt?: string | null; updatedBy?: Person };
export type FindingNote = { id: string; author: Person; body: string; createdAt: string };
/** A finding as the API sends it: the engine's numbers plus the studio's triage and notes (optional). */
export type FindingView = Finding & { triage?: FindingTriage | null; notes?: FindingNote[] | null };
export type FindingsResult = Omit<AnalysisOutput, 'findings'> & { findings: FindingView[] };
export type FindingsResponse = {
  input: { testers: number };
  result: FindingsResult | null;
  snapshot?: { draft: string | number; computedAt: string } | null;
  /** Newer reports than these findings count are being counted; the answer is asked again until done. */
  pending?: boolean;
  /** When the findings were last brought up to date with every report. */
  computedAt?: string | null;
};

/** How often a findings answer marked pending is asked again. */
export const PENDING_REFRESH_MS = 2000;
export type FindingsQuery = { draft?: string; compare?: readonly [string, string] };
export type TriageBody = { kind: string; direction: Direction; state: TriageState; fixedInDraft?: number };
export type NoteBody = { kind: string; direction: Direction; body: string };
type FindingUpdate = { triage: FindingTriage; notes: FindingNote[] };

export const findingsKeys = {
  /** Every findings key of a trial starts with this, whatever the query. */
  base: (studioId: string, trialId: string) => `${trialKeys.one(studioId, trialId)}/findings`,
  one(studioId: string, trialId: string, query: FindingsQuery = {}) {
    const params: string[] = [];
    if (query.draft) params.push(`draft=${encodeURIComponent(query.draft)}`);
    if (query.compare) params.push(`compare=${query.compare.map(encodeURIComponent).join(',')}`);
    return `${findingsKeys.base(studioId, trialId)}${params.length ? `?${params.join('&')}` : ''}`;
  },
  triage: (studioId: string, trialId: string) => `${findingsKeys.base(studioId, trialId)}/triage`,
  notes: (studioId: string, trialId: string) => `${findingsKeys.base(studioId, trialId)}/notes`,
};

/** A finding's triage; before any is recorded it is open. */
export function triageOf(f: FindingView): FindingTriage {
  return f.triage ?? { state: 'open', fixedInDraft: null };
}

export function notesOf(f: FindingView): FindingNote[] {
  return f.notes ?? [];
}

export function personName(p: Person | undefined): string | null {
  if (!p) return null;
  return typeof p === 'string' ? p : (p.name ?? null);
}

export function useFindings(studioId: string | null | undefined, trialId: string | undefined, query: FindingsQuery = {}) {
  // Keep the last answer on screen while another draft or comparison loads.
  // While the job queue counts newer reports, ask again until the answer says it is done.
  return useSWR<FindingsResponse>(studioId && trialId ? findingsKeys.one(studioId, trialId, query) : null, {
    keepPreviousData: true,
    refreshInterval: (latest) => (latest?.pending ? PENDING_REFRESH_MS : 0),
  });
}

/**
 * Triage and notes of one finding. Each answer (the finding's new triage and notes) is put into every
 * cached findings answer of the trial, whatever draft or comparison it was asked with. Bound to the
 * SWR cache in use (useSWRConfig), so a screen and its tests see the same data.
 */
export function useFindingActions(studioId: string, trialId: string) {
  const { mutate } = useSWRConfig();
  return useMemo(() => {
    const base = findingsKeys.base(studioId, trialId);
    // Each action takes from the answer only the part it changed: a triage saved and a note added
    // at nearly the same time must not undo each other in the view whatever order the answers come.
    const apply = (who: { kind: string; direction: Direction }, update: Partial<FindingUpdate>) =>
      mutate<FindingsResponse>(
        (key) => typeof key === 'string' && (key === base || key.startsWith(`${base}?`)),
        (data) => {
          if (!data?.result) return data;
          const findings = data.result.findings.map((f) =>
            f.kind === who.kind && f.direction === who.direction ? { ...f, ...update } : f,
          );
          return { ...data, result: { ...data.result, findings } };
        },
        { revalidate: false },
      );
    return {
      async setTriage(body: TriageBody) {
        const update = await api<FindingUpdate>(findingsKeys.triage(studioId, trialId), { method: 'PUT', body });
        await apply(body, { triage: update.triage });
        // The change table follows the triage ("will fix"): fetch the findings again in the background.
        void mutate((key) => typeof key === 'string' && (key === base || key.startsWith(`${base}?`)));
        return update;
      },
      async addNote(body: NoteBody) {
        const update = await api<FindingUpdate>(findingsKeys.notes(studioId, trialId), { method: 'POST', body });
        await apply(body, { notes: update.notes });
        return update;
      },
    };
  }, [studioId, trialId, mutate]);
}
