import { useCallback, useEffect, useRef, useState } from 'react';
import useSWR from 'swr';
import type { ReportDraft } from '@/server/domain/schemas/reports';
import { api, ApiError } from './api';

export type ReportChoices = { sizes: string[]; chosenSize: string | null; variants: string[]; drafts: { version: number; changeNote: string; createdAt: string }[] };
export type ReportState = { stage: 'check-in' | 'final'; content: ReportDraft; submittedAt: string | null; dueAt: string | null; editable: boolean; choices?: ReportChoices };
export type SaveStatus = { state: 'idle' | 'saving' | 'saved' | 'error'; message?: string; fields?: Record<string, string> };

export const reportKey = (enrollmentId: string, stage: string) => `/api/me/enrollments/${enrollmentId}/reports/${stage}`;

/**
 * A report saved as the tester goes: each change to a part is sent (after a short pause) and the
 * server keeps every part it was sent, so a reload or a lost connection loses nothing already saved.
 */
export function useReport(enrollmentId: string, stage: string) {
  const key = reportKey(enrollmentId, stage);
  const { data, error, mutate } = useSWR<ReportState>(key);
  const [status, setStatus] = useState<SaveStatus>({ state: 'idle' });
  const pending = useRef<Partial<ReportDraft>>({});
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);

  const flush = useCallback(async () => {
    const parts = pending.current;
    pending.current = {};
    if (Object.keys(parts).length === 0) return;
    setStatus({ state: 'saving' });
    try {
      const saved = await api<ReportState>(key, { method: 'PUT', body: parts });
      await mutate(saved, { revalidate: false });
      setStatus({ state: 'saved' });
    } catch (e) {
      // Keep what failed so the next change sends it again.
      pending.current = { ...parts, ...pending.current };
      setStatus({ state: 'error', message: e instanceof Error ? e.message : 'Not saved.', fields: e instanceof ApiError ? e.fields : undefined });
    }
  }, [key, mutate]);

  const change = useCallback(
    (parts: Partial<ReportDraft>) => {
      pending.current = { ...pending.current, ...parts };
      if (timer.current) clearTimeout(timer.current);
      timer.current = setTimeout(() => void flush(), 600);
    },
    [flush],
  );

  useEffect(() => () => {
    if (timer.current) clearTimeout(timer.current);
  }, []);

  const submit = useCallback(async () => {
    if (timer.current) clearTimeout(timer.current);
    await flush();
    const done = await api<ReportState>(`${key}/submit`, { method: 'POST' });
    await mutate(done, { revalidate: false });
    return done;
  }, [flush, key, mutate]);

  return { report: data, error, reload: mutate, change, status, submit, flush };
}
