import { useEffect, useRef, useState } from 'react';
import { TextInput, View } from 'react-native';
import { colors } from '@/constants/theme';
import { formatLength, parseLength, type LengthUnit, type ParseResult } from '@/server/domain/units';
import { AppText } from './text';
import { fieldStyles } from './text-field';

type Props = {
  label: string;
  /** The stored length in millimetres, or null when not given. */
  valueMm: number | null;
  /** The person's preferred unit: how the value is shown and what a bare number means. */
  unit: LengthUnit;
  /** Called on blur (or submit) with the new length, or null when the field is emptied. Never with a bad value. */
  onChangeMm: (mm: number | null) => void;
  /** A message from outside (the form's schema, the server), without the field's name: the label is put in front. */
  error?: string;
  /** Signed amounts, e.g. an alteration of −1/2 in. */
  allowNegative?: boolean;
  hint?: string;
  /** Overrides the example shown in the empty field (the default suits a small amount). */
  placeholder?: string;
  /** Shows the value without letting it change (e.g. for a grader). */
  readOnly?: boolean;
  /** Hides the visible label (in a table whose header names the column); it stays the accessible name. */
  hideLabel?: boolean;
  /** Reads the typed text and shows a stored value; defaults to body lengths (parseLength / formatLength). */
  parse?: (text: string) => ParseResult;
  format?: (mm: number) => string;
  /** For react-hook-form's touched state (Controller's field.onBlur). */
  onBlur?: () => void;
  /** Told whenever the typed text becomes unreadable (the message) or readable again (null), so a form can hold back its submit. */
  onInputError?: (message: string | null) => void;
  /**
   * Also hands on each readable value while the person types (the text is tidied on blur), for
   * forms saved as they go: a reload right after typing must not lose what was typed.
   */
  commitWhileTyping?: boolean;
};

function shown(valueMm: number | null, unit: LengthUnit, format?: (mm: number) => string): string {
  return valueMm === null ? '' : format ? format(valueMm) : formatLength(valueMm, unit);
}

/**
 * A length input that takes what people actually type ("1 3/8", "3.5 cm", "35mm" …, see
 * server/domain/units.ts), reads it when the person leaves the field, and then shows the stored
 * value back in their unit, so they see what was understood. Works with react-hook-form through a
 * Controller: value → valueMm, onChange → onChangeMm, onBlur → onBlur.
 */
export function MeasurementField({
  label,
  valueMm,
  unit,
  onChangeMm,
  error,
  allowNegative = false,
  hint,
  placeholder: placeholderOverride,
  readOnly = false,
  hideLabel = false,
  parse,
  format,
  onBlur,
  onInputError,
  commitWhileTyping = false,
}: Props) {
  const [text, setText] = useState(() => shown(valueMm, unit, format));
  const [inputError, setInputError] = useState<string | null>(null);
  const [focused, setFocused] = useState(false);
  // Only text the person has edited is read again: re-reading the shown "1 3/8 in" of a stored
  // 35 mm would quietly replace it with 34.925 mm on every visit to the field.
  const [dirty, setDirty] = useState(false);

  // A new value or unit from outside (form reset, unit switch) replaces the text unless the person
  // is typing. Adjusted during render rather than in an effect so there is no flash of the old text.
  const [synced, setSynced] = useState({ valueMm, unit });
  if (synced.valueMm !== valueMm || synced.unit !== unit) {
    setSynced({ valueMm, unit });
    if (!focused) {
      setText(shown(valueMm, unit, format));
      setDirty(false);
      setInputError(null);
    }
  }

  function reportInputError(message: string | null) {
    setInputError(message);
    onInputError?.(message);
  }

  // A field that goes away (a removed row or column) takes its unreadable text with it.
  const unreadable = useRef<{ message: string | null; tell?: (message: string | null) => void }>({ message: null });
  useEffect(() => {
    unreadable.current = { message: inputError, tell: onInputError };
  });
  useEffect(
    () => () => {
      if (unreadable.current.message) unreadable.current.tell?.(null);
    },
    [],
  );

  function readWhileTyping(next: string) {
    if (!commitWhileTyping) return;
    if (next.trim() === '') {
      if (valueMm !== null) onChangeMm(null);
      return;
    }
    const result = parse ? parse(next) : parseLength(next, unit, { allowNegative });
    if (result.ok && result.mm !== valueMm) onChangeMm(result.mm);
  }

  function commit() {
    if (!dirty) return;
    if (text.trim() === '') {
      // Emptying a field clears it; whether it may be empty is the form's rule, not this field's.
      reportInputError(null);
      setText('');
      setDirty(false);
      if (valueMm !== null) onChangeMm(null);
      return;
    }
    const result = parse ? parse(text) : parseLength(text, unit, { allowNegative });
    if (!result.ok) {
      // Keep what was typed so it can be corrected, and keep the last good value in the form.
      reportInputError(result.message);
      return;
    }
    reportInputError(null);
    setText(shown(result.mm, unit, format));
    setDirty(false);
    onChangeMm(result.mm);
  }

  const message = inputError ?? error;
  const placeholder = placeholderOverride ?? (unit === 'in' ? (allowNegative ? 'e.g. -1/2 in or 1 3/8' : 'e.g. 1 3/8 in') : allowNegative ? 'e.g. -1.5 cm or 3.5' : 'e.g. 3.5 cm');

  return (
    <View style={styles.field}>
      {hideLabel ? null : <AppText variant="label">{label}</AppText>}
      {hint ? (
<AppText variant="caption">{hint}</AppText>
      ) : null}
      <TextInput
        aria-label={label}
        accessibilityHint={hint}
        value={text}
        onChangeText={(next) => {
          setText(next);
          setDirty(true);
          readWhileTyping(next);
        }}
        onFocus={() => setFocused(true)}
        onBlur={() => {
          setFocused(false);
          commit();
          onBlur?.();
        }}
        onSubmitEditing={commit}
        placeholder={placeholder}
        placeholderTextColor={colors.inkMuted}
        autoCapitalize="none"
        autoCorrect={false}
        spellCheck={false}
        inputMode="text"
        editable={!readOnly}
        style={[styles.input, focused && styles.focused, message ? styles.invalid : null, readOnly && styles.readOnly]}
      />
      {message ? (
        <AppText role="alert" aria-live="polite" variant="caption" style={styles.error}>
          {`${label}: ${message}`}
        </AppText>
      ) : null}
    </View>
  );
}

const styles = fieldStyles;
