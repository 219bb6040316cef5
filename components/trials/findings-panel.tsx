import { StyleSheet, View } from 'react-native';
import useSWR from 'swr';
import { Card } from '@/components/ui/card';
import { Empty, LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { colors, fonts, radius, space } from '@/constants/theme';
import { trialKeys } from '@/hooks/use-trials';
import type { AnalysisOutput, FindingClass } from '@/server/analysis/types';

type FindingsResponse = { input: { testers: number }; result: AnalysisOutput | null };

const CLASS_WORDS: Record<FindingClass, string> = {
  'too-few-reports': 'too few reports',
  'personal-fit': 'personal fit',
  grading: 'grading',
  'draft-wide': 'whole draft',
  'size-specific': 'some sizes',
  none: 'no pattern',
};

/** What the submitted reports add up to (each tester once per draft), with the reasons in words. */
export function FindingsPanel({ studioId, trialId }: { studioId: string; trialId: string }) {
  const { data, error, mutate } = useSWR<FindingsResponse>(`${trialKeys.one(studioId, trialId)}/findings`);
  return (
    <Card title="Findings">
      {error ? <LoadError error={error} onRetry={() => mutate()} /> : null}
      {!data && !error ? <Loading /> : null}
      {data && !data.result ? <Empty>No report is submitted yet.</Empty> : null}
      {data?.result ? <AppText variant="caption">{`Draft ${data.result.draft}: ${data.result.testers} ${data.result.testers === 1 ? 'tester' : 'testers'} reported.`}</AppText> : null}
      {data?.result?.findings.map((f) => (
        <View key={`${f.kind}-${f.direction}`} style={[styles.row, (f.class === 'draft-wide' || f.class === 'grading' || f.class === 'size-specific') && styles.flagged]}>
          <AppText style={styles.strong}>{`${f.kind} (${f.direction}): ${CLASS_WORDS[f.class]}${f.sizes.length ? `, sizes ${f.sizes.join(', ')}` : ''} · ${f.count} of ${f.testers}`}</AppText>
          {f.reasons.map((r) => (
            <AppText key={r} variant="caption">
              {r}
            </AppText>
          ))}
        </View>
      ))}
    </Card>
  );
}

const styles = StyleSheet.create({
  row: { gap: 2, padding: space.md, borderRadius: radius.sm, borderWidth: 1, borderColor: colors.line },
  flagged: { borderColor: colors.warning, backgroundColor: colors.warningSoft },
  strong: { fontFamily: fonts.semibold },
});
