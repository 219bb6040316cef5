import dayjs from 'dayjs';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import useSWR from 'swr';
import { startDownload } from '@/components/patterns/download';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { Notice } from '@/components/ui/notice';
import { Empty, LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { colors, fonts, radius, space } from '@/constants/theme';
import { api } from '@/hooks/api';
import { usePatternDrafts } from '@/hooks/use-drafts';
import { trialKeys, type TrialDetail } from '@/hooks/use-trials';
import { ALTERATION_KINDS } from '@/server/domain/alterations';
import { countedAlterations } from '@/server/domain/schemas/reports';
import type { ReportDraft } from '@/server/domain/schemas/reports';
import { formatFabricLength, formatLength, type FabricUnit, type LengthUnit } from '@/server/domain/units';

const KIND_LABELS = new Map(ALTERATION_KINDS.map((k) => [k.key, k.label]));

type ReportRow = { id: string; tester: string; size: string; stage: string; content: ReportDraft; submittedAt: string | null; onTime: boolean | null };

/** The testers' reports, filtered by stage, size, variant and draft, with a spreadsheet of the alterations. */
export function ReportsPanel({ studioId, trial, unit, fabricUnit = 'yd', canMap = false }: { studioId: string; trial: TrialDetail; unit: LengthUnit; fabricUnit?: FabricUnit; canMap?: boolean }) {
  const [stage, setStage] = useState<'check-in' | 'final'>('final');
  const [size, setSize] = useState<string>('');
  const [draft, setDraft] = useState<string>('');
  const [variant, setVariant] = useState<string>('');
  const { data: drafts } = usePatternDrafts(studioId, trial.pattern?.id);
  const variants = trial.pattern?.variants ?? [];
  const params = new URLSearchParams({ stage, ...(size ? { size } : {}), ...(draft ? { draft } : {}), ...(variant ? { variant } : {}) });
  const query = `?${params.toString()}`;
  const base = `${trialKeys.one(studioId, trial.id)}/reports`;
  const { data, error, mutate } = useSWR<ReportRow[]>(`${base}${query}`);
  return (
    <Card title="Reports">
      <ChoiceGroup label="Report" options={[{ value: 'check-in', label: 'Toile check-in' }, { value: 'final', label: 'Final' }]} value={stage} onChange={setStage} />
      <ChoiceGroup label="Size" options={[{ value: '', label: 'All' }, ...(trial.pattern?.sizes ?? []).map((s) => ({ value: s.id, label: s.label }))]} value={size} onChange={setSize} />
      {drafts && drafts.length > 0 ? (
        <ChoiceGroup label="Draft" options={[{ value: '', label: 'All' }, ...drafts.map((d) => ({ value: String(d.version), label: `Draft ${d.version}` }))]} value={draft} onChange={setDraft} />
      ) : null}
      {variants.length > 0 ? (
        <ChoiceGroup label="Variant" options={[{ value: '', label: 'All' }, { value: '-', label: 'Main pattern' }, ...variants.map((v) => ({ value: v.name, label: v.name }))]} value={variant} onChange={setVariant} />
      ) : null}
      <Button label="Download the alterations as CSV" tone="quiet" onPress={() => startDownload(`${base}.csv${query}`)} />
      {error ? <LoadError error={error} onRetry={() => mutate()} /> : null}
      {!data && !error ? <Loading /> : null}
      {data && data.length === 0 ? <Empty>No reports match yet.</Empty> : null}
      {data?.map((r) => (
        <View key={r.id} style={styles.row}>
          <AppText style={styles.strong}>{`${r.tester} · size ${r.size}${r.content.sizeSewn && r.content.sizeSewn !== r.size ? ` (sewed ${r.content.sizeSewn})` : ''} · draft ${r.content.draftVersion ?? '?'}${r.content.variantSewn ? ` · ${r.content.variantSewn}` : ''}`}</AppText>
          <AppText variant="caption">
            {r.submittedAt ? `Submitted ${dayjs(r.submittedAt).format('D MMM HH:mm')}${r.onTime === false ? ' (late)' : ''}` : 'Being written, not submitted'}
          </AppText>
          {Object.entries(r.content.fit ?? {}).length ? (
            <AppText variant="caption">{`Fit: ${Object.entries(r.content.fit ?? {}).map(([area, v]) => `${area} ${v! > 0 ? '+' : ''}${v}`).join(', ')}`}</AppText>
          ) : null}
          {countedAlterations(r.content).map((a, i) => (
            <AppText key={i} variant="caption">{`\u2022 ${a.kind === 'other' ? `“${a.otherText}”` : (KIND_LABELS.get(a.kind) ?? a.kind)}: ${formatLength(a.amountMm, unit)}${a.where ? ` (${a.where})` : ''}${a.note ? `, ${a.note}` : ''}`}</AppText>
          ))}
          {r.content.fabric && (r.content.fabric.kind || r.content.fabric.usedMm) ? <AppText variant="caption">{fabricLine(r.content.fabric, unit, fabricUnit)}</AppText> : null}
          {r.content.verdict ? <AppText variant="caption">{`“${r.content.verdict}”`}</AppText> : null}
        </View>
      ))}
      {canMap ? <OtherAlterationsMapper studioId={studioId} trialId={trial.id} /> : null}
    </Card>
  );
}

function fabricLine(f: NonNullable<ReportDraft['fabric']>, unit: LengthUnit, fabricUnit: FabricUnit): string {
  const parts = [
    [f.kind, f.fibre].filter(Boolean).join(', ') || 'Fabric',
    f.widthMm ? `${formatLength(f.widthMm, unit)} wide` : null,
    f.usedMm ? `${formatFabricLength(f.usedMm, fabricUnit)} used` : null,
    f.stretchPct != null ? `${f.stretchPct}% stretch` : null,
    f.napped ? 'cut one way' : null,
  ];
  return parts.filter(Boolean).join(' · ');
}

type OtherList = { kinds: { key: string; label: string }[]; items: { text: string; reports: number; amountsMm: number[]; kind: string | null }[] };

/**
 * Alterations testers described in their own words, grouped by those words: the coordinator
 * reads each as a kind of the vocabulary so the findings can count it.
 */
function OtherAlterationsMapper({ studioId, trialId }: { studioId: string; trialId: string }) {
  const key = `${trialKeys.one(studioId, trialId)}/other-alterations`;
  const { data, error, mutate } = useSWR<OtherList>(key);
  const [problem, setProblem] = useState<string | null>(null);
  if (error) return <LoadError error={error} onRetry={() => mutate()} />;
  if (!data || data.items.length === 0) return null;
  const choose = async (text: string, kind: string) => {
    setProblem(null);
    try {
      await mutate(await api<OtherList>(key, { method: 'PUT', body: { text, kind: kind === '' ? null : kind } }), { revalidate: false });
    } catch (e) {
      setProblem(e instanceof Error ? e.message : 'Not saved.');
    }
  };
  return (
    <View style={styles.mapper}>
      <AppText style={styles.strong}>Alterations described in the testers’ own words</AppText>
      <AppText variant="caption">Read each as one of the kinds below so the findings count it; until then it is counted on its own.</AppText>
      {problem ? <Notice tone="error">{problem}</Notice> : null}
      {data.items.map((item) => (
        <View key={item.text} style={styles.row}>
          <AppText>{`“${item.text}” · ${item.reports} ${item.reports === 1 ? 'report' : 'reports'}`}</AppText>
          <ChoiceGroup
            label={`Read “${item.text}” as`}
            options={[{ value: '', label: 'Not read yet' }, ...data.kinds.map((k) => ({ value: k.key, label: k.label }))]}
            value={item.kind ?? ''}
            onChange={(kind) => void choose(item.text, kind)}
          />
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  row: { gap: 2, padding: space.md, borderRadius: radius.sm, borderWidth: 1, borderColor: colors.line },
  strong: { fontFamily: fonts.semibold },
  mapper: { gap: space.sm, marginTop: space.md },
});
