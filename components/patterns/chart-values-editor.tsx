import { useState } from 'react';
import { ScrollView, StyleSheet, View } from 'react-native';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { MeasurementField } from '@/components/ui/measurement-field';
import { AppText } from '@/components/ui/text';
import { colors, fonts, space } from '@/constants/theme';
import { useIsWide } from '@/hooks/use-is-wide';
import type { LengthUnit, ParseResult } from '@/server/domain/units';

export type ValueColumn = { key: string; label: string };
type Row = { key: string; label: string; values: Record<string, number | null> };

type Props = {
  /** Names the table for screen readers and prefixes each cell's name, e.g. "Body". */
  title: string;
  columns: ValueColumn[];
  rows: Row[];
  unit: LengthUnit;
  readOnly: boolean;
  onChange: (rowKey: string, columnKey: string, mm: number | null) => void;
  /** For other lengths than body lengths (fabric): how cells read and show values, and the header unit. */
  parse?: (text: string) => ParseResult;
  format?: (mm: number) => string;
  unitLabel?: string;
  /** Messages for single cells, by row key then column key (e.g. a refusal naming the cell). */
  errors?: Record<string, Record<string, string>>;
  /** Told when a cell's typed text cannot be read (its label and the message) or can again (null). */
  onInputError?: (label: string, message: string | null) => void;
};

/**
 * Lengths per size and column: a full grid on a wide window, one size at a time on a phone.
 * Every cell is a measurement field, named "Hip, size 12" for assistive technology.
 */
export function ChartValuesEditor({ title, columns, rows, unit, readOnly, onChange, parse, format, unitLabel, errors, onInputError }: Props) {
  const wide = useIsWide();
  const [current, setCurrent] = useState<string | null>(rows[0]?.key ?? null);
  if (columns.length === 0) return <AppText variant="caption">Choose the measurements of this chart first.</AppText>;
  if (rows.length === 0) return <AppText variant="caption">Add a size first.</AppText>;

  const cellLabel = (row: Row, col: ValueColumn) => `${title} ${col.label.toLowerCase()}, size ${row.label}`;
  const cell = (row: Row, col: ValueColumn, hideLabel: boolean) => (
    <MeasurementField
      key={`${row.key}:${col.key}:${unit}`}
      label={cellLabel(row, col)}
      hideLabel={hideLabel}
      unit={unit}
      placeholder={unitLabel ?? unit}
      parse={parse}
      format={format}
      valueMm={row.values[col.key] ?? null}
      error={errors?.[row.key]?.[col.key]}
      readOnly={readOnly}
      onChangeMm={(mm) => onChange(row.key, col.key, mm)}
      onInputError={(message) => onInputError?.(cellLabel(row, col), message)}
    />
  );

  if (!wide) {
    const shown = (rows.find((r) => r.key === current) ?? rows[0]).key;
    // Every size stays mounted (the others hidden), so text typed in one size and not yet
    // readable is still there, and still holds back the save, after switching to another.
    return (
      <View style={styles.phone}>
        <ChoiceGroup label={`${title}: size`} options={rows.map((r) => ({ value: r.key, label: r.label }))} value={shown} onChange={setCurrent} />
        {rows.map((row) => (
          <View key={row.key} style={[styles.phone, row.key !== shown && styles.hidden]}>
            {columns.map((col) => (
              <View key={col.key} style={styles.phoneField}>
                <AppText variant="label">{col.label}</AppText>
                {cell(row, col, true)}
              </View>
            ))}
          </View>
        ))}
      </View>
    );
  }

  return (
    <ScrollView horizontal contentContainerStyle={styles.grid} aria-label={`${title} measurements by size`}>
      <View>
        <View style={styles.headerRow}>
          <AppText style={[styles.sizeCell, styles.head]}>Size</AppText>
          {columns.map((col) => (
            <AppText key={col.key} style={[styles.valueCell, styles.head]}>
              {`${col.label} (${unitLabel ?? unit})`}
            </AppText>
          ))}
        </View>
        {rows.map((row) => (
          <View key={row.key} style={styles.row}>
            <AppText style={[styles.sizeCell, styles.sizeLabel]}>{row.label}</AppText>
            {columns.map((col) => (
              <View key={col.key} style={styles.valueCell}>
                {cell(row, col, true)}
              </View>
            ))}
          </View>
        ))}
      </View>
    </ScrollView>
  );
}

const styles = StyleSheet.create({
  phone: { gap: space.md },
  phoneField: { gap: space.xs },
  hidden: { display: 'none' },
  grid: { paddingBottom: space.sm },
  headerRow: { flexDirection: 'row', borderBottomWidth: 1, borderBottomColor: colors.line, paddingBottom: space.xs },
  row: { flexDirection: 'row', alignItems: 'flex-start', paddingVertical: space.xs },
  head: { fontFamily: fonts.semibold, fontSize: 13, color: colors.inkMuted },
  sizeCell: { width: 64, paddingTop: space.sm },
  sizeLabel: { fontFamily: fonts.semibold },
  valueCell: { width: 132, paddingRight: space.sm },
});
