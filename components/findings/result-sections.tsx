import { useState } from 'react';
import { ScrollView, StyleSheet, View } from 'react-native';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Empty } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { colors, fonts, radius, space } from '@/constants/theme';
import type { FabricCell, FitRatingArea, FitRatingCell, UnclearStep } from '@/server/analysis/types';
import { readerFor } from '@/server/analysis/wording';
import { formatFabricLength, formatFabricNeed, type FabricUnit, type LengthUnit } from '@/server/domain/units';

function signed(x: number): string {
  const t = x.toFixed(1);
  return x > 0 ? `+${t}` : t.replace('-', '−');
}

function fitWord(mean: number): string {
  if (mean <= -1) return 'too tight or short';
  if (mean >= 1) return 'too loose or long';
  return 'about right';
}

/** Fit ratings (−2 … +2): areas off across the range or changing with size first, then per-size hints, then the grid. */
export function FitRatingsSection({ cells, areas, sizes }: { cells: readonly FitRatingCell[]; areas: readonly FitRatingArea[]; sizes: readonly string[] }) {
  const areaNames = [...new Set(cells.map((c) => c.area))];
  const usedSizes = sizes.filter((s) => cells.some((c) => c.size === s));
  const at = new Map(cells.map((c) => [`${c.area}@${c.size}`, c]));
  const flaggedAreas = areas.filter((a) => a.flag !== null);
  const marked = cells.filter((c) => c.flagged || c.hint);
  return (
    <Card title="Fit ratings by size and area">
      <AppText variant="caption">
        Average rating from −2 (too tight or short) to +2 (too loose or long), with the number of ratings. An area is flagged when it is off across the
        whole range or changes with size, checked over every area at once; a single size marked ? is off on average but too few ratings to confirm it.
      </AppText>
      {flaggedAreas.length === 0 ? <Empty>No area is rated off across the range or changes with size.</Empty> : null}
      {flaggedAreas.map((a) => (
        <View key={a.area} style={styles.flag}>
          <AppText style={styles.strong}>{`! ${a.area}: ${a.flag === 'whole-range' ? fitWord(a.mean) + ' across the range' : 'changes with size'} (mean ${signed(a.mean)}, ${a.n} ratings)`}</AppText>
          {a.reasons.map((r) => (
            <AppText key={r} variant="caption">
              {r}
            </AppText>
          ))}
        </View>
      ))}
      {marked.map((c) => (
        <View key={`${c.area}@${c.size}`} style={c.flagged ? styles.flag : styles.item}>
          <AppText style={styles.strong}>{`${c.flagged ? '!' : '?'} Size ${c.size}, ${c.area}: ${signed(c.mean)} (${fitWord(c.mean)}), ${c.n} ratings`}</AppText>
          {c.reasons.map((r) => (
            <AppText key={r} variant="caption">
              {r}
            </AppText>
          ))}
        </View>
      ))}
      {usedSizes.length > 4 ? <AppText variant="caption">{`Sizes ${usedSizes[0]} to ${usedSizes[usedSizes.length - 1]} across: on a narrow screen, scroll the table sideways →`}</AppText> : null}
      <ScrollView horizontal focusable role="region" aria-label="Fit ratings by area and size, scrolls sideways on a narrow screen" persistentScrollbar>
        <View role="table" aria-label="Fit ratings by area and size">
          <View style={styles.tr} role="row">
            <AppText role="columnheader" style={[styles.th, styles.areaCol]}>
              Area
            </AppText>
            {usedSizes.map((s) => (
              <AppText key={s} role="columnheader" style={[styles.th, styles.valueCol]}>
                {s}
              </AppText>
            ))}
          </View>
          {areaNames.map((a) => (
            <View key={a} style={styles.tr} role="row">
              <AppText role="rowheader" style={[styles.td, styles.areaCol, styles.strong]}>
                {a}
              </AppText>
              {usedSizes.map((s) => {
                const c = at.get(`${a}@${s}`);
                const mark = c?.flagged ? '! ' : c?.hint ? '? ' : '';
                return (
                  <AppText
                    key={s}
                    role="cell"
                    aria-label={c ? `Size ${s}, ${a}: ${signed(c.mean)} from ${c.n} ratings${c.flagged ? ', flagged' : c.hint ? ', a hint, not confirmed' : ''}` : `Size ${s}, ${a}: no ratings`}
                    style={[styles.td, styles.valueCol, c?.flagged && styles.flaggedCell, c?.hint && styles.hintCell]}
                  >
                    {c ? `${mark}${signed(c.mean)} (${c.n})` : '–'}
                  </AppText>
                );
              })}
            </View>
          ))}
        </View>
      </ScrollView>
    </Card>
  );
}

