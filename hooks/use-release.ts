import useSWR, { mutate } from 'swr';
import type { ChecklistItem, ChecklistKey } from '@/server/domain/release';
import type { AnnouncementInput, CopyTrialInput } from '@/server/domain/schemas/release';
import { api } from './api';
import { trialKeys, type TrialDetail } from './use-trials';

export type ReleaseStatus = {
  trial: { id: string; title: string; state: string; patternId: string; patternName: string };
  released: { at: string; by: string | null; openItems: { key: ChecklistKey; title: string; detail: string }[] } | null;
  checklist: ChecklistItem[];
  ready: boolean;
  finalDraftId: string | null;
  coverageGapNote: string | null;
  drafts: { id: string; version: number; changeNote: string; createdAt: string; files: number }[];
  coverage: { sizeId: string; size: string; target: number; enrolled: number; finished: number }[];
  testers: { enrollmentId: string; name: string; size: string; status: 'active' | 'finished' | 'dropped'; excused: boolean; excuseNote: string | null }[];
  rewardCodes: { total: number; assigned: number; unassigned: number };
};

export type ReleaseResult = ReleaseStatus & { mail: { thanks: number; closing: number; codes: { assigned: number; sent: number; missing: number } } };

export type TrialSummary = {
  trial: {
    id: string;
    title: string;
    slug: string;
    state: string;
    releasedAt: string | null;
    studioName: string;
    pattern: { id: string; name: string };
    milestones: { kind: string; label: string; dueAt: string }[];
    photosRemovedAt: string | null;
  };
  coverage: { sizes: ReleaseStatus['coverage']; target: number; enrolled: number; finished: number; gapNote: string | null };
  reports: { enrolled: number; stages: { stage: string; label: string; submitted: number; onTime: number; late: number; expected: number }[] };
  findings: {
    drafts: {
      draft: string;
      testers: number;
      others: number;
      findings: { name: string; kind: string; direction: string; class: string; classLabel: string; count: number; testers: number; rate: number; sizes: string[]; triageLabel: string }[];
    }[];
    latestDraft: string | null;
    changes: { finding: string; class: string; size: string; change: string; changeMm: number | null; range: string | null; basis: string; note: string }[];
  };
  drafts: { id: string; version: number; changeNote: string; createdAt: string; final: boolean; files: { kind: string; name: string; bytes: number }[] }[];
  photos: { id: string; size: string; stage: string; view: string; width: number; height: number; thumbUrl: string | null }[];
};

export type RewardCodeList = {
  released: boolean;
  finishers: number;
  total: number;
  assigned: number;
  unassigned: number;
  codes: { id: string; code: string; tester: string | null; assignedAt: string | null; mail: { status: string; sentAt: string | null } | null }[];
};

export type AnnouncementRow = {
  id: string;
  subject: string;
  body: string;
  audience: { statuses: string[]; sizeIds: string[] };
  replyTo: string | null;
  author: string | null;
  createdAt: string;
  recipients: number;
  mail: { sent: number; skipped: number; waiting: number; failed: number };
};

export type PoolPerson = {
  userId: string;
  name: string;
  email: string;
  sizes: string[];
  variants: string[];
  heightBand: { id: string; label: string } | null;
  trials: { trialId: string; title: string; size: string; status: string; finished: boolean }[];
  trialsFinished: number;
  reports: { onTime: number; late: number; missed: number };
  allOnTime: boolean;
  lastTrialAt: string | null;
  invitedTo: { trialId: string; title: string; sentAt: string | null }[];
};
export type PoolFilter = { size?: string; band?: string; variant?: string; minFinished?: number; onTime?: boolean };

const trialBase = (studioId: string, trialId: string) => `/api/studios/${studioId}/trials/${trialId}`;

export const releaseKeys = {
  status: (studioId: string, trialId: string) => `${trialBase(studioId, trialId)}/release`,
  summary: (studioId: string, trialId: string) => `${trialBase(studioId, trialId)}/summary`,
  summaryPdf: (studioId: string, trialId: string) => `${trialBase(studioId, trialId)}/summary.pdf`,
  summaryCsv: (studioId: string, trialId: string, table: string) => `${trialBase(studioId, trialId)}/summary/${table}.csv`,
  rewardCodes: (studioId: string, trialId: string) => `${trialBase(studioId, trialId)}/reward-codes`,
  announcements: (studioId: string, trialId: string) => `${trialBase(studioId, trialId)}/announcements`,
  pool: (studioId: string, filter: PoolFilter = {}) => {
    const q = new URLSearchParams();
    if (filter.size) q.set('size', filter.size);
    if (filter.band) q.set('band', filter.band);
    if (filter.variant) q.set('variant', filter.variant);
    if (filter.minFinished) q.set('minFinished', String(filter.minFinished));
    if (filter.onTime) q.set('onTime', 'true');
    const s = q.toString();
    return `/api/studios/${studioId}/pool${s ? `?${s}` : ''}`;
  },
  poolCalls: (studioId: string) => `/api/studios/${studioId}/pool/calls`,
};

