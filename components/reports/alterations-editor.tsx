import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Button } from '@/components/ui/button';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { MeasurementField } from '@/components/ui/measurement-field';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { colors, radius, space } from '@/constants/theme';
import { alterationKindsFor, type FitArea } from '@/server/domain/alterations';
import type { GarmentCategory } from '@/server/domain/garments';
import { isBlankAlteration, missingInAlteration, type AlterationEntry } from '@/server/domain/schemas/reports';
import type { LengthUnit } from '@/server/domain/units';

type Props = {
  category: GarmentCategory;
  value: AlterationEntry[];
  unit: LengthUnit;
  readOnly: boolean;
  onChange: (next: AlterationEntry[]) => void;
  errors?: Record<string, string>;
  /** Told when a typed amount cannot be read (the field's label and the message) or can again (null). */
  onInputError?: (label: string, message: string | null) => void;
};

export const AREA_LABELS: Record<FitArea, string> = {
  waist: 'Waist', hip: 'Hip', seat: 'Seat', rise: 'Rise', thigh: 'Thigh', leg: 'Leg', hem: 'Hem', bust: 'Bust',
  shoulder: 'Shoulder', back: 'Back', chest: 'Chest', neck: 'Neck', arm: 'Arm', length: 'Length',
};

/** A new row: every answer empty until the tester gives it. */
export const NEW_ALTERATION: AlterationEntry = { area: null, kind: null, amountMm: null, where: null, note: '', otherText: '' };

/**
 * The alterations made: area, kind (for this garment), signed amount, front/back/both, note.
 * A new row has no answers; it counts once its kind and amount are given, and says so until then.
 */
export function AlterationsEditor({ category, value, unit, readOnly, onChange, errors = {}, onInputError }: Props) {
  const kinds = alterationKindsFor(category);
  const areas = [...new Set(kinds.filter((k) => k.key !== 'other').map((k) => k.area))];
  // The row just added with the button: its first question takes the focus, so a keyboard user
  // goes on from there rather than from the button below it.
  const [added, setAdded] = useState<number | null>(null);
  const set = (i: number, patch: Partial<AlterationEntry>) => onChange(value.map((a, j) => (j === i ? { ...a, ...patch } : a)));
  return (
    <View style={styles.list}>
      {value.length === 0 ? <AppText variant="caption">None yet. Add each change you made to the pattern, with its amount.</AppText> : null}
      {value.map((a, i) => {
        const missing = missingInAlteration(a);
        const amountLabel = `Alteration ${i + 1}: amount`;
        return (
          <View key={i} style={styles.item}>
            <ChoiceGroup
              autoFocus={added === i}
              label={`Alteration ${i + 1}: area`}
              options={areas.map((x) => ({ value: x, label: AREA_LABELS[x] }))}
              value={a.area}
              // A new area leaves a kind of another area unanswered rather than keeping a mismatch.
              onChange={(area) => !readOnly && set(i, { area, kind: a.kind && a.kind !== 'other' && kinds.find((k) => k.key === a.kind)?.area !== area ? null : a.kind })}
            />
            {a.area ? (
              <ChoiceGroup
                label={`Alteration ${i + 1}: what`}
                options={kinds.filter((k) => k.area === a.area || k.key === 'other').map((k) => ({ value: k.key, label: k.label }))}
                value={a.kind}
                onChange={(kind) => !readOnly && set(i, { kind })}
                error={errors[`alterations.${i}.kind`]}
              />
            ) : (
              <AppText variant="caption" style={errors[`alterations.${i}.kind`] ? styles.warn : undefined}>
                {errors[`alterations.${i}.kind`] ? `Alteration ${i + 1}: ${errors[`alterations.${i}.kind`]}: choose the area first.` : 'Choose the area first, then what you changed.'}
              </AppText>
            )}
            {a.kind === 'other' ? <TextField label={`Alteration ${i + 1}: describe it`} value={a.otherText} editable={!readOnly} onChangeText={(otherText) => set(i, { otherText })} error={errors[`alterations.${i}.otherText`]} /> : null}
            <MeasurementField
              label={amountLabel}
              hint="Positive adds (lengthen, let out); negative removes (shorten, take in)."
              unit={unit}
              allowNegative
              commitWhileTyping
              readOnly={readOnly}
              valueMm={a.amountMm}
              onChangeMm={(amountMm) => amountMm !== a.amountMm && set(i, { amountMm })}
              onInputError={(message) => onInputError?.(amountLabel, message)}
              error={errors[`alterations.${i}.amountMm`]}
            />
            <ChoiceGroup
              label={`Alteration ${i + 1}: where`}
              options={[
                { value: 'front', label: 'Front' },
                { value: 'back', label: 'Back' },
                { value: 'both', label: 'Both' },
              ]}
              value={a.where}
              onChange={(where) => !readOnly && set(i, { where })}
            />
            <TextField label={`Alteration ${i + 1}: note`} value={a.note} editable={!readOnly} onChangeText={(note) => set(i, { note })} />
            {!isBlankAlteration(a) && Object.keys(missing).length ? (
              <AppText variant="caption" style={styles.pending}>
                {`Not counted yet: ${Object.values(missing).join('; ').toLowerCase()}.`}
              </AppText>
            ) : null}
            {!readOnly ? <Button label={`Remove alteration ${i + 1}`} tone="danger" onPress={() => onChange(value.filter((_, j) => j !== i))} /> : null}
          </View>
        );
      })}
      {!readOnly ? (
        <Button
          label="Add an alteration"
          tone="quiet"
          onPress={() => {
            setAdded(value.length);
            onChange([...value, { ...NEW_ALTERATION }]);
          }}
        />
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.md },
  item: { gap: space.sm, padding: space.md, borderRadius: radius.md, borderWidth: 1, borderColor: colors.line },
  pending: { color: colors.inkMuted, fontStyle: 'italic' },
  warn: { color: colors.warning },
});
