import useSWR, { mutate } from 'swr';
import { startDownload } from '@/components/patterns/download';
import { api } from './api';

export type DraftRow = {
  id: string;
  version: number;
  changeNote: string;
  createdAt: string;
  files: { id: string; kind: string; name: string; bytes: number; downloadedBy?: { name: string; at: string }[] }[];
};

export const draftKeys = {
  pattern: (studioId: string, patternId: string) => `/api/studios/${studioId}/patterns/${patternId}/drafts`,
  trial: (trialId: string) => `/api/me/trials/${trialId}/drafts`,
};

export const usePatternDrafts = (studioId?: string | null, patternId?: string) =>
  useSWR<DraftRow[]>(studioId && patternId ? draftKeys.pattern(studioId, patternId) : null);
export const useTrialDrafts = (trialId?: string | null) => useSWR<DraftRow[]>(trialId ? draftKeys.trial(trialId) : null);

export async function uploadDraft(studioId: string, patternId: string, form: FormData) {
  const draft = await api<DraftRow>(draftKeys.pattern(studioId, patternId), { method: 'POST', form });
  await mutate(draftKeys.pattern(studioId, patternId));
  return draft;
}

/** Asks for a short-lived link (the server checks access and logs it), then downloads. */
export async function downloadDraftFile(fileId: string) {
  const { url } = await api<{ url: string }>(`/api/draft-files/${fileId}/link`, { method: 'POST' });
  startDownload(url);
}
