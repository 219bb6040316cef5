import { StyleSheet, View } from 'react-native';
import { Card } from '@/components/ui/card';
import { AppText } from '@/components/ui/text';
import { colors, fonts, space } from '@/constants/theme';
import { easeTable, gradeAllSteps, type BodyMm, type FinishedMm } from '@/server/domain/chart-checks';
import type { FabricKind, GarmentCategory } from '@/server/domain/garments';
import type { LengthUnit } from '@/server/domain/units';
import type { ChartDraft } from './chart-draft';

const clean = <T,>(values: Record<string, number | null>) =>
  Object.fromEntries(Object.entries(values).filter(([, v]) => v != null)) as T;

/** Grade steps and ease of the chart as it stands in the editor, before it is even saved. */
export function ChartChecksPanel({ draft, category, fabricKind, unit }: { draft: ChartDraft; category: GarmentCategory; fabricKind: FabricKind; unit: LengthUnit }) {
  const sizes = draft.sizes.map((s) => ({
    id: s.key,
    label: s.label,
    bodyMm: clean<BodyMm>(s.bodyMm),
    finishedMm: clean<FinishedMm>(s.finishedMm),
  }));
  const grades = gradeAllSteps(sizes, unit);
  const ease = easeTable(sizes, fabricKind, category, unit);
  return (
    <Card title="Chart checks">
      <AppText variant="label">Grade steps between neighbouring sizes</AppText>
      {grades.length === 0 ? <AppText variant="caption">Enter a measurement in at least two sizes to see its grade steps.</AppText> : null}
      {grades.map((run) => (
        <View key={run.key} style={styles.block}>
          <AppText style={run.problems.length ? styles.warn : undefined}>{run.summary}</AppText>
          {run.problems.map((p) => (
            <AppText key={p} variant="caption" style={styles.warn}>
              {`\u2022 ${p}`}
            </AppText>
          ))}
        </View>
      ))}
      <AppText variant="label">Ease (finished − body)</AppText>
      {ease.rows.length === 0 ? <AppText variant="caption">Add finished measurements with a body counterpart to see the ease per size.</AppText> : null}
      {ease.rows.map((row) => (
        <View key={row.key} style={styles.block}>
          <AppText style={styles.rowTitle}>{row.label}</AppText>
          <AppText variant="caption">{row.cells.map((c) => c.text).join(' · ')}</AppText>
          {row.drift ? <AppText variant="caption" style={row.drift.flagged ? styles.warn : undefined}>{row.drift.text}</AppText> : null}
        </View>
      ))}
      {ease.warnings.map((w) => (
        <AppText key={`${w.code}-${w.key}-${w.size?.id ?? 'all'}`} variant="caption" style={w.severity === 'warning' ? styles.warn : undefined} role={w.severity === 'warning' ? 'alert' : undefined}>
          {`${w.severity === 'warning' ? 'Warning' : 'Note'}: ${w.text}`}
        </AppText>
      ))}
    </Card>
  );
}

const styles = StyleSheet.create({
  block: { gap: 2, paddingVertical: space.xs },
  rowTitle: { fontFamily: fonts.semibold },
  warn: { color: colors.warning },
});
