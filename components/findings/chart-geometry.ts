// The arithmetic of the findings charts, kept apart from the drawing so it can be checked with
// plain numbers: scales, ticks, where each bar, point, cell and line goes.
import { colors } from '@/constants/theme';
import type { SizeStats } from '@/server/analysis/types';
import { MM_PER_CM, MM_PER_INCH, formatLength, type LengthUnit } from '@/server/domain/units';

export type Margin = { top: number; right: number; bottom: number; left: number };
export type Plot = { left: number; top: number; width: number; height: number; right: number; bottom: number };

/** The drawing area inside a chart of the given outer size. */
export function plotArea(width: number, height: number, margin: Margin): Plot {
  const w = Math.max(0, width - margin.left - margin.right);
  const h = Math.max(0, height - margin.top - margin.bottom);
  return { left: margin.left, top: margin.top, width: w, height: h, right: margin.left + w, bottom: margin.top + h };
}

/** Maps [d0, d1] onto [r0, r1] linearly; a zero-width domain maps everything to the middle. */
export function linearScale(domain: readonly [number, number], range: readonly [number, number]): (v: number) => number {
  const [d0, d1] = domain;
  const [r0, r1] = range;
  if (d1 === d0) return () => (r0 + r1) / 2;
  return (v) => r0 + ((v - d0) / (d1 - d0)) * (r1 - r0);
}

/** Centre of the index-th of `count` equal bands laid along [start, start + length]. */
export function bandCentre(index: number, count: number, start: number, length: number): number {
  return start + ((index + 0.5) * length) / count;
}

/**
 * Evenly spaced round ticks covering [min, max], at most about `maxTicks` of them. `steps` are the
 * allowed step sizes within one decade (1, 2, 5 by default) or, when `fixedSteps` is given, the
 * only allowed step sizes (eighths of an inch and up, so inch ticks land on marks of a tape).
 */
export function niceTicks(min: number, max: number, maxTicks = 5, fixedSteps?: readonly number[]): number[] {
  if (!(Number.isFinite(min) && Number.isFinite(max))) return [];
  if (max < min) [min, max] = [max, min];
  if (max === min) {
    const pad = Math.abs(min) > 0 ? Math.abs(min) * 0.5 : 1;
    min -= pad;
    max += pad;
  }
  const rough = (max - min) / Math.max(1, maxTicks - 1);
  let step: number;
  if (fixedSteps && fixedSteps.length) {
    step = fixedSteps.find((s) => s >= rough) ?? fixedSteps[fixedSteps.length - 1]!;
    while ((max - min) / step > maxTicks * 2) step *= 2;
  } else {
    const decade = 10 ** Math.floor(Math.log10(rough));
    step = ([1, 2, 5, 10].map((m) => m * decade).find((s) => s >= rough) ?? 10 * decade);
  }
  const first = Math.floor(min / step + 1e-9) * step;
  const last = Math.ceil(max / step - 1e-9) * step;
  const ticks: number[] = [];
  for (let v = first, i = 0; v <= last + step * 1e-9 && i < 100; v = first + ++i * step) {
    // Strip float noise such as 0.30000000000000004 and a negative zero.
    ticks.push(Number(v.toFixed(10)) + 0);
  }
  return ticks;
}

/** Tick steps in inches: eighths and their doublings, as on a tape measure. */
export const INCH_STEPS = [1 / 8, 1 / 4, 1 / 2, 1, 2, 4, 6, 12] as const;

export function mmPerUnit(unit: LengthUnit): number {
  return unit === 'in' ? MM_PER_INCH : MM_PER_CM;
}

/** A length tick's label without the unit (the axis title carries it): "1 3/8", "-0.5". */
export function lengthTickLabel(valueInUnit: number, unit: LengthUnit): string {
  return formatLength(valueInUnit * mmPerUnit(unit), unit).replace(/ (in|cm)$/, '');
}

// ---------------------------------------------------------------------------------------------
// Colour

function hexToRgb(hex: string): [number, number, number] {
  const h = hex.replace('#', '');
  return [0, 2, 4].map((i) => parseInt(h.slice(i, i + 2), 16)) as [number, number, number];
}

/** Mixes two #rrggbb colours: t = 0 gives `a`, t = 1 gives `b`. */
export function mixHex(a: string, b: string, t: number): string {
  const x = hexToRgb(a);
  const y = hexToRgb(b);
  const u = Math.min(1, Math.max(0, t));
  return `#${x.map((c, i) => Math.round(c + (y[i]! - c) * u).toString(16).padStart(2, '0')).join('')}`.toUpperCase();
}

