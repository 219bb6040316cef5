import { Pressable, StyleSheet, View } from 'react-native';
import { colors, radius, space } from '@/constants/theme';
import { spacePresses } from './keyboard';
import { AppText } from './text';

type Props = {
  label: string;
  /** `null` while the person has not answered: drawn off, and said to be off, but never saved as an answer. */
  value: boolean | null | undefined;
  onValueChange: (value: boolean) => void;
  disabled?: boolean;
  hint?: string;
};

/**
 * An on/off choice with its words: the whole row is the switch, so a tap on the words flips it as a
 * tap on the track does; Space and Enter flip it from the keyboard. Its name is the words shown.
 */
export function SwitchField({ label, value, onValueChange, disabled = false, hint }: Props) {
  const on = value === true;
  const flip = () => {
    if (!disabled) onValueChange(!on);
  };
  return (
    <Pressable
      role="switch"
      aria-checked={on}
      aria-disabled={disabled || undefined}
      disabled={disabled}
      onPress={flip}
      {...(disabled ? {} : spacePresses(flip))}
      style={[styles.row, disabled && styles.disabled]}
    >
      <View style={[styles.track, on ? styles.trackOn : styles.trackOff]}>
        <View style={[styles.thumb, on ? styles.thumbOn : null]} />
      </View>
      <View style={styles.words}>
        <AppText>{label}</AppText>
        {hint ? <AppText variant="caption">{hint}</AppText> : null}
      </View>
    </Pressable>
  );
}

const TRACK_W = 44;
const TRACK_H = 26;
const THUMB = 20;

const styles = StyleSheet.create({
  row: { flexDirection: 'row', alignItems: 'center', gap: space.md, minHeight: 44, borderRadius: radius.sm },
  disabled: { opacity: 0.6 },
  track: { width: TRACK_W, height: TRACK_H, borderRadius: TRACK_H / 2, borderWidth: 1, justifyContent: 'center', paddingHorizontal: 2, flexShrink: 0 },
  // The off track has a dark outline: its edge must stand out from the page (3:1 for a control's parts).
  trackOff: { backgroundColor: colors.surfaceSunken, borderColor: colors.inkMuted },
  trackOn: { backgroundColor: colors.thread, borderColor: colors.thread },
  thumb: { width: THUMB, height: THUMB, borderRadius: THUMB / 2, backgroundColor: colors.inkMuted },
  thumbOn: { backgroundColor: colors.chalk, transform: [{ translateX: TRACK_W - THUMB - 6 }] },
  words: { flex: 1, gap: 2 },
});
