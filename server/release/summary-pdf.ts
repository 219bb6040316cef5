import PDFDocument from 'pdfkit';
import type { Storage } from '../storage/storage';
import { readObject } from '../storage/read-object';
import type { TrialSummary } from './summary.service';

const MARGIN = 48;
const INK = '#1F1D1A';
const MUTED = '#5E5850';
const THREAD = '#2E5E58';
const LINE = '#E2D9CB';

/**
 * The standard PDF fonts (Helvetica here) carry the WinAnsi characters only: the few others our
 * words use are written in their nearest WinAnsi form rather than printed as the wrong glyph.
 */
export function pdfText(value: string): string {
  return value
    .replace(/\u2212/g, '-')
    .replace(/[\u2264]/g, '<=')
    .replace(/[\u2265]/g, '>=')
    .replace(/\u00d7/g, 'x')
    .replace(/[\u2192]/g, '->')
    .replace(/[^\x20-\x7e\u00a0-\u00ff\u2013\u2014\u2018\u2019\u201c\u201d\u2022\u2026\n]/g, '?');
}

type Column = { title: string; width: number; align?: 'left' | 'right' };

function formatDate(d: Date | string | null): string {
  if (!d) return '';
  return new Date(d).toISOString().slice(0, 10);
}

/**
 * The trial summary as an A4 PDF, made with pdfkit: the same sections as the summary page, tables
 * that break across pages with their header repeated, and the shared photos as thumbnails.
 */
