import { StyleSheet, View } from 'react-native';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Empty } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { colors, fonts, radius, space } from '@/constants/theme';
import { startDownload } from '@/components/patterns/download';
import type { ChangeRow } from '@/server/analysis/types';
import type { LengthUnit } from '@/server/domain/units';
import { CLASS_LABELS, findingKey, findingName, lengthText } from './words';

type Props = { draft: string; changes: readonly ChangeRow[]; unit: LengthUnit; csvUrl: string };

/** Each finding's rows, in the order they came (sizes in grading order). */
function byFinding(changes: readonly ChangeRow[]): ChangeRow[][] {
  const groups = new Map<string, ChangeRow[]>();
  for (const c of changes) {
    const key = findingKey(c);
    groups.set(key, [...(groups.get(key) ?? []), c]);
  }
  return [...groups.values()];
}

/**
 * The next-draft change table: for every finding triaged "will fix", the change to make at each
 * size in the reader's unit, with its interval and where the number comes from.
 */
export function ChangeTable({ draft, changes, unit, csvUrl }: Props) {
  const groups = byFinding(changes);
  return (
    <Card title={`Changes for the next draft (from draft ${draft})`}>
      {groups.length === 0 ? (
        <Empty>No finding is marked “Will fix” yet. Open a finding and set its triage to list the change per size here.</Empty>
      ) : (
        <AppText variant="caption">
          For each finding the studio will fix: the change per size. Whole-draft findings take the median of the testers’ amounts at every size;
          grading findings the line fitted to the amounts across sizes (with its prediction interval); a size that stands out its own median.
        </AppText>
      )}
      {groups.map((rows) => {
        const first = rows[0] as ChangeRow;
        const notes = [...new Set(rows.map((r) => r.note))];
        return (
          <View key={findingKey(first)} style={styles.group} testID={`changes-${findingKey(first)}`}>
            <AppText style={styles.strong}>{`${findingName(first)} · ${CLASS_LABELS[first.class]}`}</AppText>
            {notes.length === 1 ? <AppText variant="caption">{notes[0]}</AppText> : null}
            <View role="table" aria-label={`Changes per size: ${findingName(first)}`}>
              <View role="row" style={styles.tr}>
                <AppText role="columnheader" style={[styles.th, styles.sizeCol]}>
                  Size
                </AppText>
                <AppText role="columnheader" style={[styles.th, styles.valueCol]}>
                  Change
                </AppText>
                <AppText role="columnheader" style={[styles.th, styles.rangeCol]}>
                  Interval
                </AppText>
              </View>
              {rows.map((r) => (
                <View key={r.size} role="row" style={styles.tr}>
                  <AppText role="rowheader" style={[styles.td, styles.sizeCol, styles.strong]}>
                    {r.size}
                  </AppText>
                  <AppText role="cell" style={[styles.td, styles.valueCol]}>
                    {r.amountMm === null || r.amountMm === 0 ? 'no change' : `${lengthText(r.amountMm, unit)}${r.extrapolated ? ' *' : ''}`}
                  </AppText>
                  <AppText role="cell" style={[styles.td, styles.rangeCol]}>
                    {r.interval ? `${lengthText(r.interval[0], unit)} to ${lengthText(r.interval[1], unit)}` : '–'}
                  </AppText>
                </View>
              ))}
            </View>
            {notes.length > 1 ? (
              <View style={styles.notes}>
                {notes.map((n) => (
                  <AppText key={n} variant="caption">
                    {n}
                  </AppText>
                ))}
              </View>
            ) : null}
            {rows.some((r) => r.extrapolated) ? <AppText variant="caption">* beyond the sizes whose testers made the change: check it on a toile.</AppText> : null}
          </View>
        );
      })}
      {groups.length > 0 ? <Button label="Download the changes as CSV" tone="quiet" onPress={() => startDownload(csvUrl)} /> : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  group: { gap: space.xs, padding: space.sm, borderRadius: radius.sm, borderWidth: 1, borderColor: colors.line },
  strong: { fontFamily: fonts.semibold },
  tr: { flexDirection: 'row', borderBottomWidth: 1, borderBottomColor: colors.line },
  th: { fontFamily: fonts.semibold, fontSize: 13, paddingVertical: space.xs, paddingHorizontal: space.xs },
  td: { fontSize: 13, paddingVertical: space.xs, paddingHorizontal: space.xs },
  sizeCol: { width: 56 },
  valueCol: { flex: 1, minWidth: 84 },
  rangeCol: { flex: 2, minWidth: 120 },
  notes: { gap: 2 },
});
