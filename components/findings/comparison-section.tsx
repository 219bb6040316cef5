import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { Empty } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { colors, fonts, radius, space } from '@/constants/theme';
import type { ComparisonRow, ComparisonStatus } from '@/server/analysis/types';
import { CLASS_LABELS, STATUS_LABELS, findingName, pText } from './words';

type Props = {
  drafts: readonly string[];
  /** The pair compared now, if any. */
  compare: readonly [string, string] | undefined;
  rows: readonly ComparisonRow[] | undefined;
  onCompare: (pair: [string, string] | undefined) => void;
  busy: boolean;
};

const STATUS_MARK: Record<ComparisonStatus, string> = { fixed: '✓', improved: '↘', 'still-present': '✗', 'not-enough-data': '?', 'personal-fit': '–' };

/** "−67 points (−90 to −21)": the change in the rate with its interval, in percentage points. */
function differenceText(d: NonNullable<ComparisonRow['difference']>): string {
  const pts = (x: number) => {
    const v = Math.round(x * 100);
    return v > 0 ? `+${v}` : v < 0 ? `−${-v}` : '0';
  };
  return `change ${pts(d.estimate)} points (95% ${pts(d.interval[0])} to ${pts(d.interval[1])})`;
}

/** Did a later draft fix what an earlier one showed? Pick two drafts; each finding gets a status. */
export function ComparisonSection({ drafts, compare, rows, onCompare, busy }: Props) {
  const [from, setFrom] = useState<string | undefined>(compare?.[0] ?? drafts[drafts.length - 2]);
  const [to, setTo] = useState<string | undefined>(compare?.[1] ?? drafts[drafts.length - 1]);
  if (drafts.length < 2) {
    return (
      <Card title="Draft against draft">
        <Empty>Only one draft has reports so far: nothing to compare yet.</Empty>
      </Card>
    );
  }
  const valid = from !== undefined && to !== undefined && from !== to;
  const options = drafts.map((d) => ({ value: d, label: `Draft ${d}` }));
  return (
    <Card title="Draft against draft">
      <ChoiceGroup label="Earlier draft" options={options} value={from} onChange={setFrom} />
      <ChoiceGroup label="Later draft" options={options} value={to} onChange={setTo} error={from !== undefined && from === to ? 'pick a different draft from the earlier one' : undefined} />
      <View style={styles.actions}>
        <Button label="Compare the drafts" busy={busy} busyLabel="Comparing…" disabled={!valid} onPress={() => valid && onCompare([from, to])} />
        {compare ? <Button label="Hide the comparison" tone="quiet" onPress={() => onCompare(undefined)} /> : null}
      </View>
      {compare && rows ? (
        rows.length === 0 ? (
          <Empty>{`Draft ${compare[0]} had no finding pointing at the pattern or personal fit to follow up.`}</Empty>
        ) : (
          <View style={styles.list} testID="comparison">
            {rows.map((r) => (
              <View key={`${r.kind}|${r.direction}`} style={styles.row} testID={`comparison-${r.kind}|${r.direction}`}>
                <View style={styles.head}>
                  <AppText style={styles.name}>{findingName(r)}</AppText>
                  <AppText style={[styles.status, r.status === 'fixed' ? styles.fixed : r.status === 'still-present' ? styles.still : styles.unknown]} testID={`status-${r.kind}|${r.direction}`}>
                    {`${STATUS_MARK[r.status]} ${STATUS_LABELS[r.status]}`}
                  </AppText>
                </View>
                <AppText variant="caption">
                  {`${CLASS_LABELS[r.class]}${r.sizes.length ? ` (sizes ${r.sizes.join(', ')})` : ''} · draft ${r.from}: ${r.countFrom} of ${r.testersFrom} → draft ${r.to}: ${r.countTo} of ${r.testersTo}${r.difference ? ` · ${differenceText(r.difference)}` : ''} · ${pText(r.p)}${r.pExact ? ` (${r.pExact})` : ''}`}
                </AppText>
                {r.reasons.map((reason) => (
                  <AppText key={reason} variant="caption">
                    {reason}
                  </AppText>
                ))}
              </View>
            ))}
          </View>
        )
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  list: { gap: space.sm },
  row: { gap: 2, padding: space.md, borderRadius: radius.sm, borderWidth: 1, borderColor: colors.line },
  head: { flexDirection: 'row', flexWrap: 'wrap', justifyContent: 'space-between', gap: space.sm },
  name: { fontFamily: fonts.semibold },
  status: { fontFamily: fonts.semibold, paddingHorizontal: space.sm, borderRadius: radius.sm },
  fixed: { backgroundColor: colors.threadSoft, color: colors.threadDark },
  still: { backgroundColor: colors.warningSoft, color: colors.ink },
  unknown: { backgroundColor: colors.surfaceSunken, color: colors.inkMuted },
});