/** Fabric used against the stated need per size and width; napped layouts apart. Flagged ones first. */
export function FabricSection({ cells, lengthUnit, fabricUnit }: { cells: readonly FabricCell[]; lengthUnit: LengthUnit; fabricUnit: FabricUnit }) {
  const [all, setAll] = useState(false);
  const flagged = cells.filter((c) => c.flagged);
  const shown = all ? [...flagged, ...cells.filter((c) => !c.flagged)] : flagged;
  return (
    <Card title="Fabric used against the stated need">
      {cells.length === 0 ? <Empty>No tester reported the fabric they used.</Empty> : null}
      {cells.length > 0 && flagged.length === 0 ? <Empty>No size ran over the stated need.</Empty> : null}
      {shown.map((c) => (
        <View key={`${c.size}@${c.widthMm}@${c.napped}`} style={[styles.item, c.flagged && styles.flag]}>
          <AppText style={styles.strong}>
            {`${c.flagged ? '! ' : ''}Size ${c.size}, ${readerFor(lengthUnit, fabricUnit).width(c.widthMm)} wide${c.napped ? ', one-way layout' : ''}`}
          </AppText>
          <AppText variant="caption">
            {`Stated need ${c.needMm !== null ? formatFabricNeed(c.needMm, fabricUnit) : 'not given'} · median used ${formatFabricLength(c.medianUsedMm, fabricUnit)} · most used ${formatFabricLength(c.maxUsedMm, fabricUnit)} · ${c.overNeed} of ${c.n} used more than stated`}
          </AppText>
          {c.reasons.map((r) => (
            <AppText key={r} variant="caption">
              {r}
            </AppText>
          ))}
        </View>
      ))}
      {cells.length > flagged.length ? (
        <Button
          tone="quiet"
          label={all ? 'Show only the sizes that ran over' : `Show every size and width (${cells.length})`}
          onPress={() => setAll(!all)}
        />
      ) : null}
    </Card>
  );
}

/** Instruction steps testers found unclear; two or more testers flag a step. */
export function UnclearStepsSection({ steps }: { steps: readonly UnclearStep[] }) {
  return (
    <Card title="Unclear instruction steps">
      {steps.length === 0 ? <Empty>No tester marked a step as unclear.</Empty> : null}
      {steps.map((s) => (
        <View key={s.step} style={[styles.item, s.flagged && styles.flag]}>
          <AppText style={styles.strong}>{`${s.flagged ? '! ' : ''}${s.step}`}</AppText>
          <AppText variant="caption">{`${s.count} ${s.count === 1 ? 'tester' : 'testers'} found it unclear${s.flagged ? ': rewrite it' : ''}`}</AppText>
        </View>
      ))}
    </Card>
  );
}

const styles = StyleSheet.create({
  strong: { fontFamily: fonts.semibold },
  item: { gap: 2, padding: space.sm, borderRadius: radius.sm, borderWidth: 1, borderColor: colors.line },
  flag: { gap: 2, padding: space.sm, borderRadius: radius.sm, borderWidth: 1, borderColor: colors.warning, backgroundColor: colors.warningSoft },
  tr: { flexDirection: 'row', borderBottomWidth: 1, borderBottomColor: colors.line },
  th: { fontFamily: fonts.semibold, fontSize: 13, paddingVertical: space.xs, paddingHorizontal: space.xs },
  td: { fontSize: 13, paddingVertical: space.xs, paddingHorizontal: space.xs },
  areaCol: { width: 88 },
  valueCol: { width: 76, textAlign: 'center' },
  flaggedCell: { backgroundColor: colors.warningSoft, fontFamily: fonts.semibold },
  hintCell: { backgroundColor: colors.surfaceSunken },
});
