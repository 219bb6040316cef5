import { StyleSheet, View } from 'react-native';
import { Card } from '@/components/ui/card';
import { AppText } from '@/components/ui/text';
import { colors, radius, space } from '@/constants/theme';
import { cautionsFor, childrensWearSignals, type PatternForCautions } from '@/server/domain/cautions';
import type { LengthUnit } from '@/server/domain/units';

/**
 * The usual safety cautions for the pattern (made for children by its category, its flag or its
 * size chart; sleepwear), with why they show, and care notes for the instructions.
 */
export function CautionsPanel({ pattern, unit }: { pattern: PatternForCautions; unit: LengthUnit }) {
  const cautions = cautionsFor(pattern);
  const safety = cautions.filter((c) => c.kind === 'safety');
  const care = cautions.filter((c) => c.kind === 'care');
  const why = childrensWearSignals(pattern, unit);
  return (
    <Card title={safety.length ? 'Safety cautions for this garment' : 'Care notes for the instructions'}>
      {why.length ? <AppText variant="caption">{`The children’s cautions show because ${joinAnd(why)}.`}</AppText> : null}
      {[...safety, ...care].map((c) => (
        <View key={c.id} style={[styles.item, c.kind === 'safety' && styles.safety]} role={c.kind === 'safety' ? 'note' : undefined}>
          <AppText variant="label">{c.title}</AppText>
          {c.paragraphs.map((p) => (
            <AppText key={p} variant="caption">
              {p}
            </AppText>
          ))}
          {c.standards.length ? (
            <AppText variant="caption">
              {`See: ${c.standards.map((s) => `${s.code} (${s.about}${s.basis === 'memory' ? '; cited from memory, check the current text' : ''})`).join('; ')}`}
            </AppText>
          ) : null}
        </View>
      ))}
      {why.length ? null : (
        <AppText variant="caption">Made for children? Marking it so in the pattern’s details shows the children’s safety cautions here.</AppText>
      )}
    </Card>
  );
}

function joinAnd(items: string[]): string {
  return items.length < 2 ? items.join('') : `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

const styles = StyleSheet.create({
  item: { gap: space.xs, padding: space.md, borderRadius: radius.sm, backgroundColor: colors.surfaceSunken },
  safety: { backgroundColor: colors.warningSoft, borderLeftWidth: 4, borderLeftColor: colors.warning },
});
