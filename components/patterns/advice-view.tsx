import { StyleSheet, View } from 'react-native';
import { AppText } from '@/components/ui/text';
import { colors, fonts, radius, space } from '@/constants/theme';
import type { SizeAdvice } from '@/server/domain/size-advice';

/** Size advice in words: the size, why, every measurement against it, and what to alter. */
export function AdviceView({ advice }: { advice: SizeAdvice }) {
  return (
    <View style={styles.box} aria-label="Size advice">
      <AppText variant="heading">{advice.size ? `Size ${advice.size.label}` : 'No size can be advised yet'}</AppText>
      {advice.noSizeReason ? <AppText>{advice.noSizeReason}</AppText> : null}
      {advice.blend ? <AppText style={styles.em}>{advice.blend.text}</AppText> : null}
      {advice.variantSuggestions.map((v) => (
        <AppText key={`${v.kind}-${v.variantId ?? 'none'}`} style={styles.em}>
          {v.text}
        </AppText>
      ))}
      {advice.legLength ? <AppText style={styles.em}>{advice.legLength.text}</AppText> : null}
      {advice.deltas.length ? <AppText variant="label">Your measurements against the chart</AppText> : null}
      {advice.deltas.map((d) => (
        <AppText key={d.key} variant="caption">
          {d.text}
        </AppText>
      ))}
      <AppText variant="label">Why</AppText>
      {advice.reasons.map((r) => (
        <AppText key={r} variant="caption">
          {`\u2022 ${r}`}
        </AppText>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.xs, padding: space.md, borderRadius: radius.md, backgroundColor: colors.threadSoft },
  em: { fontFamily: fonts.medium },
});
