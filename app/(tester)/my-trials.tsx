import { Link } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { DraftFiles } from '@/components/drafts/drafts-panel';
import { CalendarCard } from '@/components/my-trials/calendar-card';
import { MyDataCard } from '@/components/my-trials/my-data-card';
import { MyAnnouncements, ReleasedTrials } from '@/components/my-trials/released-trials';
import { describeInstant } from '@/components/trials/dates';
import { useTrialDrafts } from '@/hooks/use-drafts';
import { Button } from '@/components/ui/button';
import { ButtonLink } from '@/components/ui/button-link';
import { Card } from '@/components/ui/card';
import { ConfirmPanel } from '@/components/ui/confirm-panel';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { Empty, LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { colors, fonts, space } from '@/constants/theme';
import { useSession } from '@/hooks/use-session';
import { useMyTrials, withdrawApplication, type MyTrial } from '@/hooks/use-trials';

/** The draft files of a trial the tester is enrolled in, newest first. */
function TrialDrafts({ trialId, onError }: { trialId: string; onError: (message: string) => void }) {
  const { data } = useTrialDrafts(trialId);
  if (!data || data.length === 0) return <AppText variant="caption">No draft files yet: you will get an e-mail when they are out.</AppText>;
  return (
    <View style={styles.drafts}>
      {data.map((d, i) => (
        <View key={d.id}>
          <AppText style={styles.strong}>{`Draft ${d.version}${i === 0 ? ' (newest)' : ''}: ${d.changeNote}`}</AppText>
          <DraftFiles draft={d} onError={onError} />
        </View>
      ))}
    </View>
  );
}

const STATUS_WORDS = {
  applied: 'Applied: waiting for the studio’s choice',
  shortlisted: 'Shortlisted: waiting for the studio’s choice',
  selected: 'You are testing',
  waitlisted: 'On the waiting list',
  declined: 'Not chosen this time',
  withdrawn: 'Withdrawn',
} as const;

/** What withdrawing does, said before it is done. */
function withdrawalConsequences(t: MyTrial): string[] {
  if (t.status !== 'selected') return ['Your application is withdrawn: the studio will no longer consider it.', 'You cannot apply to this call again.'];
  return [
    'You give up your place; it may be offered to someone on the waiting list.',
    'Your photos for this trial are deleted, and reminders stop.',
    'Reports you already sent stay with the studio.',
    'This cannot be undone.',
  ];
}

/** A report's link, and once it is sent, when it was received (it then opens as sent). */
function ReportLink({ t, stage, label, zone }: { t: MyTrial; stage: 'check-in' | 'final'; label: string; zone: string }) {
  const received = stage === 'final' ? t.enrollment!.submitted.final : t.enrollment!.submitted.checkIn;
  return (
    <View style={styles.report}>
      <ButtonLink href={{ pathname: '/report/[enrollmentId]/[stage]', params: { enrollmentId: t.enrollment!.id, stage } }} label={label} tone="quiet" />
      <AppText variant="caption">{received ? `Received ${describeInstant(received, zone)}` : 'Not sent yet'}</AppText>
    </View>
  );
}

export default function MyTrialsScreen() {
  const { session } = useSession();
  const { data, error, mutate } = useMyTrials();
  const [failure, setFailure] = useState<string | null>(null);
  const [confirming, setConfirming] = useState<string | null>(null);
  const zone = session?.user.timeZone ?? 'UTC';
  return (
    <Screen title="My trials" intro="The trials you applied to or test in, with what is due next.">
      {failure ? <Notice tone="error">{failure}</Notice> : null}
      {error ? <LoadError error={error} onRetry={() => mutate()} /> : null}
      {!data && !error ? <Loading /> : null}
      {data && data.length === 0 ? <Empty>No trials yet. A studio’s call for testers has a link to apply.</Empty> : null}
      <ReleasedTrials />
      <MyAnnouncements />
      {data?.map((t) => (
        <Card key={t.applicationId} title={t.trial.title}>
          <AppText style={styles.status}>{`${t.enrollment?.status === 'finished' ? 'Finished: thank you for testing' : STATUS_WORDS[t.status]}${t.size ? ` · size ${t.size.label}` : ''} · ${t.trial.studioName}`}</AppText>
          {t.next ? (
            <View style={styles.next} aria-label="Next due">
              <AppText style={styles.strong}>{`Next: ${t.next.label}, ${describeInstant(t.next.dueAt, zone)}${t.next.extended ? ' (extended for you)' : ''}`}</AppText>
              <AppText variant="caption">{t.next.expects}</AppText>
            </View>
          ) : null}
          {t.dues.map((d) => (
            <AppText key={d.kind} variant="caption">{`${d.label}: ${describeInstant(d.dueAt, zone)}`}</AppText>
          ))}
          {t.status === 'selected' && (t.enrollment?.status === 'active' || t.enrollment?.status === 'finished') ? <TrialDrafts trialId={t.trial.id} onError={setFailure} /> : null}
          {t.enrollment && t.status === 'selected' ? (
            <View style={styles.reports}>
              <ReportLink t={t} stage="check-in" label="Toile check-in" zone={zone} />
              <ReportLink t={t} stage="final" label="Final report" zone={zone} />
            </View>
          ) : null}
          {t.status === 'selected' ? (
            <Link href={{ pathname: '/size-advice/[patternId]', params: { patternId: t.trial.patternId } }} style={styles.link}>
              My size advice
            </Link>
          ) : null}
          {/* Once the tester has finished there is nothing left to withdraw from. */}
          {t.status !== 'withdrawn' && t.status !== 'declined' && t.enrollment?.status !== 'finished' ? (
            confirming === t.applicationId ? (
              <ConfirmPanel
                question={`Withdraw from ${t.trial.title}?`}
                consequences={withdrawalConsequences(t)}
                confirmLabel="Yes, withdraw"
                busyLabel="Withdrawing…"
                cancelLabel={t.status === 'selected' ? 'Keep my place' : 'Keep my application'}
                onCancel={() => setConfirming(null)}
                onConfirm={async () => {
                  await withdrawApplication(t.applicationId);
                  setConfirming(null);
                }}
              />
            ) : (
              <Button label="Withdraw" accessibleLabel={`Withdraw from ${t.trial.title}`} tone="danger" onPress={() => setConfirming(t.applicationId)} />
            )
          ) : null}
        </Card>
      ))}
      <CalendarCard />
      <MyDataCard />
    </Screen>
  );
}

const styles = StyleSheet.create({
  status: { fontFamily: fonts.medium },
  next: { backgroundColor: colors.threadSoft, padding: space.md, borderRadius: 8, gap: 2 },
  strong: { fontFamily: fonts.semibold },
  link: { color: colors.thread, fontFamily: fonts.semibold, paddingVertical: space.sm },
  drafts: { gap: space.sm },
  reports: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  // Shrinks with the window: the receipt line wraps on a phone rather than running off the side.
  report: { gap: 2, flexShrink: 1, maxWidth: '100%' },
});
