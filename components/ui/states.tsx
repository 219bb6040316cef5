import { ActivityIndicator, StyleSheet, View } from 'react-native';
import { colors, space } from '@/constants/theme';
import { Button } from './button';
import { Notice } from './notice';
import { AppText } from './text';

export function Loading({ label = 'Loading…' }: { label?: string }) {
  return (
    <View style={styles.center} role="progressbar" aria-label={label}>
      {/* The row is the named progress bar; the spinner inside is decoration. */}
      <ActivityIndicator color={colors.thread} aria-hidden />
      <AppText variant="caption">{label}</AppText>
    </View>
  );
}

export function LoadError({ error, onRetry }: { error: Error; onRetry?: () => void }) {
  return (
    <View style={styles.stack}>
      <Notice tone="error">{`Could not load this: ${error.message}`}</Notice>
      {onRetry ? <Button label="Try again" tone="quiet" onPress={onRetry} /> : null}
    </View>
  );
}

export function Empty({ children }: { children: string }) {
  return <AppText variant="caption">{children}</AppText>;
}

const styles = StyleSheet.create({
  center: { padding: space.xl, alignItems: 'center', gap: space.sm },
  stack: { gap: space.sm },
});
