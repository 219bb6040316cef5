import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { describeInstant } from '@/components/trials/dates';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { Empty, LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { colors, fonts, radius, space } from '@/constants/theme';
import { resendMessage, useTrialOutbox, type OutboxRow, type OutboxStatus, type PlannedReminder } from '@/hooks/use-outbox';

const STATUS_LABELS: Record<OutboxStatus, string> = {
  queued: 'Waiting to send',
  sending: 'Sending',
  sent: 'Sent',
  failed: 'Not delivered',
  skipped: 'Not sent (turned off)',
  cancelled: 'Not needed any more',
};

const KIND_LABELS: Record<string, string> = {
  'application-received': 'Application received',
  selected: 'Chosen',
  waitlisted: 'Waiting list',
  declined: 'Not chosen',
  'new-draft': 'New draft',
  'reminder-3d': 'Reminder, 3 days before',
  'reminder-1d': 'Reminder, day before',
  'reminder-day': 'Reminder, due today',
  overdue: 'Overdue notice',
};

const STAGE_LABELS: Record<PlannedReminder['stage'], string> = { '3d': '3 days before', '1d': 'day before', day: 'due today', overdue: '2 days late' };

function statusLine(m: OutboxRow, timeZone: string): string {
  const parts = [STATUS_LABELS[m.status]];
  if (m.status === 'sent' && m.sentAt) parts.push(describeInstant(m.sentAt, timeZone));
  if (m.status === 'queued' && m.nextAttemptAt) parts.push(`next try ${describeInstant(m.nextAttemptAt, timeZone)}`);
  if (m.attempts > 1 || m.status === 'failed') parts.push(`${m.attempts} ${m.attempts === 1 ? 'attempt' : 'attempts'}`);
  return parts.join(' · ');
}

/** The trial's mail: what went out, what is waiting or failed (and why), and the reminders ahead. */
export function OutboxPanel({ studioId, trialId, timeZone }: { studioId: string; trialId: string; timeZone: string }) {
  const { data, error, mutate } = useTrialOutbox(studioId, trialId);
  const [busy, setBusy] = useState<string | null>(null);
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);

  const resend = async (m: OutboxRow) => {
    setBusy(m.id);
    setMessage(null);
    try {
      const row = await resendMessage(studioId, trialId, m.id);
      setMessage(row.status === 'sent' ? { tone: 'success', text: `Sent again to ${m.to.email}.` } : { tone: 'error', text: `Still not delivered: ${row.lastError ?? 'the mail server refused it'}. It will be tried again.` });
    } catch (e) {
      setMessage({ tone: 'error', text: e instanceof Error ? e.message : 'Not sent.' });
    } finally {
      setBusy(null);
      await mutate();
    }
  };

  return (
    <Card title="Mail">
      {error ? <LoadError error={error} onRetry={() => mutate()} /> : null}
      {!data && !error ? <Loading /> : null}
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
      {data ? (
        <>
          <AppText variant="label">Sent and waiting</AppText>
          {data.messages.length === 0 ? <Empty>No mail for this trial yet.</Empty> : null}
          {data.messages.map((m) => (
            <View key={m.id} style={styles.row}>
              <AppText style={styles.strong}>{m.subject}</AppText>
              <AppText variant="caption">{`${KIND_LABELS[m.template] ?? m.template} · to ${m.to.name ? `${m.to.name} <${m.to.email}>` : m.to.email}`}</AppText>
              <View style={[styles.status, m.status === 'failed' ? styles.failed : m.status === 'sent' ? styles.sent : null]}>
                <AppText variant="caption">{statusLine(m, timeZone)}</AppText>
                {m.lastError && m.status !== 'sent' ? <AppText variant="caption">{`Reason: ${m.lastError}`}</AppText> : null}
              </View>
              {m.canResend ? (
                <Button label="Send again" busy={busy === m.id} busyLabel="Sending…" tone="quiet" accessibleLabel={`Send again: ${m.subject} to ${m.to.email}`} onPress={() => resend(m)} />
              ) : null}
            </View>
          ))}
          <AppText variant="label">Reminders ahead</AppText>
          {data.upcoming.length === 0 ? <Empty>No reminders planned: every active tester has sent what is due, or no dates are set.</Empty> : null}
          {data.upcoming.slice(0, 50).map((r) => (
            <AppText key={`${r.tester}-${r.what}-${r.stage}`} variant="caption">
              {`${describeInstant(r.sendAt, timeZone)} · ${r.tester} · ${r.what}, ${STAGE_LABELS[r.stage]}${r.turnedOff ? ' (turned off by the tester)' : ''}`}
            </AppText>
          ))}
        </>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  row: { gap: space.xs, paddingVertical: space.sm, borderTopWidth: 1, borderTopColor: colors.line },
  status: { gap: space.xs, padding: space.sm, borderRadius: radius.sm, backgroundColor: colors.surfaceSunken },
  failed: { backgroundColor: colors.warningSoft },
  sent: { backgroundColor: colors.threadSoft },
  strong: { fontFamily: fonts.semibold },
});
