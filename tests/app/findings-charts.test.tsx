// The findings charts: the geometry by hand-computed numbers, and the drawn SVG against it.
// Layout constants used below (from chart-geometry.ts): rate chart 220 px high with margins
// top 12, right 12, bottom 40, left 44; amount chart the same but left 56. At 340 px wide the
// rate plot is 284 × 168 px (bottom edge at y = 180), the amount plot 272 × 168 px.
import { render, screen } from '@testing-library/react-native';
import { processColor } from 'react-native';
import { AmountChart } from '@/components/findings/amount-chart';
import {
  HEAT_DARKEST,
  INCH_STEPS,
  contrastRatio,
  amountGeometry,
  bandCentre,
  fittedLineEnds,
  heatGeometry,
  lengthTickLabel,
  linearScale,
  mixHex,
  niceTicks,
  rateGeometry,
  rateShade,
} from '@/components/findings/chart-geometry';
import { HeatGrid } from '@/components/findings/heat-grid';
import { RateChart } from '@/components/findings/rate-chart';
import { colors } from '@/constants/theme';
import { runAnalysis } from '@/server/analysis';
import type { SizeStats } from '@/server/analysis/types';

// The drawings are hidden from screen readers (the summary and cell labels speak for them), so
// queries for their parts must look at hidden elements too.
const HIDDEN = { includeHiddenElements: true };

function stats(size: string, n: number, k: number, extra: Partial<SizeStats> = {}): SizeStats {
  return {
    size,
    n,
    k,
    rate: n > 0 ? k / n : null,
    wilson: null,
    meanMm: null,
    medianMm: null,
    sdMm: null,
    fisherP: null,
    holmP: null,
    ...extra,
  };
}

