import { G, Line, Text as SvgText } from 'react-native-svg';
import { colors, fonts } from '@/constants/theme';

type Plot = { left: number; right: number; width: number };

/** Size labels closer than this (px) would overlap: label every n-th size instead. */
export function sizeLabelStep(bandWidth: number): number {
  return bandWidth >= 26 ? 1 : Math.ceil(26 / bandWidth);
}

/** Horizontal grid lines with their value labels at the left of the plot. */
export function YGrid({ ticks, plot }: { ticks: readonly { value: number; y: number; label: string }[]; plot: Plot }) {
  return (
    <G>
      {ticks.map((t) => (
        <G key={t.value}>
          <Line x1={plot.left} x2={plot.right} y1={t.y} y2={t.y} stroke={colors.line} strokeWidth={1} />
          <SvgText x={plot.left - 6} y={t.y + 4} fontSize={11} fontFamily={fonts.regular} fill={colors.inkMuted} textAnchor="end">
            {t.label}
          </SvgText>
        </G>
      ))}
    </G>
  );
}

/** The x axis' title under the size labels. */
export function XTitle({ plot, height, children }: { plot: Plot; height: number; children: string }) {
  return (
    <SvgText x={plot.left + plot.width / 2} y={height - 4} fontSize={11} fontFamily={fonts.regular} fill={colors.inkMuted} textAnchor="middle">
      {children}
    </SvgText>
  );
}
