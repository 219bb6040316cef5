import dayjs from 'dayjs';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { AppText } from '@/components/ui/text';
import { colors, fonts, radius, space } from '@/constants/theme';
import { downloadFinalFile, useMyReleases, useMyAnnouncements } from '@/hooks/use-my-data';
import { DRAFT_FILE_LABELS, type DraftFileKind } from '@/server/domain/drafts';

/** Trials that are out: thanks, the final files and the reward code for those who finished. */
export function ReleasedTrials() {
  const { data } = useMyReleases();
  const [failure, setFailure] = useState<string | null>(null);
  if (!data || data.length === 0) return null;
  return (
    <>
      {failure ? <Notice tone="error">{failure}</Notice> : null}
      {data.map((r) => (
        <Card key={r.trialId} title={`Released: ${r.trialTitle}`}>
          <AppText variant="caption">{`${r.studioName} · released ${dayjs(r.releasedAt).format('D MMM YYYY')}`}</AppText>
          {r.finished ? (
            <AppText>{`Thank you for testing it through to the end: your report is part of the final pattern.`}</AppText>
          ) : (
            <AppText>Thank you for taking part as far as you could. We hope to see you in a future call.</AppText>
          )}
          {r.finalDraft ? (
            <View style={styles.files}>
              <AppText style={styles.strong}>{`The final pattern (draft ${r.finalDraft.version})`}</AppText>
              {r.finalDraft.files.map((f) => (
                <View key={f.id} style={styles.file}>
                  <AppText variant="caption">{`${DRAFT_FILE_LABELS[f.kind as DraftFileKind] ?? f.kind}: ${f.name} (${Math.max(1, Math.round(f.bytes / 1024))} KB)`}</AppText>
                  <Button label="Download" tone="quiet" accessibleLabel={`Download ${f.name}, final pattern`} onPress={() => downloadFinalFile(f.id).catch((e: Error) => setFailure(e.message))} />
                </View>
              ))}
            </View>
          ) : r.finished ? (
            <AppText variant="caption">The final files will appear here once the studio adds them.</AppText>
          ) : null}
          {r.rewardCode ? (
            <View style={styles.code} aria-label="Your reward code">
              <AppText variant="caption">Your reward code</AppText>
              <AppText style={styles.codeText} selectable>
                {r.rewardCode}
              </AppText>
            </View>
          ) : null}
        </Card>
      ))}
    </>
  );
}

/** Messages studios sent to the testers of trials this person is in. */
export function MyAnnouncements() {
  const { data } = useMyAnnouncements();
  if (!data || data.length === 0) return null;
  return (
    <Card title="Messages from studios">
      {data.map((a) => (
        <View key={a.id} style={styles.message}>
          <AppText style={styles.strong}>{a.subject}</AppText>
          <AppText variant="caption">{`${a.studioName} · ${a.trialTitle} · ${dayjs(a.createdAt).format('D MMM YYYY')}`}</AppText>
          <AppText>{a.body}</AppText>
          {a.replyTo ? <AppText variant="caption">{`Reply to the e-mail, or write to ${a.replyTo}.`}</AppText> : null}
        </View>
      ))}
    </Card>
  );
}

const styles = StyleSheet.create({
  strong: { fontFamily: fonts.semibold },
  files: { gap: space.xs },
  file: { gap: space.xs },
  code: { backgroundColor: colors.threadSoft, padding: space.md, borderRadius: radius.sm, gap: 2 },
  codeText: { fontFamily: fonts.bold, fontSize: 20, letterSpacing: 1, color: colors.threadDark },
  message: { gap: 2, paddingVertical: space.sm, borderBottomWidth: 1, borderBottomColor: colors.line },
});
