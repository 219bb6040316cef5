import useSWR, { mutate } from 'swr';
import { api } from './api';

export type OutboxStatus = 'queued' | 'sending' | 'sent' | 'failed' | 'skipped' | 'cancelled';
export type OutboxRow = {
  id: string;
  to: { name: string | null; email: string };
  template: string;
  category: 'essential' | 'trial-news' | 'reminders' | 'digest';
  subject: string;
  status: OutboxStatus;
  attempts: number;
  lastError: string | null;
  providerMessageId: string | null;
  nextAttemptAt: string | null;
  sentAt: string | null;
  createdAt: string;
  canResend: boolean;
};
export type PlannedReminder = { tester: string; what: string; stage: '3d' | '1d' | 'day' | 'overdue'; sendAt: string; timeZone: string; turnedOff: boolean };
export type TrialOutbox = { messages: OutboxRow[]; upcoming: PlannedReminder[] };

export const outboxKeys = {
  trial: (studioId: string, trialId: string) => `/api/studios/${studioId}/trials/${trialId}/mail`,
};

export const useTrialOutbox = (studioId?: string | null, trialId?: string) => useSWR<TrialOutbox>(studioId && trialId ? outboxKeys.trial(studioId, trialId) : null);

/** Sends a failed message again; the list is reloaded whatever the outcome. */
export async function resendMessage(studioId: string, trialId: string, messageId: string) {
  try {
    return await api<OutboxRow>(`${outboxKeys.trial(studioId, trialId)}/${messageId}/resend`, { method: 'POST' });
  } finally {
    await mutate(outboxKeys.trial(studioId, trialId));
  }
}