describe('chart geometry', () => {
  it('maps a domain linearly onto a range, flipped for a y axis', () => {
    const y = linearScale([0, 1], [180, 12]);
    expect(y(0)).toBe(180);
    expect(y(1)).toBe(12);
    expect(y(0.25)).toBe(138);
  });

  it('puts band centres in the middle of equal bands', () => {
    expect(bandCentre(0, 4, 44, 284)).toBe(79.5);
    expect(bandCentre(3, 4, 44, 284)).toBe(292.5);
  });

  it('gives round ticks: 1-2-5 steps for centimetres and tape-measure steps for inches', () => {
    expect(niceTicks(0, 2.5, 5)).toEqual([0, 1, 2, 3]);
    expect(niceTicks(-1.2, 0, 5)).toEqual([-1.5, -1, -0.5, 0]);
    expect(niceTicks(0, 1.3, 5, INCH_STEPS)).toEqual([0, 0.5, 1, 1.5]);
    expect(lengthTickLabel(1.5, 'in')).toBe('1 1/2');
    expect(lengthTickLabel(0.375, 'in')).toBe('3/8');
    expect(lengthTickLabel(-0.5, 'cm')).toBe('-0.5');
  });

  it('shades 0 % white and 100 % a thread green light enough for ink text, half way in between', () => {
    // #2E5E58 lightened 30 % toward white: 46 + 0.3 × 209 = 108.7 → 0x6D; 94 + 0.3 × 161 = 142.3 → 0x8E; 88 + 0.3 × 167 = 138.1 → 0x8A.
    expect(HEAT_DARKEST).toBe('#6D8E8A');
    expect(rateShade(0)).toBe('#FFFFFF');
    expect(rateShade(1)).toBe('#6D8E8A');
    // (255 + 46) / 2 = 150.5 → 151 = 0x97; (255 + 94) / 2 = 174.5 → 175 = 0xAF; (255 + 88) / 2 = 171.5 → 172 = 0xAC
    expect(mixHex('#FFFFFF', '#2E5E58', 0.5)).toBe('#97AFAC');
  });

  it('keeps the cell text at WCAG 2 contrast 4.5 : 1 or more on every shade', () => {
    // Check values of the formula: black on white is 21 : 1, #777777 on white 4.48 : 1 (WCAG 2 examples).
    expect(contrastRatio('#000000', '#FFFFFF')).toBeCloseTo(21, 6);
    expect(contrastRatio('#777777', '#FFFFFF')).toBeCloseTo(4.48, 2);
    for (let r = 0; r <= 1.0001; r += 0.05) expect(contrastRatio(colors.ink, rateShade(r))).toBeGreaterThanOrEqual(4.5);
  });

  it('places each size’s Wilson bar between its interval’s ends on a 0–100 % axis', () => {
    const g = rateGeometry([stats('8', 4, 0, { wilson: [0, 0.49] }), stats('10', 4, 2, { wilson: [0.25, 0.75] }), stats('12', 0, 0), stats('14', 2, 2, { wilson: [0.5, 1] })], 340);
    expect(g.plot).toEqual({ left: 44, top: 12, width: 284, height: 168, right: 328, bottom: 180 });
    expect(g.ticks.map((t) => [t.label, t.y])).toEqual([
      ['0%', 180],
      ['25%', 138],
      ['50%', 96],
      ['75%', 54],
      ['100%', 12],
    ]);
    const m = g.marks[1]!;
    // Band 71 px wide; the second band's centre is 44 + 1.5 × 71.
    expect(m.x).toBe(150.5);
    expect([m.y, m.yHigh, m.yLow]).toEqual([96, 54, 138]);
    expect(g.marks[2]).toMatchObject({ size: '12', y: null, yLow: null, yHigh: null });
    expect([g.marks[3]!.yHigh, g.marks[3]!.yLow]).toEqual([12, 96]);
  });

  it('takes the fitted line at the size’s position in the range: intercept + slope × index', () => {
    const fit = { interceptMm: 10, slopeMmPerSize: 5 };
    expect(fittedLineEnds(fit, 0, 3)).toEqual([
      { index: 0, mm: 10 },
      { index: 3, mm: 25 },
    ]);
    expect(fittedLineEnds({ interceptMm: -4, slopeMmPerSize: -2.5 }, 2, 6)).toEqual([
      { index: 2, mm: -9 },
      { index: 6, mm: -19 },
    ]);
  });

  it('draws the fitted line only over the sizes that have amounts, in the viewer’s unit', () => {
    const bySize = [stats('XS', 3, 0), stats('S', 3, 2, { meanMm: 14 }), stats('M', 3, 2, { meanMm: 21 }), stats('L', 3, 3, { meanMm: 24 })];
    const g = amountGeometry(bySize, { interceptMm: 10, slopeMmPerSize: 5 }, 340, 'cm');
    // Values in cm: 0, 1.4, 2.1, 2.4 and the line 1.5 (index 1) … 2.5 (index 3) → ticks 0, 1, 2, 3 on y 180 … 12.
    expect(g.ticks.map((t) => t.label)).toEqual(['0.0', '1.0', '2.0', '3.0']);
    expect(g.line).toMatchObject({ fromIndex: 1, toIndex: 3, fromMm: 15, toMm: 25 });
    // Bands of 68 px from x = 56: centres 90, 158, 226, 294. y(1.5) = 180 − 1.5 × 56 = 96; y(2.5) = 40.
    expect(g.line).toMatchObject({ x1: 158, y1: 96, x2: 294, y2: 40 });
    expect(g.points.map((p) => [p.size, p.x, Number(p.y.toFixed(6))])).toEqual([
      ['S', 158, 101.6],
      ['M', 226, 62.4],
      ['L', 294, 45.6],
    ]);
    expect(g.zeroY).toBe(180);
  });

  it('lays out the heat grid with a cell per size and alteration, labels above rows on a phone', () => {
    const rows = [
      { key: 'a|add', label: 'A', bySize: [stats('1', 5, 2), stats('2', 0, 0)] },
      { key: 'b|remove', label: 'B', bySize: [stats('1', 5, 5), stats('2', 0, 0)] },
    ];
    const g = heatGeometry(rows, ['1', '2'], 340);
    expect(g.sideLabels).toBe(false);
    expect(g.cells).toHaveLength(4);
    expect(g.cells.map((c) => c.text)).toEqual(['2/5', '–', '5/5', '–']);
    // Header 24 px, then each row: a 20 px name line, a 32 px cell, a 4 px gap.
    expect(g.cells.map((c) => c.y)).toEqual([44, 44, 100, 100]);
    const wide = heatGeometry(rows, ['1', '2'], 800);
    expect(wide.sideLabels).toBe(true);
    expect(wide.labelWidth).toBe(220);
    expect(wide.cells[0]!.x).toBe(220);
  });
});

