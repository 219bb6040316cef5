import { useCallback, useEffect, useMemo, useSyncExternalStore } from 'react';
import useSWR, { mutate as mutateKey } from 'swr';
import type { ReportDraft } from '@/server/domain/schemas/reports';
import { api } from './api';
import { deviceStore } from './device-store';
import { ReportSaver, type ReportState } from './report-saver';
import { trialKeys } from './use-trials';

export type { ReportChoices, ReportState, SaveStatus } from './report-saver';

export const reportKey = (enrollmentId: string, stage: string) => `/api/me/enrollments/${enrollmentId}/reports/${stage}`;

// One saver per report for the life of the page: leaving the screen and coming back finds the
// same one, so its saves stay in order and nothing it holds is dropped with the screen.
const savers = new Map<string, ReportSaver>();

function saverFor(key: string): ReportSaver {
  let saver = savers.get(key);
  if (!saver) {
    saver = new ReportSaver({
      send: (body, { keepalive }) => api<ReportState>(key, { method: 'PUT', body, keepalive }),
      submit: (version) => api<ReportState>(`${key}/submit`, { method: 'POST', body: { version } }),
      fetch: () => api<ReportState>(key),
      store: deviceStore,
      storeKey: `basted:unsaved:${key}`,
      onConfirmed: (state) => {
        void mutateKey(key, state, { revalidate: false });
      },
    });
    savers.set(key, saver);
  }
  return saver;
}

// The page being closed, reloaded or hidden, and the connection coming back, concern every
// report open in this page. Registered once, on the web only.
if (typeof window !== 'undefined' && typeof window.addEventListener === 'function' && typeof document !== 'undefined') {
  window.addEventListener('pagehide', () => savers.forEach((s) => s.leave()));
  document.addEventListener('visibilitychange', () => {
    if (document.visibilityState === 'hidden') savers.forEach((s) => void s.flush({ keepalive: true }));
  });
  window.addEventListener('online', () => savers.forEach((s) => s.online()));
}

/**
 * A report saved as the tester goes (see ReportSaver): what the screen shows, the save status as
 * the server gave it, and submit, which goes ahead only once every change is saved.
 */
export function useReport(enrollmentId: string, stage: string) {
  const key = reportKey(enrollmentId, stage);
  const { data, error, mutate } = useSWR<ReportState>(key);
  const saver = useMemo(() => saverFor(key), [key]);
  const view = useSyncExternalStore(saver.subscribe, saver.getView, saver.getView);

  useEffect(() => {
    if (data) saver.load(data);
  }, [data, saver]);
  // Leaving the screen sends what is unsaved at once instead of after the pause.
  useEffect(() => () => void saver.flush(), [saver]);

  const change = useCallback((parts: Partial<ReportDraft>) => saver.change(parts), [saver]);
  const retry = useCallback(() => saver.flush(), [saver]);
  const submit = useCallback(async () => {
    const done = await saver.submit();
    await mutateKey(trialKeys.mine);
    return done;
  }, [saver]);

  return { report: view.report, content: view.content, status: view.status, unsaved: view.unsaved, restored: view.restored, conflict: view.conflict, error, reload: mutate, change, retry, submit };
}
