import { ActivityIndicator, Pressable, StyleSheet, View } from 'react-native';
import { colors, fonts, radius, space } from '@/constants/theme';
import { AppText } from './text';

type Props = {
  label: string;
  onPress: () => void;
  busy?: boolean;
  /** Shown instead of the label while busy, e.g. "Signing in…". */
  busyLabel?: string;
  disabled?: boolean;
  tone?: 'primary' | 'quiet' | 'danger';
  /** A fuller name for screen readers when the visible label relies on its row, e.g. "Withdraw". */
  accessibleLabel?: string;
};

export function Button({ label, onPress, busy = false, busyLabel, disabled = false, tone = 'primary', accessibleLabel }: Props) {
  const inactive = busy || disabled;
  return (
    <Pressable
      role="button"
      aria-label={busy && busyLabel ? busyLabel : (accessibleLabel ?? label)}
      aria-busy={busy}
      aria-disabled={inactive}
      disabled={inactive}
      onPress={onPress}
      style={({ pressed }) => [styles.base, styles[tone], pressed && styles.pressed, inactive && styles.inactive]}
    >
      <View style={styles.row}>
        {busy ? <ActivityIndicator aria-hidden size="small" color={tone === 'primary' ? colors.chalk : colors.thread} /> : null}
        <AppText style={[styles.label, tone === 'primary' ? styles.onPrimary : tone === 'danger' ? styles.onDanger : styles.onQuiet]}>
          {busy && busyLabel ? busyLabel : label}
        </AppText>
      </View>
    </Pressable>
  );
}

const styles = StyleSheet.create({
  base: {
    alignSelf: 'flex-start',
    minHeight: 44,
    justifyContent: 'center',
    borderRadius: radius.sm,
    paddingHorizontal: space.lg,
    paddingVertical: space.sm,
  },
  primary: { backgroundColor: colors.thread },
  quiet: { borderWidth: 1, borderColor: colors.thread, backgroundColor: colors.surface },
  danger: { borderWidth: 1, borderColor: colors.warning, backgroundColor: colors.surface },
  pressed: { opacity: 0.85 },
  inactive: { opacity: 0.6 },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  label: { fontFamily: fonts.semibold, fontSize: 15 },
  onPrimary: { color: colors.chalk },
  onQuiet: { color: colors.thread },
  onDanger: { color: colors.warning },
});
