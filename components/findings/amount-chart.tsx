import Svg, { Circle, Line, Text as SvgText } from 'react-native-svg';
import type { Finding, SizeStats } from '@/server/analysis/types';
import { colors, fonts } from '@/constants/theme';
import type { LengthUnit } from '@/server/domain/units';
import { sizeLabelStep, XTitle, YGrid } from './axes';
import { ChartFrame } from './chart-frame';
import { amountGeometry, type AmountGeometry } from './chart-geometry';
import { lengthText, pText } from './words';

type Props = {
  bySize: readonly SizeStats[];
  fit: Finding['amountSlope'];
  unit: LengthUnit;
  name: string;
  initialWidth?: number;
};

export function amountSummary(name: string, bySize: readonly SizeStats[], fit: Finding['amountSlope'], unit: LengthUnit): string {
  const points = bySize
    .filter((s) => s.k > 0 && s.meanMm !== null)
    .map((s) => `size ${s.size}: ${lengthText(s.meanMm as number, unit)} on average from ${s.k} ${s.k === 1 ? 'tester' : 'testers'}`);
  const line = fit
    ? `The fitted line changes by ${lengthText(fit.slopeMmPerSize, unit)} per size step (${pText(fit.p)}, from ${fit.n} amounts over ${fit.sizes} sizes).`
    : 'Too few amounts over too few sizes for a fitted line.';
  return `${name}, amount by size. ${points.length ? `${points.join('; ')}.` : 'No amounts.'} ${line}`;
}

export function AmountChart({ bySize, fit, unit, name, initialWidth }: Props) {
  return (
    <ChartFrame
      testID="amount-chart"
      initialWidth={initialWidth}
      caption={`Average amount per size in ${unit === 'in' ? 'inches' : 'centimetres'} (added above zero, taken out below)${fit ? ', with the line fitted to every tester’s amount against the size’s place in the range' : ''}.`}
      summary={amountSummary(name, bySize, fit, unit)}
    >
      {(width) => <AmountDrawing g={amountGeometry(bySize, fit, width, unit)} />}
    </ChartFrame>
  );
}

export function AmountDrawing({ g }: { g: AmountGeometry }) {
  const labelEvery = sizeLabelStep(g.bandWidth);
  return (
    <Svg width={g.width} height={g.height} aria-hidden>
      <YGrid ticks={g.ticks} plot={g.plot} />
      <Line x1={g.plot.left} x2={g.plot.right} y1={g.zeroY} y2={g.zeroY} stroke={colors.inkMuted} strokeWidth={1} />
      {g.line ? <Line testID="amount-line" x1={g.line.x1} y1={g.line.y1} x2={g.line.x2} y2={g.line.y2} stroke={colors.warning} strokeWidth={2} strokeDasharray="7 4" /> : null}
      {g.points.map((p) => (
        <Circle key={p.size} testID={`amount-point-${p.size}`} cx={p.x} cy={p.y} r={4.5} fill={colors.threadDark} stroke={colors.surface} strokeWidth={1} />
      ))}
      {g.sizeLabels.map((_, i) => i)
        .filter((i) => i % labelEvery === 0)
        .map((i) => (
          <SvgText key={i} x={g.plot.left + (i + 0.5) * g.bandWidth} y={g.plot.bottom + 16} fontSize={11} fontFamily={fonts.medium} fill={colors.ink} textAnchor="middle">
            {g.sizeLabels[i] ?? ''}
          </SvgText>
        ))}
      <XTitle plot={g.plot} height={g.height}>{`Size (amount in ${g.unit})`}</XTitle>
    </Svg>
  );
}
