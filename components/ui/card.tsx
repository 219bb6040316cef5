import type { ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';
import { colors, radius, space } from '@/constants/theme';
import { AppText } from './text';

type Props = { title: string; children?: ReactNode };

export function Card({ title, children }: Props) {
  return (
    <View style={styles.card}>
      <AppText variant="heading">{title}</AppText>
      <View style={styles.body}>{children}</View>
    </View>
  );
}

const styles = StyleSheet.create({
  card: {
    backgroundColor: colors.surface,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.line,
    padding: space.lg,
  },
  body: { marginTop: space.sm, gap: space.sm },
});
