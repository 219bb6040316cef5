import { StyleSheet, View } from 'react-native';
import { colors, radius, space } from '@/constants/theme';
import { AppText } from './text';

type Props = { tone?: 'error' | 'info' | 'success'; children: string };

/** A form-level or page-level message; errors are announced to screen readers. */
export function Notice({ tone = 'info', children }: Props) {
  return (
    <View
      role={tone === 'error' ? 'alert' : 'status'}
      style={[styles.box, tone === 'error' ? styles.error : tone === 'success' ? styles.success : styles.info]}
    >
      <AppText style={tone === 'error' ? styles.errorText : undefined}>{children}</AppText>
    </View>
  );
}

const styles = StyleSheet.create({
  box: { borderRadius: radius.sm, padding: space.md, borderWidth: 1 },
  error: { backgroundColor: colors.warningSoft, borderColor: colors.warning },
  errorText: { color: colors.ink },
  info: { backgroundColor: colors.surfaceSunken, borderColor: colors.line },
  success: { backgroundColor: colors.threadSoft, borderColor: colors.thread },
});
