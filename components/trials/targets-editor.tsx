import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { MeasurementField } from '@/components/ui/measurement-field';
import { Notice } from '@/components/ui/notice';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { ToggleChips } from '@/components/ui/toggle-chips';
import { space } from '@/constants/theme';
import { updateTrial, type TrialDetail } from '@/hooks/use-trials';
import { COMMON_TESTERS_PER_SIZE, DEFAULT_HEIGHT_BANDS, heightBandProblems } from '@/server/domain/coverage';
import type { LengthUnit } from '@/server/domain/units';

type Props = { studioId: string; trial: TrialDetail; unit: LengthUnit; canEdit: boolean };

/** Testers wanted per size, the height bands (with editable limits) and the variants to cover. */
export function TargetsEditor({ studioId, trial, unit, canEdit }: Props) {
  const sizes = trial.pattern?.sizes ?? [];
  const [targets, setTargets] = useState<Record<string, string>>(() =>
    Object.fromEntries(sizes.map((s) => [s.id, String(trial.coverage.sizes.find((c) => c.sizeId === s.id)?.target ?? '')])),
  );
  const [bands, setBands] = useState(() => (trial.coverage.heightBands.length ? trial.coverage.heightBands : DEFAULT_HEIGHT_BANDS.map((b) => ({ ...b }))));
  const [variants, setVariants] = useState<string[]>(trial.coverage.variants);
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const problems = heightBandProblems(bands, unit);

  const save = async () => {
    setMessage(null);
    const bad = sizes.filter((s) => targets[s.id]?.trim() && !/^\d{1,2}$/.test(targets[s.id].trim()));
    if (bad.length) {
      setMessage({ tone: 'error', text: `Testers wanted must be a whole number for size ${bad.map((s) => s.label).join(', ')}.` });
      return;
    }
    try {
      await updateTrial(studioId, trial.id, {
        coverage: {
          sizes: sizes.flatMap((s) => (Number(targets[s.id]) > 0 ? [{ sizeId: s.id, target: Number(targets[s.id]) }] : [])),
          heightBands: bands,
          variants,
        },
      });
      setMessage({ tone: 'success', text: 'Targets saved.' });
    } catch (error) {
      setMessage({ tone: 'error', text: error instanceof Error ? error.message : 'Not saved.' });
    }
  };

  return (
    <Card title="Coverage targets">
      <AppText variant="caption">{`Testers wanted in each size; two or three per size is common practice (default ${COMMON_TESTERS_PER_SIZE}). Leave a size empty to leave it out.`}</AppText>
      <View style={styles.sizes}>
        {sizes.map((s) => (
          <View key={s.id} style={styles.size}>
            <TextField label={`Size ${s.label}`} value={targets[s.id] ?? ''} onChangeText={(v) => setTargets((t) => ({ ...t, [s.id]: v }))} inputMode="numeric" editable={canEdit} placeholder="0" />
          </View>
        ))}
      </View>
      {canEdit ? <Button label={`Want ${COMMON_TESTERS_PER_SIZE} in every size`} tone="quiet" onPress={() => setTargets(Object.fromEntries(sizes.map((s) => [s.id, String(COMMON_TESTERS_PER_SIZE)])))} /> : null}
      <AppText variant="label">Height bands</AppText>
      {bands.map((band, i) => (
        <View key={band.id} style={styles.band}>
          <TextField label={`Band ${i + 1} name`} value={band.label} editable={canEdit} onChangeText={(label) => setBands((b) => b.map((x, j) => (j === i ? { ...x, label } : x)))} />
          <MeasurementField label={`${band.label}: from`} unit={unit} valueMm={band.minMm} readOnly={!canEdit} onChangeMm={(minMm) => setBands((b) => b.map((x, j) => (j === i ? { ...x, minMm } : x)))} placeholder="no lower limit" />
          <MeasurementField label={`${band.label}: below`} unit={unit} valueMm={band.maxMm} readOnly={!canEdit} onChangeMm={(maxMm) => setBands((b) => b.map((x, j) => (j === i ? { ...x, maxMm } : x)))} placeholder="no upper limit" />
        </View>
      ))}
      {problems.map((p) => (
        <Notice key={p} tone="error">
          {p}
        </Notice>
      ))}
      {trial.pattern?.variants.length ? (
        <ToggleChips
          label="Variants to cover"
          options={trial.pattern.variants.map((v) => ({ value: v.id, label: v.name }))}
          selected={variants}
          disabled={!canEdit}
          onChange={setVariants}
        />
      ) : null}
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
      {canEdit ? <Button label="Save targets" onPress={save} disabled={problems.length > 0} /> : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  sizes: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  size: { width: 96 },
  band: { gap: space.xs, paddingVertical: space.xs },
});
