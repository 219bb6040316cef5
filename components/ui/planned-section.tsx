import { StyleSheet, View } from 'react-native';
import { colors, radius, space } from '@/constants/theme';
import { AppText } from './text';

type Props = { items: string[] };

/** Says plainly what a screen will hold once its feature lands, instead of an empty page. */
export function PlannedSection({ items }: Props) {
  return (
    <View style={styles.box} aria-label="Planned for this screen">
      <AppText variant="label">Not built yet. This screen will show:</AppText>
      {items.map((item) => (
        <AppText key={item} variant="caption">
          {'\u2022'} {item}
        </AppText>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  box: {
    borderWidth: 1,
    borderStyle: 'dashed',
    borderColor: colors.thread,
    borderRadius: radius.md,
    backgroundColor: colors.threadSoft,
    padding: space.lg,
    gap: space.xs,
  },
});
