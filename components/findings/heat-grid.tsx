import { ScrollView, StyleSheet, View } from 'react-native';
import Svg, { G, Line, Path, Rect, Text as SvgText } from 'react-native-svg';
import { AppText } from '@/components/ui/text';
import { colors, fonts } from '@/constants/theme';
import { ChartFrame } from './chart-frame';
import { heatGeometry, type HeatCell, type HeatGeometry, type HeatRow } from './chart-geometry';
import { percent } from './words';

type Props = {
  rows: readonly HeatRow[];
  /** Sizes in grading order. */
  sizes: readonly string[];
  draft: string;
  initialWidth?: number;
};

/** What a screen reader says for one cell. */
export function heatCellLabel(rowLabel: string, cell: Pick<HeatCell, 'size' | 'k' | 'n' | 'flagged'>): string {
  if (cell.n === 0) return `${rowLabel}, size ${cell.size}: no reports`;
  return `${rowLabel}, size ${cell.size}: ${cell.k} of ${cell.n} testers (${percent(cell.k / cell.n)})${cell.flagged ? ', stands out' : ''}`;
}

/**
 * Sizes across, alterations down: each cell holds k/n, the testers of that size who made the change
 * out of those who reported, shaded by the share. The numbers are real text laid over the drawing,
 * so each cell can be read out on its own and the shade is never the only sign.
 */
export function HeatGrid({ rows, sizes, draft, initialWidth }: Props) {
  const summary = `Alterations by size for draft ${draft}: ${rows.length} ${rows.length === 1 ? 'alteration' : 'alterations'} over ${sizes.length} sizes. Each cell reads as testers who made the change out of testers of that size.`;
  return (
    <ChartFrame
      testID="heat-grid"
      explorable
      initialWidth={initialWidth}
      summary={summary}
      caption="Each cell: testers of that size who made the change / testers of that size who reported. Darker means a larger share; a grey dash means nobody of that size reported; a corner mark means the size stands out."
    >
      {(width) => <HeatDrawing g={heatGeometry(rows, sizes, width)} available={width} />}
    </ChartFrame>
  );
}

const MARK = 9;

export function HeatDrawing({ g, available }: { g: HeatGeometry; available?: number }) {
  const labelOf = new Map(g.rows.map((r) => [r.key, r.label]));
  const overflows = available !== undefined && g.width > available + 1;
  const first = g.columns[0]?.size;
  const last = g.columns[g.columns.length - 1]?.size;
  return (
    <View>
      {overflows ? (
        <AppText variant="caption" style={styles.hint}>
          {`Sizes ${first} to ${last}: scroll sideways for the rest →`}
        </AppText>
      ) : null}
      <ScrollView
        horizontal
        contentContainerStyle={{ width: g.width }}
        // Reachable by keyboard (arrow keys scroll it) and named for screen readers.
        focusable
        role="region"
        aria-label={`Alterations by size, sizes ${first} to ${last}${overflows ? ', scrolls sideways' : ''}`}
        showsHorizontalScrollIndicator
        persistentScrollbar
      >
        <View style={{ width: g.width, height: g.height }}>
          <Svg width={g.width} height={g.height} aria-hidden>
            {g.columns.map((c) => (
              <SvgText key={c.size} x={c.x + g.cellWidth / 2} y={16} fontSize={12} fontFamily={fonts.semibold} fill={colors.ink} textAnchor="middle">
                {c.size}
              </SvgText>
            ))}
            {g.cells.map((c) => (
              <G key={`${c.rowKey}@${c.size}`}>
                <Rect testID={`heat-rect-${c.rowKey}-${c.size}`} x={c.x + 1} y={c.y} width={c.width - 2} height={c.height} rx={3} fill={c.fill} stroke={c.flagged ? colors.warning : colors.line} strokeWidth={c.flagged ? 2 : 1} />
                {c.n === 0 ? <Line x1={c.x + 4} y1={c.y + c.height - 4} x2={c.x + c.width - 4} y2={c.y + 4} stroke={colors.line} strokeWidth={1} /> : null}
                {c.flagged ? <Path d={`M ${c.x + c.width - 1 - MARK} ${c.y} L ${c.x + c.width - 1} ${c.y} L ${c.x + c.width - 1} ${c.y + MARK} Z`} fill={colors.warning} /> : null}
              </G>
            ))}
          </Svg>
          {g.rows.map((r) => (
            <AppText
              key={r.key}
              numberOfLines={1}
              variant="label"
              style={[styles.rowLabel, g.sideLabels ? { top: r.y, width: g.labelWidth - 8, height: 32, lineHeight: 32 } : { top: r.labelY - 10, width: g.width }]}
            >
              {r.label}
            </AppText>
          ))}
          {g.cells.map((c) => (
            <View
              key={`${c.rowKey}@${c.size}`}
              testID={`heat-cell-${c.rowKey}-${c.size}`}
              role="img"
              aria-label={heatCellLabel(labelOf.get(c.rowKey) ?? c.rowKey, c)}
              style={[styles.cell, { left: c.x, top: c.y, width: c.width, height: c.height }]}
            >
              <AppText style={[styles.cellText, { color: c.textColor }]}>{c.text}</AppText>
            </View>
          ))}
        </View>
      </ScrollView>
    </View>
  );
}

const styles = StyleSheet.create({
  rowLabel: { position: 'absolute', left: 0, fontSize: 13 },
  cell: { position: 'absolute', alignItems: 'center', justifyContent: 'center' },
  cellText: { fontFamily: fonts.semibold, fontSize: 12, lineHeight: 16 },
  hint: { marginBottom: 4 },
});
