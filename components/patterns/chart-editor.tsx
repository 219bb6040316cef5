import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { MeasurementField } from '@/components/ui/measurement-field';
import { Notice } from '@/components/ui/notice';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { ToggleChips } from '@/components/ui/toggle-chips';
import { colors, space } from '@/constants/theme';
import { ApiError } from '@/hooks/api';
import { saveChart, type PatternDetail } from '@/hooks/use-patterns';
import { bodyMeasurementsFor, finishedMeasurementsFor, heightPlaceholder, newVariantFor, VARIANT_KIND_LABELS, variantExplanation, variantKindsFor } from '@/server/domain/category-wording';
import { FINISHED_MEASUREMENTS, type FabricKind, type GarmentCategory } from '@/server/domain/garments';
import { MEASUREMENTS } from '@/server/domain/measurements';
import type { LengthUnit } from '@/server/domain/units';
import { ChartChecksPanel } from './chart-checks-panel';
import { chartInputFromDraft, describeChartPath, draftFromChart, newKey, nextSizeLabel, type ChartDraft } from './chart-draft';
import { ChartValuesEditor } from './chart-values-editor';

type Props = { studioId: string; pattern: PatternDetail; unit: LengthUnit; canEdit: boolean };

const BODY_OPTIONS = MEASUREMENTS.map((m) => ({ value: m.key, label: m.label }));
const FINISHED_OPTIONS = FINISHED_MEASUREMENTS.map((m) => ({ value: m.key, label: m.label }));
const labelOf = (options: { value: string; label: string }[], key: string) => options.find((o) => o.value === key)?.label ?? key;
/** The garment's usual measurements first (and any already in the chart); the rest on request. */
const offered = (options: { value: string; label: string }[], usual: readonly string[], chosen: readonly string[], all: boolean) =>
  all ? options : options.filter((o) => usual.includes(o.value) || chosen.includes(o.value));

