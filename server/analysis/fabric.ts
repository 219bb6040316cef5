// Fabric check: the length testers used against the stated need per size × width, with napped /
// one-way layouts kept apart because they need more fabric by design. A size × width is flagged
// only when most of its testers, and at least two, used more than stated: one generous cutter of
// three is not a short yardage.
import { median } from 'simple-statistics';
import { resolveThresholds, type Thresholds } from './thresholds';
import type { AnalysisInput, FabricCell, FabricNeed } from './types';
import { fabric, need as needText, pct, testersWord, width } from './wording';

/**
 * The stated need for a report: same size and layout, nearest stated width within the tolerance
 * (nominal widths such as 1400/1450/1500 mm are all sold as "150 cm").
 */
export function matchNeed(
  needs: readonly FabricNeed[],
  size: string,
  widthMm: number,
  napped: boolean,
  toleranceMm: number,
): FabricNeed | null {
  let best: FabricNeed | null = null;
  for (const need of needs) {
    if (need.size !== size || need.napped !== napped) continue;
    const d = Math.abs(need.widthMm - widthMm);
    if (d > toleranceMm) continue;
    if (!best || d < Math.abs(best.widthMm - widthMm)) best = need;
  }
  return best;
}

export function fabricCheck(input: AnalysisInput, draft: string, thresholds?: Partial<Thresholds>): FabricCell[] {
  const t = resolveThresholds(thresholds);
  const needs = input.fabricNeeds ?? [];
  const byTester = new Map(input.reports.filter((r) => r.draft === draft).map((r) => [r.tester, r] as const));
  const cells = new Map<string, { size: string; widthMm: number; napped: boolean; need: FabricNeed | null; used: number[] }>();
  for (const r of byTester.values()) {
    if (!r.fabric) continue;
    const need = matchNeed(needs, r.size, r.fabric.widthMm, r.fabric.napped, t.fabricWidthToleranceMm);
    // Group by the matched stated width; unmatched reports are grouped by their own width.
    const widthMm = need ? need.widthMm : r.fabric.widthMm;
    const k = `${r.size}\u0000${widthMm}\u0000${r.fabric.napped}`;
    const cell = cells.get(k) ?? { size: r.size, widthMm, napped: r.fabric.napped, need, used: [] };
    cell.used.push(r.fabric.usedMm);
    cells.set(k, cell);
  }
  const order = new Map(input.sizes.map((s, i) => [s, i] as const));
  return [...cells.values()]
    .sort(
      (a, b) =>
        (order.get(a.size) ?? 0) - (order.get(b.size) ?? 0) ||
        a.widthMm - b.widthMm ||
        Number(a.napped) - Number(b.napped),
    )
    .map(({ size, widthMm, napped, need, used }) => {
      const n = used.length;
      const med = median(used);
      const layout = napped ? 'with nap' : 'without nap';
      if (!need) {
        return {
          size, widthMm, napped, needMm: null, n, medianUsedMm: med, maxUsedMm: Math.max(...used),
          overNeed: 0, overNeedShare: null, flagged: false,
          reasons: [`Size ${size}, ${width(widthMm)} wide, ${layout}: no stated need for this width and layout to compare with.`],
        };
      }
      const over = used.filter((u) => u > need.needMm).length;
      const share = over / n;
      const flagged = share > t.fabricShortShare && over >= t.fabricMinOver;
      const reasons: string[] = [];
      if (flagged) {
        reasons.push(
          `Size ${size}, ${width(widthMm)} wide, ${layout}: ${over} of ${testersWord(n)} (${pct(share)}) used more than ` +
            `the stated ${needText(need.needMm)} (median used ${fabric(med)}, most ${fabric(Math.max(...used))}; rule: more than ` +
            `${pct(t.fabricShortShare)} of the testers and at least ${t.fabricMinOver}).`,
        );
      } else if (over > 0) {
        reasons.push(
          `Size ${size}, ${width(widthMm)} wide, ${layout}: ${over} of ${testersWord(n)} used more than the stated ` +
            `${needText(need.needMm)}, not most of them (median used ${fabric(med)}).`,
        );
      }
      return {
        size, widthMm, napped, needMm: need.needMm, n, medianUsedMm: med, maxUsedMm: Math.max(...used),
        overNeed: over, overNeedShare: share, flagged, reasons,
      };
    });
}
