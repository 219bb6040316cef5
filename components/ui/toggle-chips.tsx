import { Pressable, StyleSheet, View } from 'react-native';
import { colors, fonts, radius, space } from '@/constants/theme';
import { spacePresses } from './keyboard';
import { AppText } from './text';

type Props = {
  label: string;
  options: readonly { value: string; label: string }[];
  selected: readonly string[];
  onChange: (selected: string[]) => void;
  disabled?: boolean;
};

/** Several choices out of many, as checkable chips that wrap; keeps the options' order. */
export function ToggleChips({ label, options, selected, onChange, disabled = false }: Props) {
  return (
    <View style={styles.field} role="group" aria-label={label}>
      <AppText variant="label">{label}</AppText>
      <View style={styles.row}>
        {options.map((o) => {
          const on = selected.includes(o.value);
          const toggle = () =>
            onChange(on ? selected.filter((v) => v !== o.value) : options.map((x) => x.value).filter((v) => v === o.value || selected.includes(v)));
          return (
            <Pressable
              key={o.value}
              role="checkbox"
              aria-checked={on}
              aria-label={o.label}
              disabled={disabled}
              onPress={toggle}
              {...(disabled ? {} : spacePresses(toggle))}
              style={[styles.chip, on && styles.on]}
            >
              <AppText style={[styles.text, on && styles.onText]}>{o.label}</AppText>
            </Pressable>
          );
        })}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  field: { gap: space.xs },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.xs },
  chip: { minHeight: 36, justifyContent: 'center', paddingHorizontal: space.md, borderRadius: radius.lg, borderWidth: 1, borderColor: colors.line, backgroundColor: colors.surface },
  on: { borderColor: colors.thread, backgroundColor: colors.threadSoft },
  text: { fontFamily: fonts.medium, fontSize: 13, color: colors.inkMuted },
  onText: { color: colors.thread },
});
