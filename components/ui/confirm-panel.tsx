import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { colors, radius, space } from '@/constants/theme';
import { Button } from './button';
import { AppText } from './text';

type Props = {
  /** The question, naming what will be done to what, e.g. "Withdraw from Wide-leg trousers?". */
  question: string;
  /** What will happen, one consequence a line. */
  consequences: string[];
  confirmLabel: string;
  busyLabel?: string;
  cancelLabel?: string;
  onConfirm: () => Promise<void>;
  onCancel: () => void;
};

/**
 * An inline confirmation for a step that cannot be taken back: says what will happen and asks
 * once more. Inline rather than a pop-up, so it reads the same on a phone, a wide screen and to
 * a screen reader (a web pop-up from React Native does nothing).
 */
export function ConfirmPanel({ question, consequences, confirmLabel, busyLabel, cancelLabel = 'Cancel', onConfirm, onCancel }: Props) {
  const [busy, setBusy] = useState(false);
  const [failure, setFailure] = useState<string | null>(null);
  return (
    <View style={styles.box} role="group" aria-label={question}>
      <AppText variant="heading">{question}</AppText>
      {consequences.map((c) => (
        <AppText key={c}>{`\u2022 ${c}`}</AppText>
      ))}
      {failure ? (
        <AppText role="alert" style={styles.failure}>
          {failure}
        </AppText>
      ) : null}
      <View style={styles.buttons}>
        <Button
          label={confirmLabel}
          tone="danger"
          busy={busy}
          busyLabel={busyLabel}
          onPress={async () => {
            setBusy(true);
            setFailure(null);
            try {
              await onConfirm();
            } catch (error) {
              setFailure(error instanceof Error ? error.message : 'That did not work. Nothing was changed.');
              setBusy(false);
            }
          }}
        />
        <Button label={cancelLabel} tone="quiet" disabled={busy} onPress={onCancel} />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.sm, padding: space.md, borderRadius: radius.md, borderWidth: 1, borderColor: colors.warning, backgroundColor: colors.warningSoft },
  buttons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  failure: { color: colors.warning },
});
