import { Pressable, StyleSheet, View } from 'react-native';
import { colors, fonts, radius, space } from '@/constants/theme';
import { AppText } from './text';

type Props<T extends string> = {
  label: string;
  options: readonly { value: T; label: string }[];
  value: T | null | undefined;
  onChange: (value: T) => void;
  error?: string;
};

/** One choice out of a few, as a row of radio buttons that wraps on a narrow screen. */
export function ChoiceGroup<T extends string>({ label, options, value, onChange, error }: Props<T>) {
  return (
    <View style={styles.field} role="radiogroup" aria-label={label}>
      <AppText variant="label">{label}</AppText>
      <View style={styles.row}>
        {options.map((option) => {
          const selected = option.value === value;
          return (
            <Pressable
              key={option.value}
              role="radio"
              aria-checked={selected}
              aria-label={option.label}
              onPress={() => onChange(option.value)}
              style={[styles.option, selected && styles.selected]}
            >
              <AppText style={[styles.optionLabel, selected && styles.selectedLabel]}>{option.label}</AppText>
            </Pressable>
          );
        })}
      </View>
      {error ? (
        <AppText role="alert" variant="caption" style={styles.error}>
          {`${label}: ${error}`}
        </AppText>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  field: { gap: space.xs },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  option: {
    minHeight: 40,
    justifyContent: 'center',
    paddingHorizontal: space.md,
    borderRadius: radius.sm,
    borderWidth: 1,
    borderColor: colors.line,
    backgroundColor: colors.surface,
  },
  selected: { borderColor: colors.thread, backgroundColor: colors.threadSoft },
  optionLabel: { fontFamily: fonts.medium, fontSize: 14, color: colors.inkMuted },
  selectedLabel: { color: colors.thread },
  error: { color: colors.warning, fontFamily: fonts.medium },
});
