import { useState } from 'react';
import { View } from 'react-native';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { MeasurementField } from '@/components/ui/measurement-field';
import { Notice } from '@/components/ui/notice';
import { AppText } from '@/components/ui/text';
import { ApiError } from '@/hooks/api';
import { saveFabricNeeds, type PatternDetail } from '@/hooks/use-patterns';
import { nappedBelowPlain } from '@/server/domain/fabric-needs';
import { formatFabricNeed, formatLength, parseFabricLength, type FabricUnit, type LengthUnit } from '@/server/domain/units';
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
  // The server's refusals of single cells, by size id then column; cleared when that cell changes.
  const [refused, setRefused] = useState<Record<string, Record<string, string>>>({});
  // Cells whose typed text could not be read: saving now would drop them silently.
  const [unreadable, setUnreadable] = useState<Record<string, string>>({});

  const columns = widths.flatMap((w) => [
    { key: columnKey(w, false), label: `${formatLength(w, lengthUnit)} wide` },
    { key: columnKey(w, true), label: `${formatLength(w, lengthUnit)}, one way` },
  ]);
  const rows = pattern.chart.sizes.map((s) => ({ key: s.id, label: s.label, values: values[s.id] ?? {} }));

  // Every filled cell in one order: what is sent, and how a problem or the server's
  // "needs.N.lengthMm" finds its way back to the cell.
  const cells = Object.entries(values).flatMap(([sizeId, byColumn]) =>
    Object.entries(byColumn).flatMap(([col, lengthMm]) => {
      const [width, layout] = col.split('|');
      if (lengthMm == null || !widths.includes(Number(width))) return [];
      return [{ sizeId, col, widthMm: Number(width), napped: layout === 'napped', lengthMm }];
    }),
  );
  // The same rule the server applies, checked as the designer types.
  const problems = nappedBelowPlain(
    cells.map((c) => ({ ...c, sizeKey: c.sizeId, sizeLabel: pattern.chart.sizes.find((s) => s.id === c.sizeId)?.label ?? '?' })),
    { lengthUnit, fabricUnit },
  );
  const cellErrors: Record<string, Record<string, string>> = {};
  for (const [sizeId, byColumn] of Object.entries(refused)) cellErrors[sizeId] = { ...byColumn };
  for (const p of problems) (cellErrors[cells[p.index].sizeId] ??= {})[cells[p.index].col] = p.cellMessage;

  const save = async () => {
    const bad = Object.entries(unreadable);
    if (bad.length) {
      setMessage({ tone: 'error', text: `Not saved: ${bad.map(([label, why]) => `${label} ${why}`).join('; ')}. Correct ${bad.length === 1 ? 'it' : 'them'} first; nothing was changed.` });
      return;
    }
    setMessage(null);
    if (problems.length) {
      setMessage({ tone: 'error', text: 'Not saved: correct the one-way lengths marked in the table first.' });
      return;
    }
    setBusy(true);
    const sent = cells;
    try {
      await saveFabricNeeds(
        studioId,
        pattern.id,
        sent.map((c) => ({ size: c.sizeId, widthMm: c.widthMm, napped: c.napped, lengthMm: c.lengthMm })),
      );
      setRefused({});
      setMessage({ tone: 'success', text: 'Fabric needs saved.' });
    } catch (error) {
      const fields = error instanceof ApiError && error.fields ? error.fields : {};
      const byCell: Record<string, Record<string, string>> = {};
      for (const [field, text] of Object.entries(fields)) {
        const m = /^needs\.(\d+)\.lengthMm$/.exec(field);
        const cell = m ? sent[Number(m[1])] : undefined;
        if (cell) (byCell[cell.sizeId] ??= {})[cell.col] = text;
      }
      setRefused(byCell);
      const detail = Object.keys(fields).length ? ` ${Object.values(fields).join('; ')}` : '';
      setMessage({ tone: 'error', text: `${error instanceof Error ? error.message : 'Not saved.'}${detail}` });
    } finally {
      setBusy(false);
    }
  };

  return (
    <Card title="Fabric needs">
      <AppText variant="caption">
        {`Length of fabric each size needs, in ${fabricUnit === 'yd' ? 'yards' : 'metres'}. “One way” is the layout for napped fabric or a one-way print: every piece the same way up, which takes at least as much as the plain layout and usually more.`}
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
          // A stated need is shown rounded up (never short of what the designer typed).
          format={(mm) => formatFabricNeed(mm, fabricUnit)}
          errors={cellErrors}
          onChange={(row, col, mm) => {
            setValues((v) => ({ ...v, [row]: { ...v[row], [col]: mm } }));
            setRefused((r) => {
              if (!r[row]?.[col]) return r;
              const { [col]: _gone, ...rest } = r[row];
              return { ...r, [row]: rest };
            });
          }}
          onInputError={(label, why) =>
            setUnreadable((now) => {
              const { [label]: _gone, ...rest } = now;
              return why === null ? rest : { ...rest, [label]: why };
            })
          }
        />
      )}
      {problems.length ? <Notice tone="error">{problems.map((p) => p.message).join('\n')}</Notice> : null}
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
