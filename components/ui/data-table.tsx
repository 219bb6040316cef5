import { StyleSheet, View } from 'react-native';
import { colors, fonts, space } from '@/constants/theme';
import { AppText } from './text';

export type Column = { title: string; flex?: number; minWidth?: number; align?: 'left' | 'right' };

type Props = { label: string; columns: readonly Column[]; rows: readonly (readonly string[])[]; testID?: string };

/** A plain table of text: a header row and rows, readable by screen readers as a table. */
export function DataTable({ label, columns, rows, testID }: Props) {
  const cell = (c: Column) => [styles.cell, { flex: c.flex ?? 1, minWidth: c.minWidth ?? 48 }, c.align === 'right' ? styles.right : null];
  return (
    <View role="table" aria-label={label} testID={testID}>
      <View role="row" style={styles.row}>
        {columns.map((c) => (
          <AppText key={c.title} role="columnheader" style={[...cell(c), styles.head]}>
            {c.title}
          </AppText>
        ))}
      </View>
      {rows.map((r, i) => (
        <View key={`${i}-${r[0]}`} role="row" style={styles.row}>
          {r.map((value, j) => (
            <AppText key={columns[j]?.title ?? j} role={j === 0 ? 'rowheader' : 'cell'} style={[...cell(columns[j] ?? {}), j === 0 ? styles.first : null]}>
              {value}
            </AppText>
          ))}
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', borderBottomWidth: 1, borderBottomColor: colors.line },
  cell: { fontSize: 14, lineHeight: 20, paddingVertical: space.xs, paddingHorizontal: space.xs },
  head: { fontFamily: fonts.semibold, fontSize: 13, color: colors.inkMuted },
  first: { fontFamily: fonts.medium },
  right: { textAlign: 'right' },
});
