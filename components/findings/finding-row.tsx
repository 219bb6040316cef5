import { Pressable, StyleSheet, View } from 'react-native';
import { AppText } from '@/components/ui/text';
import { colors, fonts, radius, space } from '@/constants/theme';
import { triageOf, type FindingView } from '@/hooks/use-findings';
import type { LengthUnit } from '@/server/domain/units';
import { AmountChart } from './amount-chart';
import { RateChart } from './rate-chart';
import { TriagePanel, triageText } from './triage-panel';
import { CLASS_HINTS, CLASS_LABELS, findingName, intervalText, isPatternProblem, lengthText, percent } from './words';

type Props = {
  studioId: string;
  trialId: string;
  finding: FindingView;
  drafts: readonly string[];
  unit: LengthUnit;
  canTriage: boolean;
  open: boolean;
  onToggle: () => void;
  wide: boolean;
};

/** One finding: a summary line that opens onto its reasons, charts, triage and notes. */
export function FindingRow({ studioId, trialId, finding: f, drafts, unit, canTriage, open, onToggle, wide }: Props) {
  const name = findingName(f);
  const problem = isPatternProblem(f.class);
  const triage = triageOf(f);
  // The button's name is its visible text in reading order, so speech and sight agree. Each piece
  // ends in a space: the pieces sit in separate boxes, and their words must not run together.
  const classText = `${CLASS_LABELS[f.class]}${f.sizes.length ? `: ${f.sizes.join(', ')}` : ''}`;
  const counts = `${f.count} of ${f.testers} testers`;
  const rateText = `${percent(f.rate)} (95% ${intervalText(f.wilson)})`;
  const detailText = `${open ? 'Hide details' : 'Details'} · ${triageText(triage)}`;
  return (
    <View style={[styles.row, problem && styles.problem]} testID={`finding-${f.kind}|${f.direction}`}>
      <Pressable
        role="button"
        aria-expanded={open}
        aria-label={`${name}: ${classText}, ${counts}, ${rateText}. ${detailText}`}
        onPress={onToggle}
        style={[styles.head, wide && styles.headWide]}
      >
        <View style={[styles.cell, wide && styles.nameCol]}>
          <AppText style={styles.name}>{`${name} `}</AppText>
        </View>
        <View style={[styles.cell, wide && styles.classCol]}>
          <AppText style={[styles.badge, problem ? styles.badgeProblem : styles.badgeQuiet]}>
            {problem ? <AppText aria-hidden style={styles.mark}>{'! '}</AppText> : null}
            {`${classText} `}
          </AppText>
        </View>
        <View style={[styles.cell, wide && styles.numCol]}>
          <AppText variant="label">{`${counts} `}</AppText>
          <AppText variant="caption">{`${rateText} `}</AppText>
        </View>
        <AppText variant="caption" style={wide ? styles.detailWide : undefined}>{`${open ? '▾' : '▸'} ${detailText}`}</AppText>
      </Pressable>
      {!open && f.reasons[0] ? (
        <AppText variant="caption" style={styles.firstReason}>
          {f.reasons[0]}
        </AppText>
      ) : null}
      {open ? (
        <View style={styles.detail}>
          <AppText variant="caption">{CLASS_HINTS[f.class]}</AppText>
          {f.reasons.map((r) => (
            <AppText key={r}>{`• ${r}`}</AppText>
          ))}
          {f.meanMm !== null ? (
            <AppText variant="caption">
              {`Amount: mean ${lengthText(f.meanMm, unit)}${f.medianMm !== null ? `, median ${lengthText(f.medianMm, unit)}` : ''}${f.sdMm !== null ? `, SD ${lengthText(f.sdMm, unit)}` : ''}.`}
            </AppText>
          ) : null}
          <View style={[styles.charts, wide && styles.chartsWide]}>
            <View style={styles.chart}>
              <RateChart bySize={f.bySize} flaggedSizes={f.sizes} overall={{ rate: f.rate, wilson: f.wilson }} name={name} />
            </View>
            <View style={styles.chart}>
              <AmountChart bySize={f.bySize} fit={f.amountSlope} unit={unit} name={name} />
            </View>
          </View>
          <TriagePanel key={`${triage.state}-${triage.fixedInDraft ?? ''}`} studioId={studioId} trialId={trialId} finding={f} drafts={drafts} canTriage={canTriage} />
        </View>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  row: { borderWidth: 1, borderColor: colors.line, borderRadius: radius.sm, backgroundColor: colors.surface },
  problem: { borderLeftWidth: 4, borderLeftColor: colors.warning },
  head: { padding: space.md, gap: space.xs, minHeight: 44 },
  headWide: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', columnGap: space.md, rowGap: 2 },
  cell: { gap: 2 },
  nameCol: { flex: 3 },
  classCol: { flex: 2 },
  numCol: { flex: 2, alignItems: 'flex-end' },
  name: { fontFamily: fonts.semibold },
  mark: { fontFamily: fonts.semibold },
  // On a wide row the details line runs under the three columns.
  detailWide: { width: '100%' },
  badge: { alignSelf: 'flex-start', fontFamily: fonts.medium, fontSize: 13, lineHeight: 18, paddingHorizontal: space.sm, paddingVertical: 2, borderRadius: radius.sm },
  badgeProblem: { backgroundColor: colors.warningSoft, color: colors.ink },
  badgeQuiet: { backgroundColor: colors.surfaceSunken, color: colors.inkMuted },
  firstReason: { paddingHorizontal: space.md, paddingBottom: space.md, marginTop: -space.xs },
  detail: { paddingHorizontal: space.md, paddingBottom: space.md, gap: space.sm },
  charts: { gap: space.lg },
  chartsWide: { flexDirection: 'row' },
  chart: { flex: 1, minWidth: 0 },
});
