import { useState } from 'react';
import { View } from 'react-native';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { MeasurementField } from '@/components/ui/measurement-field';
import { Notice } from '@/components/ui/notice';
import { AppText } from '@/components/ui/text';
import { ApiError } from '@/hooks/api';
import { saveFabricNeeds, type PatternDetail } from '@/hooks/use-patterns';
import { formatFabricLength, formatLength, parseFabricLength, type FabricUnit, type LengthUnit } from '@/server/domain/units';
import { ChartValuesEditor } from './chart-values-editor';

type Props = { studioId: string; pattern: PatternDetail; lengthUnit: LengthUnit; fabricUnit: FabricUnit; canEdit: boolean };

// Common bolt widths [CP]: 45 in and 60 in, or 115 cm and 150 cm (labelled widths are nominal).
const DEFAULT_WIDTHS: Record<FabricUnit, number[]> = { yd: [1143, 1524], m: [1150, 1500] };

const columnKey = (widthMm: number, napped: boolean) => `${Math.round(widthMm)}|${napped ? 'napped' : 'any'}`;

/** Fabric length per size × fabric width, with and without a one-way (napped) layout. */
export function FabricNeedsEditor({ studioId, pattern, lengthUnit, fabricUnit, canEdit }: Props) {
  const saved = pattern.fabricNeeds;
  const [widths, setWidths] = useState<number[]>(() => {
    const have = [...new Set(saved.map((n) => Math.round(n.widthMm)))].sort((a, b) => a - b);
    return have.length ? have : DEFAULT_WIDTHS[fabricUnit];
  });
  const [values, setValues] = useState<Record<string, Record<string, number | null>>>(() => {
    const byRow: Record<string, Record<string, number | null>> = {};
    for (const n of saved) (byRow[n.sizeId] ??= {})[columnKey(n.widthMm, n.napped)] = n.lengthMm;
    return byRow;
  });
  const [newWidth, setNewWidth] = useState<number | null>(null);
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  // Cells whose typed text could not be read: saving now would drop them silently.
  const [unreadable, setUnreadable] = useState<Record<string, string>>({});

  const columns = widths.flatMap((w) => [
    { key: columnKey(w, false), label: `${formatLength(w, lengthUnit)} wide` },
    { key: columnKey(w, true), label: `${formatLength(w, lengthUnit)}, one way` },
  ]);
  const rows = pattern.chart.sizes.map((s) => ({ key: s.id, label: s.label, values: values[s.id] ?? {} }));

  const save = async () => {
    const bad = Object.entries(unreadable);
    if (bad.length) {
      setMessage({ tone: 'error', text: `Not saved: ${bad.map(([label, why]) => `${label} ${why}`).join('; ')}. Correct ${bad.length === 1 ? 'it' : 'them'} first; nothing was changed.` });
      return;
    }
    setBusy(true);
    setMessage(null);
    const needs = Object.entries(values).flatMap(([sizeId, byColumn]) =>
      Object.entries(byColumn).flatMap(([col, lengthMm]) => {
        const [width, layout] = col.split('|');
        if (lengthMm == null || !widths.includes(Number(width))) return [];
        return [{ size: sizeId, widthMm: Number(width), napped: layout === 'napped', lengthMm }];
      }),
    );
    try {
      await saveFabricNeeds(studioId, pattern.id, needs);
      setMessage({ tone: 'success', text: 'Fabric needs saved.' });
    } catch (error) {
      const detail = error instanceof ApiError && error.fields ? ` ${Object.values(error.fields).join('; ')}` : '';
      setMessage({ tone: 'error', text: `${error instanceof Error ? error.message : 'Not saved.'}${detail}` });
    } finally {
      setBusy(false);
    }
  };

  return (
    <Card title="Fabric needs">
      <AppText variant="caption">
        {`Length of fabric each size needs, in ${fabricUnit === 'yd' ? 'yards' : 'metres'}. “One way” is the layout for napped fabric or a one-way print: every piece the same way up, which usually takes more.`}
      </AppText>
      {pattern.chart.sizes.length === 0 ? (
        <AppText variant="caption">Save a size chart first.</AppText>
      ) : (
        <ChartValuesEditor
          title="Fabric"
          columns={columns}
          rows={rows}
          unit={lengthUnit}
          unitLabel={fabricUnit}
          readOnly={!canEdit}
          parse={(text) => parseFabricLength(text, fabricUnit)}
          format={(mm) => formatFabricLength(mm, fabricUnit)}
          onChange={(row, col, mm) => setValues((v) => ({ ...v, [row]: { ...v[row], [col]: mm } }))}
          onInputError={(label, why) =>
            setUnreadable((now) => {
              const { [label]: _gone, ...rest } = now;
              return why === null ? rest : { ...rest, [label]: why };
            })
          }
        />
      )}
      {canEdit ? (
        <View>
          <MeasurementField label="Add a fabric width" unit={lengthUnit} valueMm={newWidth} onChangeMm={setNewWidth} placeholder={lengthUnit === 'in' ? 'e.g. 54' : 'e.g. 140 cm'} />
          <Button
            label="Add width"
            tone="quiet"
            disabled={newWidth == null}
            onPress={() => {
              if (newWidth != null) setWidths((w) => [...new Set([...w, Math.round(newWidth)])].sort((a, b) => a - b));
              setNewWidth(null);
            }}
          />
          <Button label="Save fabric needs" busyLabel="Saving…" busy={busy} onPress={save} />
        </View>
      ) : null}
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
    </Card>
  );
}