describe('the heat grid', () => {
  const sizes = ['8', '10', '12', '14'];
  const rows = [
    { key: 'leg-length|add', label: 'Leg length, added', bySize: [stats('8', 2, 0), stats('10', 5, 2), stats('12', 0, 0), stats('14', 3, 3)] },
    { key: 'waist|remove', label: 'Waist larger or smaller, taken out', bySize: [stats('8', 2, 1), stats('10', 5, 0), stats('12', 0, 0), stats('14', 3, 0)], flaggedSizes: ['8'] },
  ];

  it('renders one cell per size × alteration with k/n text, shade and a spoken label', () => {
    render(<HeatGrid rows={rows} sizes={sizes} draft="2" initialWidth={340} />);
    for (const r of rows) for (const s of sizes) expect(screen.getByTestId(`heat-cell-${r.key}-${s}`)).toBeTruthy();
    expect(screen.getAllByTestId(/^heat-cell-/)).toHaveLength(8);
    expect(screen.getByTestId('heat-cell-leg-length|add-10')).toHaveTextContent('2/5');
    expect(screen.getByTestId('heat-cell-leg-length|add-14')).toHaveTextContent('3/3');
    expect(screen.getByTestId('heat-cell-leg-length|add-12')).toHaveTextContent('–');
    expect(screen.getByLabelText('Leg length, added, size 10: 2 of 5 testers (40%)')).toBeTruthy();
    expect(screen.getByLabelText('Leg length, added, size 12: no reports')).toBeTruthy();
    expect(screen.getByLabelText('Waist larger or smaller, taken out, size 8: 1 of 2 testers (50%), stands out')).toBeTruthy();
    // The drawn cell behind 3/3 is the darkest shade; an empty size is the sunken grey.
    // (react-native-svg hands colours to the native view as processed colour numbers.)
    expect(screen.getByTestId('heat-rect-leg-length|add-14', HIDDEN).props.fill).toEqual({ type: 0, payload: processColor('#6D8E8A') });
    expect(screen.getByTestId('heat-rect-leg-length|add-12', HIDDEN).props.fill).toEqual({ type: 0, payload: processColor('#F1EBE0') });
    expect(screen.getByLabelText(/Alterations by size for draft 2: 2 alterations over 4 sizes/)).toBeTruthy();
  });
});

describe('the rate chart', () => {
  it('draws each interval bar and point at the computed coordinates', () => {
    const bySize = [stats('8', 4, 0, { wilson: [0, 0.49] }), stats('10', 4, 2, { wilson: [0.25, 0.75] }), stats('12', 0, 0), stats('14', 2, 2, { wilson: [0.5, 1] })];
    render(<RateChart bySize={bySize} flaggedSizes={['14']} name="Leg length, added" initialWidth={340} />);
    const bar = screen.getByTestId('rate-bar-10', HIDDEN);
    expect([bar.props.x1, bar.props.y1, bar.props.x2, bar.props.y2]).toEqual([150.5, 54, 150.5, 138]);
    const point = screen.getByTestId('rate-point-10', HIDDEN);
    expect([point.props.cx, point.props.cy]).toEqual([150.5, 96]);
    // A size without reports gets a dash on the axis, no bar.
    expect(screen.queryByTestId('rate-bar-12', HIDDEN)).toBeNull();
    expect(screen.getByTestId('rate-none-12', HIDDEN)).toBeTruthy();
    // The size that stands out is a diamond (a path), not a dot.
    expect(screen.getByTestId('rate-point-14', HIDDEN).props.d).toBeDefined();
    expect(screen.getByLabelText(/size 10: 2 of 4, 50% \(95% interval 25–75%\); size 12: no reports; size 14: 2 of 2, 100% \(95% interval 50–100%\), stands out/)).toBeTruthy();
  });
});