export async function summaryPdf(summary: TrialSummary, storage: Storage | null): Promise<Buffer> {
  const doc = new PDFDocument({ size: 'A4', margin: MARGIN, info: { Title: pdfText(`${summary.trial.title}: trial summary`), Author: pdfText(summary.trial.studioName), Creator: 'Basted' } });
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  const bottom = () => doc.page.height - MARGIN;
  const width = doc.page.width - 2 * MARGIN;
  const ensure = (h: number) => {
    if (doc.y + h > bottom()) doc.addPage();
  };
  const heading = (text: string) => {
    ensure(60);
    doc.moveDown(0.8);
    doc.font('Helvetica-Bold').fontSize(14).fillColor(THREAD).text(pdfText(text), MARGIN, doc.y, { width });
    doc.moveDown(0.3);
    doc.fillColor(INK);
  };
  const para = (text: string, color = INK, size = 10) => {
    doc.font('Helvetica').fontSize(size).fillColor(color).text(pdfText(text), MARGIN, doc.y, { width });
    doc.fillColor(INK);
  };
  const table = (columns: Column[], rows: string[][]) => {
    const total = columns.reduce((n, c) => n + c.width, 0);
    const widths = columns.map((c) => (c.width / total) * width);
    const pad = 4;
    const drawRow = (cells: string[], bold: boolean) => {
      doc.font(bold ? 'Helvetica-Bold' : 'Helvetica').fontSize(9);
      const h = Math.max(...cells.map((c, i) => doc.heightOfString(pdfText(c), { width: widths[i] - 2 * pad }))) + 2 * pad;
      if (doc.y + h > bottom()) {
        doc.addPage();
        if (!bold) drawRow(columns.map((c) => c.title), true);
        doc.font(bold ? 'Helvetica-Bold' : 'Helvetica').fontSize(9);
      }
      const y = doc.y;
      let x = MARGIN;
      cells.forEach((c, i) => {
        doc.fillColor(bold ? THREAD : INK).text(pdfText(c), x + pad, y + pad, { width: widths[i] - 2 * pad, align: columns[i].align ?? 'left' });
        x += widths[i];
      });
      doc.moveTo(MARGIN, y + h).lineTo(MARGIN + width, y + h).lineWidth(0.5).strokeColor(LINE).stroke();
      doc.x = MARGIN;
      doc.y = y + h;
    };
    drawRow(columns.map((c) => c.title), true);
    for (const row of rows) drawRow(row, false);
    doc.fillColor(INK);
  };

  // Title block.
  const t = summary.trial;
  doc.font('Helvetica-Bold').fontSize(20).fillColor(INK).text(pdfText(t.title), { width });
  doc.moveDown(0.2);
  para(`${t.studioName} · ${t.pattern.name} · ${t.releasedAt ? `released ${formatDate(t.releasedAt)}` : `not released yet (${t.state})`}`, MUTED, 11);
  para(`Trial summary made ${formatDate(new Date())} by Basted.`, MUTED, 9);
  if (t.milestones.length) para(t.milestones.map((m) => `${m.label}: ${formatDate(m.dueAt)}`).join(' · '), MUTED, 9);

  heading('Coverage reached');
  para(`${summary.coverage.finished} of ${summary.coverage.target} places filled by testers who finished (${summary.coverage.enrolled} enrolled).`);
  if (summary.coverage.gapNote) para(`Gap accepted: ${summary.coverage.gapNote}`, MUTED);
  doc.moveDown(0.3);
  table(
    [{ title: 'Size', width: 2 }, { title: 'Wanted', width: 1, align: 'right' }, { title: 'Enrolled', width: 1, align: 'right' }, { title: 'Finished', width: 1, align: 'right' }],
    summary.coverage.sizes.map((c) => [c.size, String(c.target), String(c.enrolled), String(c.finished)]),
  );

  heading('Reports in');
  table(
    [{ title: 'Stage', width: 2 }, { title: 'Expected', width: 1, align: 'right' }, { title: 'In', width: 1, align: 'right' }, { title: 'On time', width: 1, align: 'right' }, { title: 'Late', width: 1, align: 'right' }],
    summary.reports.stages.map((s) => [s.label, String(s.expected), String(s.submitted), String(s.onTime), String(s.late)]),
  );

  heading('Findings and their triage');
  if (summary.findings.drafts.length === 0) para('No submitted reports, so no findings.', MUTED);
  for (const d of summary.findings.drafts) {
    ensure(40);
    doc.moveDown(0.3);
    const others = d.others === 1 ? '1 other kind of alteration points' : `${d.others} other kinds of alteration point`;
    para(`Draft ${d.draft}: ${d.testers} testers reported${d.others ? `; ${others} at no pattern problem or had too few reports` : ''}.`, INK, 10);
    doc.moveDown(0.2);
    if (d.findings.length === 0) {
      para('Nothing points at the pattern.', MUTED);
      continue;
    }
    table(
      [{ title: 'Finding', width: 4 }, { title: 'Class', width: 2.4 }, { title: 'Testers', width: 1.3, align: 'right' }, { title: 'Sizes', width: 1.6 }, { title: 'Triage', width: 2.4 }],
      d.findings.map((f) => [f.name, f.classLabel, `${f.count} of ${f.testers}`, f.sizes.join(', '), f.triageLabel]),
    );
  }

  heading(`Changes for the next draft${summary.findings.latestDraft ? ` (from draft ${summary.findings.latestDraft})` : ''}`);
  if (summary.findings.changes.length === 0) para('No finding is marked “will fix”.', MUTED);
  else
    table(
      [{ title: 'Finding', width: 3.5 }, { title: 'Size', width: 1 }, { title: 'Change', width: 1.6, align: 'right' }, { title: 'Range', width: 2.6 }, { title: 'Note', width: 3 }],
      summary.findings.changes.map((c) => [c.finding, c.size, c.change, c.range ?? '', c.note]),
    );

  heading('Draft history');
  table(
    [{ title: 'Draft', width: 1 }, { title: 'Uploaded', width: 1.6 }, { title: 'Files', width: 1 }, { title: 'What changed', width: 6 }],
    summary.drafts.map((d) => [`${d.version}${d.final ? ' (final)' : ''}`, formatDate(d.createdAt), String(d.files.length), d.changeNote]),
  );

  heading('Photos testers allowed the studio to share');
  if (t.photosRemovedAt) para(`The photos were removed on ${formatDate(t.photosRemovedAt)}, as the studio keeps them for a set time after a release.`, MUTED);
  else if (summary.photos.length === 0) para('No tester allowed sharing a photo.', MUTED);
  else {
    const perRow = 4;
    const cell = (width - (perRow - 1) * 8) / perRow;
    let col = 0;
    let rowTop = doc.y + 4;
    for (const p of summary.photos) {
      const h = Math.min(cell * (p.height / p.width), cell * 1.6);
      if (col === 0) {
        if (rowTop + cell * 1.6 + 20 > bottom()) {
          doc.addPage();
          rowTop = doc.y;
        }
      }
      const x = MARGIN + col * (cell + 8);
      try {
        const bytes = storage ? await readObject(storage, 'photos', p.thumbKey) : null;
        if (bytes) doc.image(bytes, x, rowTop, { fit: [cell, h] });
      } catch {
        doc.rect(x, rowTop, cell, h).strokeColor(LINE).stroke();
      }
      doc.font('Helvetica').fontSize(8).fillColor(MUTED).text(pdfText(`Size ${p.size}, ${p.view}, ${p.stage === 'final' ? 'garment' : 'toile'}`), x, rowTop + h + 2, { width: cell });
      col += 1;
      if (col === perRow) {
        col = 0;
        rowTop += cell * 1.6 + 20;
      }
    }
    doc.x = MARGIN;
    doc.y = col === 0 ? rowTop : rowTop + cell * 1.6 + 20;
  }
  doc.end();
  return done;
}
