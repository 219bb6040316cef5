import useSWR, { mutate } from 'swr';
import { startDownload } from '@/components/patterns/download';
import type { DeleteAccountInput } from '@/server/domain/schemas/release';
import { api } from './api';
import { SESSION_KEY } from './use-session';

export type MyRelease = {
  trialId: string;
  trialTitle: string;
  studioName: string;
  releasedAt: string;
  finished: boolean;
  finalDraft: { version: number; changeNote: string; files: { id: string; kind: string; name: string; bytes: number }[] } | null;
  rewardCode: string | null;
};
export type MyAnnouncement = { id: string; trialId: string; trialTitle: string; studioName: string; subject: string; body: string; replyTo: string | null; createdAt: string };

export const myDataKeys = {
  releases: '/api/me/releases',
  announcements: '/api/me/announcements',
  calendar: '/api/me/calendar',
  calendarFile: '/api/me/calendar.ics',
  export: '/api/me/export.zip',
};

export const useMyReleases = () => useSWR<MyRelease[]>(myDataKeys.releases);
export const useMyAnnouncements = () => useSWR<MyAnnouncement[]>(myDataKeys.announcements);
export const useMyCalendar = () => useSWR<{ feedUrl: string | null }>(myDataKeys.calendar);

/** Asks for a short-lived link to a final file (the server checks the person finished), then downloads. */
export async function downloadFinalFile(fileId: string) {
  const { url } = await api<{ url: string }>(`/api/me/final-files/${fileId}/link`, { method: 'POST' });
  startDownload(url);
}

export async function renewCalendarFeed() {
  const res = await api<{ feedUrl: string }>(`${myDataKeys.calendar}/feed`, { method: 'POST' });
  await mutate(myDataKeys.calendar, res, { revalidate: false });
  return res;
}

export async function stopCalendarFeed() {
  await api(`${myDataKeys.calendar}/feed`, { method: 'DELETE' });
  await mutate(myDataKeys.calendar, { feedUrl: null }, { revalidate: false });
}

export async function deleteMyAccount(body: DeleteAccountInput) {
  const res = await api<{ deleted: true; photosRemoved: number; reportsKept: number; notice: string }>('/api/me/account', { method: 'DELETE', body });
  return res;
}

/** After the account is gone: nothing of the person stays cached, and the app is signed out. */
export async function forgetSession() {
  await mutate(() => true, undefined, { revalidate: false });
  await mutate(SESSION_KEY, null, { revalidate: false });
}
