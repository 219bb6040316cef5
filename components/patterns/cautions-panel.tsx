import { StyleSheet, View } from 'react-native';
import { Card } from '@/components/ui/card';
import { AppText } from '@/components/ui/text';
import { colors, radius, space } from '@/constants/theme';
import { cautionsFor } from '@/server/domain/cautions';
import type { GarmentCategory } from '@/server/domain/garments';

/** The usual safety cautions for the garment (children's wear, sleepwear), and care notes for the instructions. */
export function CautionsPanel({ category }: { category: GarmentCategory }) {
  const cautions = cautionsFor(category);
  const safety = cautions.filter((c) => c.kind === 'safety');
  const care = cautions.filter((c) => c.kind === 'care');
  return (
    <Card title={safety.length ? 'Safety cautions for this garment' : 'Care notes for the instructions'}>
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
    </Card>
  );
}

const styles = StyleSheet.create({
  item: { gap: space.xs, padding: space.md, borderRadius: radius.sm, backgroundColor: colors.surfaceSunken },
  safety: { backgroundColor: colors.warningSoft, borderLeftWidth: 4, borderLeftColor: colors.warning },
});
