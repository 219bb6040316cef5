import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { MeasurementField } from '@/components/ui/measurement-field';
import { SwitchField } from '@/components/ui/switch-field';
import { TextField } from '@/components/ui/text-field';
import { space } from '@/constants/theme';
import { fabricExamples } from '@/server/domain/category-wording';
import type { ReportDraft } from '@/server/domain/schemas/reports';
import { formatFabricLength, parseFabricLength, type FabricUnit, type LengthUnit } from '@/server/domain/units';

type Fabric = NonNullable<ReportDraft['fabric']>;
type Props = {
  value: Fabric | undefined;
  lengthUnit: LengthUnit;
  fabricUnit: FabricUnit;
  readOnly: boolean;
  onChange: (next: Fabric) => void;
  /** The pattern's fabric kind: the examples shown are of that kind. */
  fabricKind?: string | null;
  errors?: Record<string, string>;
  /** Told when a typed length cannot be read (the field's label and the message) or can again (null). */
  onInputError?: (label: string, message: string | null) => void;
};

export const EMPTY_FABRIC: Fabric = { kind: '', fibre: '', widthMm: null, usedMm: null, stretchPct: null, napped: false };

/**
 * The fabric the tester sewed with: what it was, how wide, how much of it the garment took and
 * whether it had to be cut one way. The studio compares the length used with the stated needs.
 */
export function FabricUsedEditor({ value, lengthUnit, fabricUnit, readOnly, onChange, fabricKind, errors = {}, onInputError }: Props) {
  const fabric = { ...EMPTY_FABRIC, ...(value ?? {}) };
  const set = (patch: Partial<Fabric>) => onChange({ ...fabric, ...patch });
  const [stretchText, setStretchText] = useState(fabric.stretchPct == null ? '' : String(fabric.stretchPct));
  return (
    <View style={styles.list}>
      <TextField label="Fabric" hint={`e.g. ${fabricExamples(fabricKind)}`} value={fabric.kind} editable={!readOnly} onChangeText={(kind) => set({ kind })} error={errors['fabric.kind']} />
      <TextField label="Fibre content" hint="e.g. 98% cotton, 2% elastane" value={fabric.fibre} editable={!readOnly} onChangeText={(fibre) => set({ fibre })} error={errors['fabric.fibre']} />
      <MeasurementField
        label="Fabric width"
        unit={lengthUnit}
        placeholder={lengthUnit === 'in' ? 'e.g. 54' : 'e.g. 140 cm'}
        readOnly={readOnly}
        commitWhileTyping
        valueMm={fabric.widthMm}
        onChangeMm={(widthMm) => set({ widthMm })}
        onInputError={(message) => onInputError?.('Fabric width', message)}
        error={errors['fabric.widthMm']}
      />
      <MeasurementField
        label="Length used"
        hint="What the garment took, as cut: not what you bought."
        unit={lengthUnit}
        placeholder={fabricUnit === 'yd' ? 'e.g. 2 1/4 yd' : 'e.g. 2.1 m'}
        parse={(text) => parseFabricLength(text, fabricUnit)}
        format={(mm) => formatFabricLength(mm, fabricUnit)}
        readOnly={readOnly}
        commitWhileTyping
        valueMm={fabric.usedMm}
        onChangeMm={(usedMm) => set({ usedMm })}
        onInputError={(message) => onInputError?.('Length used', message)}
        error={errors['fabric.usedMm']}
      />
      <TextField
        label="Stretch (%)"
        hint="How far 10 cm stretches across the grain, as a percentage; leave empty for a woven without stretch."
        inputMode="decimal"
        editable={!readOnly}
        value={stretchText}
        onChangeText={(text) => {
          setStretchText(text);
          const bare = text.trim().replace(/%$/, '').trim();
          if (bare === '') set({ stretchPct: null });
          else if (/^\d+(\.\d+)?$/.test(bare)) set({ stretchPct: Number(bare) });
        }}
        error={errors['fabric.stretchPct'] ?? (stretchText.trim() && !/^\d+(\.\d+)?\s*%?$/.test(stretchText.trim()) ? 'Write a number, e.g. 20' : undefined)}
      />
      <SwitchField label="Napped or one-way fabric" hint="Every piece cut the same way up." disabled={readOnly} value={fabric.napped} onValueChange={(napped) => set({ napped })} />
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
});
