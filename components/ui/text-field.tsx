import { forwardRef, useState } from 'react';
import { StyleSheet, TextInput, View, type TextInputProps } from 'react-native';
import { colors, fonts, radius, space } from '@/constants/theme';
import { AppText } from './text';

type Props = Omit<TextInputProps, 'style'> & { label: string; error?: string; hint?: string };

/** A labelled text input with its error beside it (the label names the field in the message). */
export const TextField = forwardRef<TextInput, Props>(function TextField({ label, error, hint, ...input }, ref) {
  const [focused, setFocused] = useState(false);
  return (
    <View style={styles.field}>
      <AppText variant="label">{label}</AppText>
      {hint ? <AppText variant="caption">{hint}</AppText> : null}
      <TextInput
        ref={ref}
        aria-label={label}
        placeholderTextColor={colors.inkMuted}
        {...input}
        onFocus={(e) => {
          setFocused(true);
          input.onFocus?.(e);
        }}
        onBlur={(e) => {
          setFocused(false);
          input.onBlur?.(e);
        }}
        style={[styles.input, focused && styles.focused, error ? styles.invalid : null, input.multiline && styles.multiline]}
      />
      {error ? (
        <AppText role="alert" aria-live="polite" variant="caption" style={styles.error}>
          {`${label}: ${error}`}
        </AppText>
      ) : null}
    </View>
  );
});

/** The look of every text input, shared with the measurement field. */
export const fieldStyles = StyleSheet.create({
  field: { gap: space.xs },
  input: {
    minHeight: 44,
    borderWidth: 1,
    borderColor: colors.line,
    borderRadius: radius.sm,
    backgroundColor: colors.surface,
    paddingHorizontal: space.md,
    paddingVertical: space.sm,
    fontFamily: fonts.regular,
    fontSize: 16,
    color: colors.ink,
  },
  multiline: { minHeight: 88, textAlignVertical: 'top' },
  focused: { borderColor: colors.focus, borderWidth: 2 },
  invalid: { borderColor: colors.warning, borderWidth: 2 },
  readOnly: { backgroundColor: colors.surfaceSunken, borderColor: colors.surfaceSunken },
  error: { color: colors.warning, fontFamily: fonts.medium },
});
const styles = fieldStyles;