export const useReleaseStatus = (studioId?: string | null, trialId?: string) => useSWR<ReleaseStatus>(studioId && trialId ? releaseKeys.status(studioId, trialId) : null);
export const useTrialSummary = (studioId?: string | null, trialId?: string) => useSWR<TrialSummary>(studioId && trialId ? releaseKeys.summary(studioId, trialId) : null);
export const useRewardCodes = (studioId?: string | null, trialId?: string, enabled = true) =>
  useSWR<RewardCodeList>(enabled && studioId && trialId ? releaseKeys.rewardCodes(studioId, trialId) : null);
export const useAnnouncements = (studioId?: string | null, trialId?: string) => useSWR<AnnouncementRow[]>(studioId && trialId ? releaseKeys.announcements(studioId, trialId) : null);
export const usePool = (studioId?: string | null, filter: PoolFilter = {}) => useSWR<PoolPerson[]>(studioId ? releaseKeys.pool(studioId, filter) : null);
export const usePoolCalls = (studioId?: string | null) => useSWR<{ id: string; title: string; state: string }[]>(studioId ? releaseKeys.poolCalls(studioId) : null);

async function refreshRelease(studioId: string, trialId: string, status?: ReleaseStatus) {
  // Passing undefined as the data would empty the cache (and blank the screen) until it reloads.
  if (status) await mutate(releaseKeys.status(studioId, trialId), status, { revalidate: false });
  else await mutate(releaseKeys.status(studioId, trialId));
  await mutate(releaseKeys.summary(studioId, trialId));
  await mutate(releaseKeys.rewardCodes(studioId, trialId));
}

export async function saveReleaseSettings(studioId: string, trialId: string, body: { finalDraftId?: string | null; coverageGapNote?: string | null }) {
  const status = await api<ReleaseStatus>(releaseKeys.status(studioId, trialId), { method: 'PATCH', body });
  await refreshRelease(studioId, trialId, status);
  return status;
}

export async function excuseTester(studioId: string, trialId: string, enrollmentId: string, excused: boolean, note: string | null) {
  await api(`${trialBase(studioId, trialId)}/enrollments/${enrollmentId}/excuse`, { method: 'PATCH', body: { excused, note } });
  await refreshRelease(studioId, trialId);
  await mutate(trialKeys.enrollments(studioId, trialId));
}

export async function releaseTrial(studioId: string, trialId: string, confirmOpenItems: ChecklistKey[]) {
  const result = await api<ReleaseResult>(releaseKeys.status(studioId, trialId), { method: 'POST', body: { confirmOpenItems } });
  await refreshRelease(studioId, trialId, result);
  await mutate(trialKeys.one(studioId, trialId));
  await mutate(trialKeys.list(studioId));
  return result;
}

export async function importRewardCodes(studioId: string, trialId: string, csv: string) {
  const res = await api<{ added: number; total: number; assigned: number; unassigned: number }>(releaseKeys.rewardCodes(studioId, trialId), { method: 'POST', body: { csv } });
  await refreshRelease(studioId, trialId);
  return res;
}

export async function sendRewardCodes(studioId: string, trialId: string) {
  const res = await api<RewardCodeList & { delivery: { assigned: number; sent: number; missing: number } }>(`${releaseKeys.rewardCodes(studioId, trialId)}/send`, { method: 'POST' });
  await mutate(releaseKeys.rewardCodes(studioId, trialId), res, { revalidate: false });
  await mutate(releaseKeys.status(studioId, trialId));
  return res;
}

export async function sendAnnouncement(studioId: string, trialId: string, body: AnnouncementInput) {
  const row = await api<AnnouncementRow>(releaseKeys.announcements(studioId, trialId), { method: 'POST', body });
  await mutate(releaseKeys.announcements(studioId, trialId));
  return row;
}

export async function copyTrial(studioId: string, trialId: string, body: CopyTrialInput) {
  const res = await api<{ trial: TrialDetail; invitationsWaiting: number }>(`${trialBase(studioId, trialId)}/copy`, { method: 'POST', body });
  await mutate(trialKeys.list(studioId));
  return res;
}

export async function inviteFromPool(studioId: string, trialId: string, userIds: string[]) {
  const res = await api<{ invited: number; alreadyInvited: number; alreadyApplied: number; sent: number; waitingForCall: number }>(`/api/studios/${studioId}/pool/invitations`, {
    method: 'POST',
    body: { trialId, userIds },
  });
  // Every filtered view of the pool shows who was invited where.
  await mutate((key) => typeof key === 'string' && key.startsWith(`/api/studios/${studioId}/pool`));
  return res;
}
