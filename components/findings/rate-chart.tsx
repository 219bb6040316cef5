import Svg, { Circle, G, Line, Path, Rect, Text as SvgText } from 'react-native-svg';
import type { SizeStats } from '@/server/analysis/types';
import { colors, fonts } from '@/constants/theme';
import { sizeLabelStep, XTitle, YGrid } from './axes';
import { ChartFrame } from './chart-frame';
import { rateGeometry, type RateGeometry } from './chart-geometry';
import { intervalText, percent } from './words';

type Props = {
  bySize: readonly SizeStats[];
  /** Sizes the engine found standing out; drawn as diamonds. */
  flaggedSizes?: readonly string[];
  overall?: { rate: number; wilson: readonly [number, number] };
  /** Name of the alteration, for the caption and summary. */
  name: string;
  initialWidth?: number;
};

/** Shown in words for screen readers: every size's rate and interval. */
export function rateSummary(name: string, bySize: readonly SizeStats[], flaggedSizes: readonly string[] = []): string {
  const parts = bySize.map((s) =>
    s.n === 0 || !s.wilson
      ? `size ${s.size}: no reports`
      : `size ${s.size}: ${s.k} of ${s.n}, ${percent(s.k / s.n)} (95% interval ${intervalText(s.wilson)})${flaggedSizes.includes(s.size) ? ', stands out' : ''}`,
  );
  return `${name}, share of testers per size. ${parts.join('; ')}.`;
}

export function RateChart({ bySize, flaggedSizes = [], overall, name, initialWidth }: Props) {
  return (
    <ChartFrame
      testID="rate-chart"
      initialWidth={initialWidth}
      caption="Share of each size’s testers who made this change: dot = share, bar = 95% Wilson interval, dashed line = all sizes together. Diamonds mark sizes that stand out; a dash marks a size with no reports."
      summary={rateSummary(name, bySize, flaggedSizes)}
    >
      {(width) => <RateDrawing g={rateGeometry(bySize, width, { flaggedSizes, overall })} />}
    </ChartFrame>
  );
}

const CAP = 5;

export function RateDrawing({ g }: { g: RateGeometry }) {
  const labelEvery = sizeLabelStep(g.bandWidth);
  return (
    <Svg width={g.width} height={g.height} aria-hidden>
      <YGrid ticks={g.ticks} plot={g.plot} />
      {g.overall ? (
        <G testID="rate-overall">
          <Rect x={g.plot.left} width={g.plot.width} y={g.overall.yHigh} height={Math.max(0, g.overall.yLow - g.overall.yHigh)} fill={colors.threadSoft} opacity={0.5} />
          <Line x1={g.plot.left} x2={g.plot.right} y1={g.overall.y} y2={g.overall.y} stroke={colors.thread} strokeWidth={1.5} strokeDasharray="5 4" />
        </G>
      ) : null}
      {g.marks.map((m) => {
        const tone = m.flagged ? colors.warning : colors.threadDark;
        return (
          <G key={m.size} testID={`rate-mark-${m.size}`}>
            {m.y === null || m.yLow === null || m.yHigh === null ? (
              <Line x1={m.x - 4} x2={m.x + 4} y1={g.plot.bottom - 6} y2={g.plot.bottom - 6} stroke={colors.inkMuted} strokeWidth={2} testID={`rate-none-${m.size}`} />
            ) : (
              <G>
                <Line testID={`rate-bar-${m.size}`} x1={m.x} x2={m.x} y1={m.yHigh} y2={m.yLow} stroke={tone} strokeWidth={2} />
                <Line x1={m.x - CAP} x2={m.x + CAP} y1={m.yHigh} y2={m.yHigh} stroke={tone} strokeWidth={2} />
                <Line x1={m.x - CAP} x2={m.x + CAP} y1={m.yLow} y2={m.yLow} stroke={tone} strokeWidth={2} />
                {m.flagged ? (
                  <Path testID={`rate-point-${m.size}`} d={`M ${m.x} ${m.y - 6} L ${m.x + 6} ${m.y} L ${m.x} ${m.y + 6} L ${m.x - 6} ${m.y} Z`} fill={tone} stroke={colors.surface} strokeWidth={1} />
                ) : (
                  <Circle testID={`rate-point-${m.size}`} cx={m.x} cy={m.y} r={4.5} fill={tone} stroke={colors.surface} strokeWidth={1} />
                )}
              </G>
            )}
            {m.index % labelEvery === 0 ? (
              <SvgText x={m.x} y={g.plot.bottom + 16} fontSize={11} fontFamily={fonts.medium} fill={colors.ink} textAnchor="middle">
                {m.size}
              </SvgText>
            ) : null}
          </G>
        );
      })}
      <Line x1={g.plot.left} x2={g.plot.right} y1={g.plot.bottom} y2={g.plot.bottom} stroke={colors.inkMuted} strokeWidth={1} />
      <XTitle plot={g.plot} height={g.height}>Size</XTitle>
    </Svg>
  );
}
