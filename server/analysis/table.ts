// Plain-text rendering of an analysis for people reading it in a terminal (`--table`).
import type { AnalysisOutput } from './types';

function renderTable(headers: string[], rows: string[][]): string {
  const widths = headers.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? '').length)));
  const line = (cells: string[]) => cells.map((c, i) => c.padEnd(widths[i] ?? 0)).join('  ').trimEnd();
  return [line(headers), line(widths.map((w) => '-'.repeat(w))), ...rows.map(line)].join('\n');
}

const p3 = (p: number | null | undefined) => (p === null || p === undefined ? '—' : p < 0.001 ? '<0.001' : p.toFixed(3));
const pc = (x: number) => `${Math.round(x * 100)}%`;
const f1 = (x: number | null) => (x === null ? '—' : x.toFixed(1));

export function formatTable(out: AnalysisOutput): string {
  const parts: string[] = [];
  parts.push(`Draft ${out.draft}: ${out.testers} testers, ${out.findings.length} alteration kinds`);
  parts.push('');
  parts.push(
    renderTable(
      ['class', 'kind', 'dir', 'k/n', 'rate', '95% interval', 'median mm', 'trend p', 'slope mm/size (p)', 'body r (p, n)', 'sizes'],
      out.findings.map((f) => [
        f.class,
        f.kind,
        f.direction,
        `${f.count}/${f.testers}`,
        pc(f.rate),
        `${pc(f.wilson[0])}–${pc(f.wilson[1])}`,
        f1(f.medianMm),
        p3(f.trend.p),
        f.amountSlope ? `${f.amountSlope.slopeMmPerSize.toFixed(1)} (${p3(f.amountSlope.p)})` : '—',
        f.bodyCorrelation ? `${f.bodyCorrelation.r.toFixed(2)} (${p3(f.bodyCorrelation.p)}, ${f.bodyCorrelation.n})` : '—',
        f.sizes.join(' '),
      ]),
    ),
  );
  const flagged = out.findings.filter((f) => f.class !== 'none' && f.class !== 'too-few-reports');
  if (flagged.length > 0) {
    parts.push('', 'Reasons');
    for (const f of flagged) {
      parts.push(`* ${f.kind} (${f.direction}) — ${f.class}`);
      for (const r of f.reasons) parts.push(`    ${r}`);
    }
  }
  if (out.comparison) {
    parts.push('', 'Draft comparison');
    parts.push(
      out.comparison.length === 0
        ? '(no flagged findings in the earlier draft)'
        : renderTable(
            ['kind', 'dir', 'class', 'from', 'to', 'k/n from', 'k/n to', 'p', 'status'],
            out.comparison.map((c) => [
              c.kind + (c.sizes.length ? ` [${c.sizes.join(' ')}]` : ''),
              c.direction,
              c.class,
              c.from,
              c.to,
              `${c.countFrom}/${c.testersFrom}`,
              `${c.countTo}/${c.testersTo}`,
              p3(c.p),
              c.status,
            ]),
          ),
    );
  }
  if (out.fitRatings) {
    parts.push('', 'Fit ratings (−2 tight/short … +2 loose/long)');
    parts.push(
      renderTable(
        ['size', 'area', 'n', 'mean', '95% interval', 'flag'],
        out.fitRatings.map((c) => [
          c.size,
          c.area,
          String(c.n),
          c.mean.toFixed(2),
          c.interval ? `${c.interval[0].toFixed(2)} to ${c.interval[1].toFixed(2)}` : '—',
          c.flagged ? 'FLAG' : '',
        ]),
      ),
    );
  }
  if (out.fabric) {
    parts.push('', 'Fabric used against stated need');
    parts.push(
      renderTable(
        ['size', 'width mm', 'layout', 'need mm', 'n', 'median used', 'over need', 'flag'],
        out.fabric.map((c) => [
          c.size,
          String(c.widthMm),
          c.napped ? 'with nap' : 'no nap',
          c.needMm === null ? '—' : String(c.needMm),
          String(c.n),
          c.medianUsedMm.toFixed(0),
          c.overNeedShare === null ? '—' : `${c.overNeed} (${pc(c.overNeedShare)})`,
          c.flagged ? 'FLAG' : '',
        ]),
      ),
    );
  }
  if (out.unclearSteps) {
    parts.push('', 'Instruction steps reported unclear');
    parts.push(
      renderTable(
        ['step', 'testers', 'who', 'flag'],
        out.unclearSteps.map((s) => [s.step, String(s.count), s.testers.join(' '), s.flagged ? 'FLAG' : '']),
      ),
    );
  }
  return parts.join('\n') + '\n';
}
