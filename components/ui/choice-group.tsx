import { useEffect, useRef } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';
import { colors, fonts, radius, space } from '@/constants/theme';
import { arrowStep, focusSibling, onKeyDownProps } from './keyboard';
import { AppText } from './text';

type Props<T extends string> = {
  label: string;
  options: readonly { value: T; label: string }[];
  value: T | null | undefined;
  onChange: (value: T) => void;
  error?: string;
  /** Shown, and reachable, but not changeable (e.g. a sent report). */
  disabled?: boolean;
  /** Takes the focus when it appears (a row just added from the keyboard starts here). */
  autoFocus?: boolean;
};

/**
 * One choice out of a few, as a row of radio buttons that wraps on a narrow screen. A radio group
 * is one stop for the Tab key (the chosen option, or the first while none is chosen); the arrow
 * keys move between the options and choose, Space chooses the focused one, as in a native group.
 * Nothing is chosen for the person: focus alone never picks an answer.
 */
export function ChoiceGroup<T extends string>({ label, options, value, onChange, error, disabled = false, autoFocus = false }: Props<T>) {
  const tabStopRef = useRef<View>(null);
  const chosenIndex = options.findIndex((o) => o.value === value);
  const tabStop = chosenIndex >= 0 ? chosenIndex : 0;
  useEffect(() => {
    if (autoFocus) (tabStopRef.current as { focus?: () => void } | null)?.focus?.();
    // Only when it first appears: later renders must not pull the focus back.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, []);
  const choose = (option: { value: T }) => {
    if (!disabled) onChange(option.value);
  };
  const onKey = (index: number) =>
    onKeyDownProps((event) => {
      if (event.key === ' ' || event.key === 'Spacebar') {
        event.preventDefault();
        choose(options[index]);
        return;
      }
      const next = arrowStep(event.key, index, options.length);
      if (next === null) return;
      event.preventDefault();
      focusSibling(event, next);
      choose(options[next]);
    });
  return (
    <View style={styles.field} role="radiogroup" aria-label={label} aria-disabled={disabled || undefined}>
      <AppText variant="label">{label}</AppText>
      <View style={styles.row}>
        {options.map((option, index) => {
          const selected = option.value === value;
          return (
            <Pressable
              key={option.value}
              ref={index === tabStop ? tabStopRef : undefined}
              role="radio"
              aria-checked={selected}
              aria-label={option.label}
              tabIndex={index === tabStop ? 0 : -1}
              onPress={() => choose(option)}
              {...onKey(index)}
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