/** WCAG 2 relative luminance of a #rrggbb colour. */
export function relativeLuminance(hex: string): number {
  const [r, g, b] = hexToRgb(hex).map((c) => {
    const x = c / 255;
    return x <= 0.04045 ? x / 12.92 : ((x + 0.055) / 1.055) ** 2.4;
  }) as [number, number, number];
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

/** WCAG 2 contrast ratio of two colours, 1 … 21. */
export function contrastRatio(a: string, b: string): number {
  const [hi, lo] = [relativeLuminance(a), relativeLuminance(b)].sort((x, y) => y - x) as [number, number];
  return (hi + 0.05) / (lo + 0.05);
}

/**
 * The darkest heat shade: the thread green lightened by 30 %, the darkest tone on which the ink
 * text still reads at the 4.5 : 1 contrast WCAG 2 asks of small text. Keeping every shade at or
 * above it means each cell's k/n reads in the same ink, with no switch of text colour mid-scale.
 */
export const HEAT_DARKEST = mixHex(colors.thread, colors.surface, 0.3);

/** Shade of a heat cell: white at 0 %, HEAT_DARKEST at 100 %. */
export function rateShade(rate: number): string {
  return mixHex(colors.surface, HEAT_DARKEST, rate);
}

// ---------------------------------------------------------------------------------------------
// Rate per size with its 95 % Wilson interval

export const RATE_CHART = { height: 220, margin: { top: 12, right: 12, bottom: 40, left: 44 } } as const;

export type RateMark = {
  size: string;
  index: number;
  x: number;
  n: number;
  k: number;
  /** Null for a size nobody reported on. */
  y: number | null;
  yLow: number | null;
  yHigh: number | null;
  flagged: boolean;
};

export type RateGeometry = {
  width: number;
  height: number;
  plot: Plot;
  bandWidth: number;
  ticks: { value: number; y: number; label: string }[];
  marks: RateMark[];
  /** The overall rate of the draft as a line across the plot. */
  overall: { y: number; yLow: number; yHigh: number } | null;
};

export function rateGeometry(
  bySize: readonly SizeStats[],
  width: number,
  opts: { flaggedSizes?: readonly string[]; overall?: { rate: number; wilson: readonly [number, number] } } = {},
): RateGeometry {
  const { height, margin } = RATE_CHART;
  const plot = plotArea(width, height, margin);
  const y = linearScale([0, 1], [plot.bottom, plot.top]);
  const count = Math.max(1, bySize.length);
  const flagged = new Set(opts.flaggedSizes ?? []);
  return {
    width,
    height,
    plot,
    bandWidth: plot.width / count,
    ticks: [0, 0.25, 0.5, 0.75, 1].map((v) => ({ value: v, y: y(v), label: `${Math.round(v * 100)}%` })),
    marks: bySize.map((s, index) => ({
      size: s.size,
      index,
      x: bandCentre(index, count, plot.left, plot.width),
      n: s.n,
      k: s.k,
      y: s.rate === null ? null : y(s.rate),
      yLow: s.wilson ? y(s.wilson[0]) : null,
      yHigh: s.wilson ? y(s.wilson[1]) : null,
      flagged: flagged.has(s.size),
    })),
    overall: opts.overall ? { y: y(opts.overall.rate), yLow: y(opts.overall.wilson[0]), yHigh: y(opts.overall.wilson[1]) } : null,
  };
}

// ---------------------------------------------------------------------------------------------
// Amount against size with the fitted line

export const AMOUNT_CHART = { height: 220, margin: { top: 12, right: 12, bottom: 40, left: 56 } } as const;

export type AmountSlope = { slopeMmPerSize: number; interceptMm: number };

/**
 * The fitted line's value at two size positions. The engine regresses the signed amount (mm) on the
 * size's 0-based position in the pattern's size list (grading order), so x here is that same
 * position, never a size label read as a number.
 */
export function fittedLineEnds(fit: AmountSlope, fromIndex: number, toIndex: number): [{ index: number; mm: number }, { index: number; mm: number }] {
  return [
    { index: fromIndex, mm: fit.interceptMm + fit.slopeMmPerSize * fromIndex },
    { index: toIndex, mm: fit.interceptMm + fit.slopeMmPerSize * toIndex },
  ];
}

export type AmountGeometry = {
  width: number;
  height: number;
  plot: Plot;
  bandWidth: number;
  unit: LengthUnit;
  /** Every size of the range in grading order, for the x axis. */
  sizeLabels: string[];
  ticks: { value: number; y: number; label: string }[];
  /** Mean amount of the testers of each size who made the change. */
  points: { size: string; index: number; x: number; y: number; meanMm: number; k: number }[];
  zeroY: number;
  /** Drawn over the sizes that have amounts only: the engine fitted nothing beyond them. */
  line: { x1: number; y1: number; x2: number; y2: number; fromMm: number; toMm: number; fromIndex: number; toIndex: number } | null;
};

export function amountGeometry(bySize: readonly SizeStats[], fit: AmountSlope | null, width: number, unit: LengthUnit): AmountGeometry {
  const { height, margin } = AMOUNT_CHART;
  const plot = plotArea(width, height, margin);
  const count = Math.max(1, bySize.length);
  const per = mmPerUnit(unit);
  const withAmounts = bySize.map((s, index) => ({ s, index })).filter(({ s }) => s.k > 0 && s.meanMm !== null);
  const first = withAmounts[0]?.index;
  const last = withAmounts[withAmounts.length - 1]?.index;
  const ends = fit && first !== undefined && last !== undefined && last > first ? fittedLineEnds(fit, first, last) : null;
  // Zero is always on the axis, so the size of a change is read honestly.
  const values = [0, ...withAmounts.map(({ s }) => (s.meanMm as number) / per), ...(ends ? ends.map((e) => e.mm / per) : [])];
  const ticks = niceTicks(Math.min(...values), Math.max(...values), 5, unit === 'in' ? INCH_STEPS : undefined);
  const lo = ticks[0] ?? 0;
  const hi = ticks[ticks.length - 1] ?? 1;
  const y = linearScale([lo, hi], [plot.bottom, plot.top]);
  const x = (index: number) => bandCentre(index, count, plot.left, plot.width);
  return {
    width,
    height,
    plot,
    bandWidth: plot.width / count,
    unit,
    sizeLabels: bySize.map((s) => s.size),
    ticks: ticks.map((v) => ({ value: v, y: y(v), label: lengthTickLabel(v, unit) })),
    points: withAmounts.map(({ s, index }) => ({ size: s.size, index, x: x(index), y: y((s.meanMm as number) / per), meanMm: s.meanMm as number, k: s.k })),
    zeroY: y(0),
    line: ends
      ? {
          x1: x(ends[0].index),
          y1: y(ends[0].mm / per),
          x2: x(ends[1].index),
          y2: y(ends[1].mm / per),
          fromMm: ends[0].mm,
          toMm: ends[1].mm,
          fromIndex: ends[0].index,
          toIndex: ends[1].index,
        }
      : null,
  };
}

// ---------------------------------------------------------------------------------------------
// Size × alteration heat grid

export const HEAT_GRID = {
  /** Narrower cells cannot hold "12/12" legibly; the grid scrolls sideways instead. */
  minCell: 38,
  maxCell: 72,
  cellHeight: 32,
  header: 24,
  rowGap: 4,
  /** Row names above each row on a narrow chart, beside it from this width on. */
  sideLabelsFrom: 560,
  rowLabelHeight: 20,
} as const;

export type HeatRow = { key: string; label: string; bySize: readonly SizeStats[]; flaggedSizes?: readonly string[] };

export type HeatCell = {
  rowKey: string;
  size: string;
  x: number;
  y: number;
  width: number;
  height: number;
  n: number;
  k: number;
  rate: number | null;
  fill: string;
  textColor: string;
  text: string;
  flagged: boolean;
};

export type HeatGeometry = {
  width: number;
  height: number;
  sideLabels: boolean;
  labelWidth: number;
  cellWidth: number;
  columns: { size: string; x: number }[];
  rows: { key: string; label: string; labelX: number; labelY: number; y: number }[];
  cells: HeatCell[];
};

export function heatGeometry(rows: readonly HeatRow[], sizes: readonly string[], availableWidth: number): HeatGeometry {
  const g = HEAT_GRID;
  const sideLabels = availableWidth >= g.sideLabelsFrom;
  const labelWidth = sideLabels ? Math.min(220, Math.max(120, availableWidth * 0.3)) : 0;
  const count = Math.max(1, sizes.length);
  const cellWidth = Math.min(g.maxCell, Math.max(g.minCell, (availableWidth - labelWidth) / count));
  const width = labelWidth + cellWidth * count;
  const rowHeight = g.cellHeight + g.rowGap + (sideLabels ? 0 : g.rowLabelHeight);
  const columns = sizes.map((size, i) => ({ size, x: labelWidth + i * cellWidth }));
  const outRows = rows.map((r, i) => {
    const top = g.header + i * rowHeight;
    const y = top + (sideLabels ? 0 : g.rowLabelHeight);
    return { key: r.key, label: r.label, labelX: 0, labelY: sideLabels ? y + g.cellHeight / 2 : top + g.rowLabelHeight / 2, y };
  });
  const cells: HeatCell[] = [];
  rows.forEach((r, i) => {
    const flagged = new Set(r.flaggedSizes ?? []);
    const bySize = new Map(r.bySize.map((s) => [s.size, s]));
    sizes.forEach((size, j) => {
      const s = bySize.get(size);
      const n = s?.n ?? 0;
      const k = s?.k ?? 0;
      const rate = n > 0 ? k / n : null;
      cells.push({
        rowKey: r.key,
        size,
        x: columns[j]!.x,
        y: outRows[i]!.y,
        width: cellWidth,
        height: g.cellHeight,
        n,
        k,
        rate,
        fill: rate === null ? colors.surfaceSunken : rateShade(rate),
        textColor: rate === null ? colors.inkMuted : colors.ink,
        text: n > 0 ? `${k}/${n}` : '–',
        flagged: flagged.has(size),
      });
    });
  });
  return { width, height: g.header + rows.length * rowHeight, sideLabels, labelWidth, cellWidth, columns, rows: outRows, cells };
}
