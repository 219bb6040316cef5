// Plain-text rendering of an analysis for people reading it in a terminal (`--table`).
import type { AnalysisOutput } from './types';
import { MM_READER, findingName, type Reader } from './wording';

function renderTable(headers: string[], rows: string[][]): string {
  const widths = headers.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? '').length)));
  const line = (cells: string[]) => cells.map((c, i) => c.padEnd(widths[i] ?? 0)).join('  ').trimEnd();
  return [line(headers), line(widths.map((w) => '-'.repeat(w))), ...rows.map(line)].join('\n');
}

const p3 = (p: number | null | undefined) => (p === null || p === undefined ? '—' : p < 0.001 ? '<0.001' : p.toFixed(3));
const pc = (x: number) => `${Math.round(x * 100)}%`;

/** `out` with its reasons already rendered (renderOutput); `reader` writes the change table's lengths. */
export function formatTable(out: AnalysisOutput, reader: Reader = MM_READER): string {
  const parts: string[] = [];
  parts.push(`Draft ${out.draft}: ${out.testers} testers, ${out.findings.length} alteration kinds`);
  parts.push('');
  parts.push(
    renderTable(
      ['class', 'kind', 'dir', 'k/n', 'rate', '95% interval', 'median', 'size trend p', 'share trend p', 'body r (p, n)', 'sizes'],
      out.findings.map((f) => [
        f.class,
        f.kind,
        f.direction,
        `${f.count}/${f.testers}`,
        pc(f.rate),
        `${pc(f.wilson[0])}–${pc(f.wilson[1])}`,
        f.medianMm === null ? '—' : reader.length(f.medianMm),
        p3(f.sizeTrend?.p),
        p3(f.trend.p),
        f.bodyCorrelation ? `${f.bodyCorrelation.r.toFixed(2)} (${p3(f.bodyCorrelation.p)}, ${f.bodyCorrelation.n})` : '—',
        f.sizes.join(' '),
      ]),
    ),
  );
  const flagged = out.findings.filter((f) => f.class !== 'none' && f.class !== 'too-few-reports');
  if (flagged.length > 0) {
    parts.push('', 'Reasons');
    for (const f of flagged) {
      parts.push(`* ${findingName(f)} — ${f.class}`);
      for (const r of f.reasons) parts.push(`    ${r}`);
    }
  }
  if (out.comparison) {
    parts.push('', 'Draft comparison');
    parts.push(
      out.comparison.length === 0
        ? '(no flagged findings in the earlier draft)'
        : renderTable(
            ['kind', 'dir', 'class', 'from', 'to', 'k/n from', 'k/n to', 'p', 'change (95% interval)', 'status'],
            out.comparison.map((c) => [
              c.kind + (c.sizes.length ? ` [${c.sizes.join(' ')}]` : ''),
              c.direction,
              c.class,
              c.from,
              c.to,
              `${c.countFrom}/${c.testersFrom}`,
              `${c.countTo}/${c.testersTo}`,
              c.pExact && c.p !== null && c.p >= 0.001 ? `${p3(c.p)} (${c.pExact})` : p3(c.p),
              c.difference ? `${pc(c.difference.estimate)} (${pc(c.difference.interval[0])} to ${pc(c.difference.interval[1])})` : '—',
              c.status,
            ]),
          ),
    );
  }
  if (out.changes) {
    parts.push('', 'Suggested changes for the next draft, per size');
    parts.push(
      out.changes.length === 0
        ? '(no finding to change)'
        : renderTable(
            ['finding', 'size', 'change', 'interval', 'basis', 'note'],
            out.changes.map((c) => [
              findingName(c),
              c.size,
              c.amountMm === null ? '—' : reader.fine(c.amountMm),
              c.interval ? `${reader.fine(c.interval[0])} to ${reader.fine(c.interval[1])}` : '—',
              c.basis,
              c.note,
            ]),
          ),
    );
  }
  if (out.fitAreas) {
    parts.push('', 'Fit ratings by area over the whole range (−2 tight/short … +2 loose/long)');
    parts.push(
      renderTable(
        ['area', 'n', 'mean', 'whole range p (adj.)', 'slope per size (adj. p)', 'flag'],
        out.fitAreas.map((a) => [
          a.area,
          String(a.n),
          a.mean.toFixed(2),
          `${p3(a.whole.p)} (${p3(a.whole.adjustedP)})`,
          a.withSize ? `${a.withSize.slope.toFixed(2)} (${p3(a.withSize.adjustedP)})` : '—',
          a.flag ?? '',
        ]),
      ),
    );
  }
  if (out.fitRatings) {
    parts.push('', 'Fit ratings by size (a hint is off on average but not confirmed)');
    parts.push(
      renderTable(
        ['size', 'area', 'n', 'mean', '95% interval', 'flag'],
        out.fitRatings.map((c) => [
          c.size,
          c.area,
          String(c.n),
          c.mean.toFixed(2),
          c.interval ? `${c.interval[0].toFixed(2)} to ${c.interval[1].toFixed(2)}` : '—',
          c.flagged ? 'FLAG' : c.hint ? 'hint' : '',
        ]),
      ),
    );
  }
  if (out.fabric) {
    parts.push('', 'Fabric used against stated need');
    parts.push(
      renderTable(
        ['size', 'width', 'layout', 'stated need', 'n', 'median used', 'over need', 'flag'],
        out.fabric.map((c) => [
          c.size,
          reader.width(c.widthMm),
          c.napped ? 'with nap' : 'no nap',
          c.needMm === null ? '—' : reader.need(c.needMm),
          String(c.n),
          reader.fabric(c.medianUsedMm),
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