describe('the amount chart', () => {
  it('draws the fitted line from intercept + slope × position at the first and last size with amounts', () => {
    const bySize = [stats('XS', 3, 1, { meanMm: 9 }), stats('S', 3, 2, { meanMm: 14 }), stats('M', 3, 2, { meanMm: 21 }), stats('L', 3, 3, { meanMm: 24 })];
    const fit = { slopeMmPerSize: 5, interceptMm: 10, p: 0.01, n: 8, sizes: 4 };
    render(<AmountChart bySize={bySize} fit={fit} unit="cm" name="Leg length, added" initialWidth={340} />);
    const line = screen.getByTestId('amount-line', HIDDEN);
    // Ends at 10 mm (index 0) and 25 mm (index 3): ticks 0–3 cm, y(1.0) = 180 − 56 = 124, y(2.5) = 40.
    expect([line.props.x1, line.props.y1, line.props.x2, line.props.y2]).toEqual([90, 124, 294, 40]);
    expect(screen.getByTestId('amount-point-XS', HIDDEN).props.cy).toBeCloseTo(180 - 0.9 * 56, 6);
    expect(screen.getByLabelText(/The fitted line changes by 0\.5 cm per size step \(p = 0\.010, from 8 amounts over 4 sizes\)/)).toBeTruthy();
  });

  it('shows inches to the eighth and says when there is no line', () => {
    const bySize = [stats('8', 2, 1, { meanMm: -25.4 }), stats('10', 2, 0)];
    render(<AmountChart bySize={bySize} fit={null} unit="in" name="Waist, taken out" initialWidth={340} />);
    expect(screen.queryByTestId('amount-line', HIDDEN)).toBeNull();
    expect(screen.getByLabelText(/size 8: −1 in on average from 1 tester\. Too few amounts/)).toBeTruthy();
  });
});

describe('the amount chart against the engine', () => {
  it('uses the same x as the engine’s regression: the size’s position in the pattern’s size list', () => {
    // Invented trial: sizes 6–14, nobody in size 6; amounts exactly 10 + 5 × position (mm), so
    // the engine's least-squares line must come out as intercept 10, slope 5.
    const sizes = ['6', '8', '10', '12', '14'];
    const reports = [1, 1, 2, 3, 4, 4].map((i, n) => ({
      tester: `t${n}`,
      size: sizes[i]!,
      draft: '1',
      alterations: [{ kind: 'leg-length', amountMm: 10 + 5 * i }],
    }));
    const finding = runAnalysis({ sizes, reports }).findings.find((f) => f.kind === 'leg-length')!;
    expect(finding.amountSlope!.interceptMm).toBeCloseTo(10, 9);
    expect(finding.amountSlope!.slopeMmPerSize).toBeCloseTo(5, 9);
    const g = amountGeometry(finding.bySize, finding.amountSlope, 340, 'cm');
    // The line runs from size 8 (position 1, 15 mm) to size 14 (position 4, 30 mm) and passes
    // through every size's mean, since the amounts lie on it exactly.
    expect(g.line).toMatchObject({ fromIndex: 1, toIndex: 4 });
    expect(g.line!.fromMm).toBeCloseTo(15, 9);
    expect(g.line!.toMm).toBeCloseTo(30, 9);
    for (const p of g.points) {
      const t = (p.x - g.line!.x1) / (g.line!.x2 - g.line!.x1);
      expect(p.y).toBeCloseTo(g.line!.y1 + t * (g.line!.y2 - g.line!.y1), 6);
    }
  });
});
