import useSWR, { mutate } from 'swr';
import type { CoverageGrid, SelectionProposal } from '@/server/domain/coverage';
import type { ApplyInput, CreateTrialInput } from '@/server/domain/schemas/trials';
import type { MilestoneKind } from '@/server/domain/trials';
import { api } from './api';

export type TrialMilestone = { kind: MilestoneKind; label: string; dueAt: string };
export type TrialDetail = {
  id: string;
  slug: string;
  title: string;
  state: 'draft' | 'open' | 'running' | 'closed';
  releasedAt?: string | null;
  copiedFromId?: string | null;
  callText: string;
  requirements: string;
  coverage: {
    sizes: { sizeId: string; target: number }[];
    heightBands: { id: string; label: string; minMm: number | null; maxMm: number | null }[];
    variants: string[];
  };
  pattern: { id: string; name: string; category: string; sizes: { id: string; label: string }[]; variants: { id: string; name: string }[] } | null;
  milestones: TrialMilestone[];
};
export type ApplicationRow = {
  id: string;
  status: 'applied' | 'shortlisted' | 'selected' | 'waitlisted' | 'declined' | 'withdrawn';
  applicant: { name: string; email: string };
  size: { id: string; label: string } | null;
  variantId: string | null;
  measurementsMm: Record<string, number>;
  advisedSize: string | null;
  plannedFabric: string;
  experience: string;
  photoConsent: string;
  note: string | null;
  appliedAt: string;
};
export type PublicCall = {
  slug: string;
  title: string;
  studio: { name: string; timeZone: string };
  pattern: { name: string; category: string; fabricKind: string; minStretchPct: number | null };
  callText: string;
  requirements: string;
  state: string;
  accepting: boolean;
  closesAt: string | null;
  sizes: { id: string; label: string }[];
  variants: { id: string; name: string }[];
  milestones: TrialMilestone[];
};
export type MyTrial = {
  applicationId: string;
  trial: { id: string; slug: string; title: string; state: string; studioName: string; patternId: string; studioId: string; category: string; fabricKind: string | null };
  status: ApplicationRow['status'];
  size: { id: string; label: string } | null;
  enrollment: { id: string; status: 'active' | 'dropped' | 'finished'; submitted: { checkIn: string | null; final: string | null } } | null;
  dues: { kind: MilestoneKind; label: string; dueAt: string; extended: boolean; expects: string }[];
  next: { kind: MilestoneKind; label: string; dueAt: string; extended: boolean; expects: string } | null;
  appliedAt: string;
};

export const trialKeys = {
  list: (studioId: string) => `/api/studios/${studioId}/trials`,
  one: (studioId: string, trialId: string) => `/api/studios/${studioId}/trials/${trialId}`,
  applications: (studioId: string, trialId: string) => `/api/studios/${studioId}/trials/${trialId}/applications`,
  coverage: (studioId: string, trialId: string) => `/api/studios/${studioId}/trials/${trialId}/coverage`,
  enrollments: (studioId: string, trialId: string) => `/api/studios/${studioId}/trials/${trialId}/enrollments`,
  call: (slug: string) => `/api/calls/${encodeURIComponent(slug)}`,
  mine: '/api/me/trials',
};

export const useTrials = (studioId?: string | null) => useSWR<TrialDetail[]>(studioId ? trialKeys.list(studioId) : null);
export const useTrial = (studioId?: string | null, trialId?: string) => useSWR<TrialDetail>(studioId && trialId ? trialKeys.one(studioId, trialId) : null);
export const useApplications = (studioId?: string | null, trialId?: string, enabled = true) =>
  useSWR<ApplicationRow[]>(enabled && studioId && trialId ? trialKeys.applications(studioId, trialId) : null);
export const useCoverage = (studioId?: string | null, trialId?: string, enabled = true) =>
  useSWR<CoverageGrid>(enabled && studioId && trialId ? trialKeys.coverage(studioId, trialId) : null);
export const useCall = (slug?: string) => useSWR<PublicCall>(slug ? trialKeys.call(slug) : null);
export const useMyTrials = () => useSWR<MyTrial[]>(trialKeys.mine);

export async function createTrial(studioId: string, body: CreateTrialInput) {
  const trial = await api<TrialDetail>(trialKeys.list(studioId), { method: 'POST', body });
  await mutate(trialKeys.list(studioId));
  return trial;
}

export async function updateTrial(studioId: string, trialId: string, body: object) {
  const trial = await api<TrialDetail>(trialKeys.one(studioId, trialId), { method: 'PATCH', body });
  await mutate(trialKeys.one(studioId, trialId), trial, { revalidate: false });
  await mutate(trialKeys.list(studioId));
  return trial;
}

export async function proposeSelection(studioId: string, trialId: string) {
  return api<SelectionProposal>(`${trialKeys.one(studioId, trialId)}/selection/proposal`, { method: 'POST' });
}

export async function decide(studioId: string, trialId: string, applicationIds: string[], status: ApplicationRow['status']) {
  const result = await api<{ selected: number; waitlisted: number; declined: number }>(`${trialKeys.one(studioId, trialId)}/decisions`, {
    method: 'POST',
    body: { applicationIds, status },
  });
  await mutate(trialKeys.applications(studioId, trialId));
  await mutate(trialKeys.coverage(studioId, trialId));
  await mutate(trialKeys.enrollments(studioId, trialId));
  return result;
}

export async function applyToCall(slug: string, body: ApplyInput) {
  const res = await api<{ id: string; status: string }>(`${trialKeys.call(slug)}/applications`, { method: 'POST', body });
  await mutate(trialKeys.mine);
  return res;
}

export async function withdrawApplication(applicationId: string) {
  await api(`/api/me/applications/${applicationId}/withdraw`, { method: 'POST' });
  await mutate(trialKeys.mine);
}
