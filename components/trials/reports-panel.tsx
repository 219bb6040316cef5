import dayjs from 'dayjs';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import useSWR from 'swr';
import { startDownload } from '@/components/patterns/download';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { Empty, LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { colors, fonts, radius, space } from '@/constants/theme';
import { trialKeys, type TrialDetail } from '@/hooks/use-trials';
import type { ReportDraft } from '@/server/domain/schemas/reports';
import { formatLength, type LengthUnit } from '@/server/domain/units';

type ReportRow = { id: string; tester: string; size: string; stage: string; content: ReportDraft; submittedAt: string | null; onTime: boolean | null };

/** The testers' reports, filtered by stage, size and draft, with a spreadsheet of the alterations. */
export function ReportsPanel({ studioId, trial, unit }: { studioId: string; trial: TrialDetail; unit: LengthUnit }) {
  const [stage, setStage] = useState<'check-in' | 'final'>('final');
  const [size, setSize] = useState<string>('');
  const query = `?stage=${stage}${size ? `&size=${size}` : ''}`;
  const base = `${trialKeys.one(studioId, trial.id)}/reports`;
  const { data, error, mutate } = useSWR<ReportRow[]>(`${base}${query}`);
  return (
    <Card title="Reports">
      <ChoiceGroup label="Report" options={[{ value: 'check-in', label: 'Toile check-in' }, { value: 'final', label: 'Final' }]} value={stage} onChange={setStage} />
      <ChoiceGroup label="Size" options={[{ value: '', label: 'All' }, ...(trial.pattern?.sizes ?? []).map((s) => ({ value: s.id, label: s.label }))]} value={size} onChange={setSize} />
      <Button label="Download the alterations as CSV" tone="quiet" onPress={() => startDownload(`${base}.csv${query}`)} />
      {error ? <LoadError error={error} onRetry={() => mutate()} /> : null}
      {!data && !error ? <Loading /> : null}
      {data && data.length === 0 ? <Empty>No reports match yet.</Empty> : null}
      {data?.map((r) => (
        <View key={r.id} style={styles.row}>
          <AppText style={styles.strong}>{`${r.tester} · size ${r.size} · draft ${r.content.draftVersion ?? '?'}`}</AppText>
          <AppText variant="caption">
            {r.submittedAt ? `Submitted ${dayjs(r.submittedAt).format('D MMM HH:mm')}${r.onTime === false ? ' (late)' : ''}` : 'Being written, not submitted'}
          </AppText>
          {Object.entries(r.content.fit ?? {}).length ? (
            <AppText variant="caption">{`Fit: ${Object.entries(r.content.fit ?? {}).map(([area, v]) => `${area} ${v! > 0 ? '+' : ''}${v}`).join(', ')}`}</AppText>
          ) : null}
          {(r.content.alterations ?? []).map((a, i) => (
            <AppText key={i} variant="caption">{`\u2022 ${a.kind === 'other' ? a.otherText : a.kind}: ${formatLength(a.amountMm, unit)} (${a.where})${a.note ? `, ${a.note}` : ''}`}</AppText>
          ))}
          {r.content.verdict ? <AppText variant="caption">{`“${r.content.verdict}”`}</AppText> : null}
        </View>
      ))}
    </Card>
  );
}

const styles = StyleSheet.create({
  row: { gap: 2, padding: space.md, borderRadius: radius.sm, borderWidth: 1, borderColor: colors.line },
  strong: { fontFamily: fonts.semibold },
});