/** The size chart of a pattern: sizes in order, measurement columns, values, variants; saved as a whole. */
export function ChartEditor({ studioId, pattern, unit, canEdit }: Props) {
  const [draft, setDraft] = useState<ChartDraft>(() => draftFromChart(pattern.chart));
  const category = pattern.category as GarmentCategory;
  const [allBody, setAllBody] = useState(false);
  const [allFinished, setAllFinished] = useState(false);
  const bodyOptions = offered(BODY_OPTIONS, bodyMeasurementsFor(category), draft.bodyColumns, allBody);
  const finishedOptions = offered(FINISHED_OPTIONS, finishedMeasurementsFor(category), draft.finishedColumns, allFinished);
  const variantKinds = variantKindsFor(category);
  const [busy, setBusy] = useState(false);
  const [result, setResult] = useState<{ tone: 'error' | 'success'; message: string; problems: string[] } | null>(null);
  // Cells whose typed text could not be read, by the cell's label: while any is left, the chart
  // is not saved (saving would empty the cell, or keep an older value the field no longer shows).
  const [unreadable, setUnreadable] = useState<Record<string, string>>({});
  const noteUnreadable = (label: string, message: string | null) =>
    setUnreadable((now) => {
      if (message === null) {
        if (!(label in now)) return now;
        const { [label]: _gone, ...rest } = now;
        return rest;
      }
      return now[label] === message ? now : { ...now, [label]: message };
    });
  const update = (change: (d: ChartDraft) => ChartDraft) => {
    setDraft(change);
    setResult(null);
  };

  const moveSize = (index: number, by: -1 | 1) =>
    update((d) => {
      const sizes = [...d.sizes];
      const [size] = sizes.splice(index, 1);
      sizes.splice(index + by, 0, size);
      return { ...d, sizes };
    });

  const save = async () => {
    const bad = Object.entries(unreadable);
    if (bad.length) {
      setResult({
        tone: 'error',
        message: `Not saved: ${bad.length === 1 ? 'one value' : `${bad.length} values`} could not be read. Correct ${bad.length === 1 ? 'it' : 'them'} first; nothing was changed.`,
        problems: bad.map(([label, message]) => `${label}: ${message}`),
      });
      return;
    }
    setBusy(true);
    try {
      const saved = await saveChart(studioId, pattern.id, chartInputFromDraft(draft));
      setDraft(draftFromChart(saved.chart));
      setResult({ tone: 'success', message: 'Size chart saved.', problems: [] });
    } catch (error) {
      const problems = error instanceof ApiError && error.fields ? Object.entries(error.fields).map(([path, what]) => `${describeChartPath(path, draft)}: ${what}`) : [];
      setResult({ tone: 'error', message: error instanceof Error ? error.message : 'Not saved.', problems });
    } finally {
      setBusy(false);
    }
  };

  const bodyColumns = draft.bodyColumns.map((k) => ({ key: k, label: labelOf(BODY_OPTIONS, k) }));
  const finishedColumns = draft.finishedColumns.map((k) => ({ key: k, label: labelOf(FINISHED_OPTIONS, k) }));

  return (
    <>
      <Card title="Size chart">
        <MeasurementField
          label="Drafted for a height of"
          hint="The height the sample size is drafted for; leg advice compares testers with it."
          unit={unit}
          placeholder={heightPlaceholder(unit)}
          valueMm={draft.draftedHeightMm}
          readOnly={!canEdit}
          onChangeMm={(mm) => update((d) => ({ ...d, draftedHeightMm: mm }))}
          onInputError={(message) => noteUnreadable('Drafted for a height of', message)}
        />
        <ToggleChips label="Body measurements in the chart" options={bodyOptions} selected={draft.bodyColumns} disabled={!canEdit} onChange={(bodyColumns) => update((d) => ({ ...d, bodyColumns }))} />
        {canEdit && bodyOptions.length < BODY_OPTIONS.length ? (
          <Button label={`More body measurements (${BODY_OPTIONS.length - bodyOptions.length})`} tone="quiet" onPress={() => setAllBody(true)} />
        ) : null}

        <AppText variant="label">Sizes, smallest first</AppText>
        {draft.sizes.map((size, i) => (
          <View key={size.key} style={styles.sizeRow}>
            <View style={styles.grow}>
              <TextField
                label={`Size ${i + 1} label`}
                value={size.label}
                editable={canEdit}
                onChangeText={(label) => update((d) => ({ ...d, sizes: d.sizes.map((s) => (s.key === size.key ? { ...s, label } : s)) }))}
              />
            </View>
            {canEdit ? (
              <View style={styles.sizeButtons}>
                <Button label="Up" accessibleLabel={`Move size ${size.label} up`} tone="quiet" disabled={i === 0} onPress={() => moveSize(i, -1)} />
                <Button label="Down" accessibleLabel={`Move size ${size.label} down`} tone="quiet" disabled={i === draft.sizes.length - 1} onPress={() => moveSize(i, 1)} />
                <Button label="Remove" accessibleLabel={`Remove size ${size.label}`} tone="danger" onPress={() => update((d) => ({ ...d, sizes: d.sizes.filter((s) => s.key !== size.key) }))} />
              </View>
            ) : null}
          </View>
        ))}
        {canEdit ? (
          <Button
            label="Add a size"
            tone="quiet"
            onPress={() =>
              update((d) => ({ ...d, sizes: [...d.sizes, { key: newKey(), label: nextSizeLabel(d.sizes.map((s) => s.label)), bodyMm: {}, finishedMm: {} }] }))
            }
          />
        ) : null}

        <AppText variant="label">Body measurements per size</AppText>
        <ChartValuesEditor
          title="Body"
          columns={bodyColumns}
          rows={draft.sizes.map((s) => ({ key: s.key, label: s.label, values: s.bodyMm }))}
          unit={unit}
          readOnly={!canEdit}
          onChange={(row, col, mm) => update((d) => ({ ...d, sizes: d.sizes.map((s) => (s.key === row ? { ...s, bodyMm: { ...s.bodyMm, [col]: mm } } : s)) }))}
          onInputError={noteUnreadable}
        />

        <ToggleChips label="Finished garment measurements" options={finishedOptions} selected={draft.finishedColumns} disabled={!canEdit} onChange={(finishedColumns) => update((d) => ({ ...d, finishedColumns }))} />
        {canEdit && finishedOptions.length < FINISHED_OPTIONS.length ? (
          <Button label={`More finished measurements (${FINISHED_OPTIONS.length - finishedOptions.length})`} tone="quiet" onPress={() => setAllFinished(true)} />
        ) : null}
        {finishedColumns.length ? (
          <ChartValuesEditor
            title="Finished"
            columns={finishedColumns}
            rows={draft.sizes.map((s) => ({ key: s.key, label: s.label, values: s.finishedMm }))}
            unit={unit}
            readOnly={!canEdit}
            onChange={(row, col, mm) => update((d) => ({ ...d, sizes: d.sizes.map((s) => (s.key === row ? { ...s, finishedMm: { ...s.finishedMm, [col]: mm } } : s)) }))}
            onInputError={noteUnreadable}
          />
        ) : null}

        <AppText variant="label">Variants</AppText>
        <AppText variant="caption">{variantExplanation(category)}</AppText>
        {draft.variants.map((variant) => (
          <View key={variant.key} style={styles.variant}>
            <TextField
              label="Variant name"
              value={variant.name}
              editable={canEdit}
              onChangeText={(name) => update((d) => ({ ...d, variants: d.variants.map((v) => (v.key === variant.key ? { ...v, name } : v)) }))}
            />
            <ChoiceGroup
              label={`Kind of ${variant.name || 'variant'}`}
              // The garment's kinds, and the variant's own kind if it was saved as another.
              options={[...new Set([...variantKinds, variant.kind])].map((k) => ({ value: k, label: VARIANT_KIND_LABELS[k] }))}
              value={variant.kind}
              onChange={(kind) => canEdit && update((d) => ({ ...d, variants: d.variants.map((v) => (v.key === variant.key ? { ...v, kind } : v)) }))}
            />
            <ToggleChips
              label={`Measurements ${variant.name || 'the variant'} changes`}
              options={bodyColumns.map((c) => ({ value: c.key, label: c.label }))}
              selected={variant.columns}
              disabled={!canEdit}
              onChange={(columns) => update((d) => ({ ...d, variants: d.variants.map((v) => (v.key === variant.key ? { ...v, columns } : v)) }))}
            />
            <ChartValuesEditor
              title={variant.name || 'Variant'}
              columns={bodyColumns.filter((c) => variant.columns.includes(c.key))}
              rows={draft.sizes.map((s) => ({ key: s.key, label: s.label, values: variant.values[s.key] ?? {} }))}
              unit={unit}
              readOnly={!canEdit}
              onChange={(row, col, mm) =>
                update((d) => ({
                  ...d,
                  variants: d.variants.map((v) => (v.key === variant.key ? { ...v, values: { ...v.values, [row]: { ...v.values[row], [col]: mm } } } : v)),
                }))
              }
              onInputError={noteUnreadable}
            />
            {canEdit ? <Button label="Remove variant" tone="danger" onPress={() => update((d) => ({ ...d, variants: d.variants.filter((v) => v.key !== variant.key) }))} /> : null}
          </View>
        ))}
        {canEdit ? (
          <Button
            label="Add a variant"
            tone="quiet"
            onPress={() => update((d) => ({ ...d, variants: [...d.variants, { key: newKey(), ...newVariantFor(category, d.bodyColumns), values: {} }] }))}
          />
        ) : null}

        {result ? (
          <View style={styles.result}>
            <Notice tone={result.tone}>{result.message}</Notice>
            {result.problems.map((p) => (
              <AppText key={p} variant="caption" style={styles.problem}>
                {`\u2022 ${p}`}
              </AppText>
            ))}
          </View>
        ) : null}
        {canEdit ? <Button label="Save size chart" busyLabel="Saving…" busy={busy} onPress={save} /> : null}
      </Card>
      <ChartChecksPanel draft={draft} category={category} fabricKind={pattern.fabricKind as FabricKind} unit={unit} />
    </>
  );
}

const styles = StyleSheet.create({
  sizeRow: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'flex-end', gap: space.sm },
  grow: { flexGrow: 1, minWidth: 140 },
  sizeButtons: { flexDirection: 'row', gap: space.xs },
  variant: { gap: space.sm, padding: space.md, borderWidth: 1, borderColor: colors.line, borderRadius: 10 },
  result: { gap: space.xs },
  problem: { color: colors.warning },
});
