import { useState } from 'react';
import { Pressable, ScrollView, StyleSheet, View } from 'react-native';
import { AppText } from '@/components/ui/text';
import { colors, fonts, radius, space } from '@/constants/theme';
import { useIsWide } from '@/hooks/use-is-wide';
import type { CoverageGrid } from '@/server/domain/coverage';

const STATE_COLORS = { empty: colors.warningSoft, short: colors.surfaceSunken, full: colors.threadSoft, over: colors.warningSoft } as const;

/**
 * Sizes × height bands with applied and selected against the targets: a full grid on a wide
 * window, one row per size (tap to open its bands) on a phone.
 */
export function CoverageGridView({ grid }: { grid: CoverageGrid }) {
  const wide = useIsWide();
  const [open, setOpen] = useState<string | null>(null);
  if (grid.rows.length === 0) return <AppText variant="caption">Set the sizes wanted under Coverage targets to see the grid.</AppText>;

  if (!wide) {
    return (
      <View style={styles.list} aria-label="Coverage by size">
        {grid.rows.map((row) => (
          <View key={row.sizeId} style={[styles.phoneRow, { backgroundColor: STATE_COLORS[row.state] }]}>
            <Pressable role="button" aria-expanded={open === row.sizeId} aria-label={`Size ${row.label}: ${row.summary}`} onPress={() => setOpen(open === row.sizeId ? null : row.sizeId)}>
              <AppText style={styles.strong}>{`Size ${row.label}: ${row.selected} of ${row.target} chosen · ${row.applicants} applied`}</AppText>
              <AppText variant="caption">{row.summary}</AppText>
            </Pressable>
            {open === row.sizeId
              ? row.bands.map((b) => (
                  <AppText key={b.bandId ?? 'none'} variant="caption">{`${b.label}: ${b.selected} chosen, ${b.applicants} applied`}</AppText>
                ))
              : null}
          </View>
        ))}
      </View>
    );
  }

  return (
    <ScrollView horizontal aria-label="Coverage grid">
      <View>
        <View style={styles.row}>
          <AppText style={[styles.cell, styles.head]}>Size</AppText>
          <AppText style={[styles.cell, styles.head]}>Chosen / wanted</AppText>
          {grid.bands.map((b) => (
            <AppText key={b.id ?? 'none'} style={[styles.cell, styles.head]}>
              {b.label}
            </AppText>
          ))}
        </View>
        {grid.rows.map((row) => (
          <View key={row.sizeId} style={styles.row}>
            <AppText style={[styles.cell, styles.strong]}>{row.label}</AppText>
            <AppText style={[styles.cell, { backgroundColor: STATE_COLORS[row.state] }]}>{`${row.selected} / ${row.target}`}</AppText>
            {row.bands.map((b) => (
              <AppText key={b.bandId ?? 'none'} style={[styles.cell, b.state === 'no-applicants' && styles.muted]} aria-label={`Size ${row.label}, ${b.label}: ${b.selected} chosen, ${b.applicants} applied`}>
                {`${b.selected} chosen · ${b.applicants} applied`}
              </AppText>
            ))}
          </View>
        ))}
        <View style={styles.row}>
          <AppText style={[styles.cell, styles.strong]}>All</AppText>
          <AppText style={[styles.cell, styles.strong]}>{`${grid.totals.selected} / ${grid.totals.target}`}</AppText>
          {grid.bandTotals.map((b) => (
            <AppText key={b.bandId ?? 'none'} style={styles.cell}>{`${b.selected} chosen · ${b.applicants} applied`}</AppText>
          ))}
        </View>
      </View>
    </ScrollView>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.xs },
  phoneRow: { padding: space.md, borderRadius: radius.sm, gap: 2 },
  row: { flexDirection: 'row', borderBottomWidth: 1, borderBottomColor: colors.line },
  cell: { width: 150, padding: space.sm, fontSize: 14 },
  head: { fontFamily: fonts.semibold, color: colors.inkMuted },
  strong: { fontFamily: fonts.semibold },
  muted: { color: colors.inkMuted },
});
