import { StyleSheet, View } from 'react-native';
import { Button } from '@/components/ui/button';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { MeasurementField } from '@/components/ui/measurement-field';
import { TextField } from '@/components/ui/text-field';
import { colors, radius, space } from '@/constants/theme';
import { alterationKindsFor, type FitArea } from '@/server/domain/alterations';
import type { GarmentCategory } from '@/server/domain/garments';
import type { ReportDraft } from '@/server/domain/schemas/reports';
import type { LengthUnit } from '@/server/domain/units';

type Alteration = NonNullable<ReportDraft['alterations']>[number];
type Props = { category: GarmentCategory; value: Alteration[]; unit: LengthUnit; readOnly: boolean; onChange: (next: Alteration[]) => void; errors?: Record<string, string> };

const AREA_LABELS: Record<FitArea, string> = {
  waist: 'Waist', hip: 'Hip', seat: 'Seat', rise: 'Rise', thigh: 'Thigh', leg: 'Leg', hem: 'Hem', bust: 'Bust',
  shoulder: 'Shoulder', back: 'Back', chest: 'Chest', neck: 'Neck', arm: 'Arm', length: 'Length',
};

/** The alterations made: area, kind (for this garment), signed amount, front/back/both, note. */
export function AlterationsEditor({ category, value, unit, readOnly, onChange, errors = {} }: Props) {
  const kinds = alterationKindsFor(category);
  const areas = [...new Set(kinds.map((k) => k.area))];
  const set = (i: number, patch: Partial<Alteration>) => onChange(value.map((a, j) => (j === i ? { ...a, ...patch } : a)));
  return (
    <View style={styles.list}>
      {value.map((a, i) => (
        <View key={i} style={styles.item}>
          <ChoiceGroup label={`Alteration ${i + 1}: area`} options={areas.map((x) => ({ value: x, label: AREA_LABELS[x] }))} value={a.area} onChange={(area) => !readOnly && set(i, { area })} />
          <ChoiceGroup
            label={`Alteration ${i + 1}: what`}
            options={kinds.filter((k) => k.area === a.area || k.key === 'other').map((k) => ({ value: k.key, label: k.label }))}
            value={a.kind}
            onChange={(kind) => !readOnly && set(i, { kind })}
            error={errors[`alterations.${i}.kind`]}
          />
          {a.kind === 'other' ? <TextField label={`Alteration ${i + 1}: describe it`} value={a.otherText} editable={!readOnly} onChangeText={(otherText) => set(i, { otherText })} error={errors[`alterations.${i}.otherText`]} /> : null}
          <MeasurementField
            label={`Alteration ${i + 1}: amount`}
            hint="Positive adds (lengthen, let out); negative removes (shorten, take in)."
            unit={unit}
            allowNegative
            readOnly={readOnly}
            valueMm={a.amountMm ?? null}
            onChangeMm={(mm) => mm !== null && set(i, { amountMm: mm })}
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
          {!readOnly ? <Button label="Remove this alteration" tone="danger" onPress={() => onChange(value.filter((_, j) => j !== i))} /> : null}
        </View>
      ))}
      {!readOnly ? (
        <Button
          label="Add an alteration"
          tone="quiet"
          onPress={() => onChange([...value, { area: kinds[0].area, kind: kinds[0].key, amountMm: unit === 'in' ? 12.7 : 10, where: 'both', note: '', otherText: '' }])}
        />
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.md },
  item: { gap: space.sm, padding: space.md, borderRadius: radius.md, borderWidth: 1, borderColor: colors.line },
});
