import { inflateSync } from 'node:zlib';

// WinAnsi (PDF 32000-1 Annex D.2) differs from latin1 in 0x80–0x9F: the ones our words use.
const WIN_ANSI: Record<number, string> = { 0x85: '…', 0x91: '‘', 0x92: '’', 0x93: '“', 0x94: '”', 0x95: '•', 0x96: '–', 0x97: '—' };
const decode = (hex: string) => [...Buffer.from(hex, 'hex')].map((b) => WIN_ANSI[b] ?? String.fromCharCode(b)).join('');

/**
 * The text drawn on the pages of a PDF that pdfkit wrote with its standard fonts: every content
 * stream inflated (FlateDecode), and the hex strings of its Tj/TJ operators decoded as WinAnsi
 * (latin1 for the characters our text uses), one line per text operator. Enough to check what a
 * summary says; structure and page count are checked with pdf-lib beside it.
 */
export function pdfText(pdf: Buffer): string {
  const raw = pdf.toString('latin1');
  const lines: string[] = [];
  const streams = /stream\r?\n([\s\S]*?)\r?\nendstream/g;
  for (let m = streams.exec(raw); m; m = streams.exec(raw)) {
    let content: string;
    try {
      content = inflateSync(Buffer.from(m[1], 'latin1')).toString('latin1');
    } catch {
      continue;
    }
    const ops = /\[((?:<[0-9a-fA-F]*>|\s|-?\d+(?:\.\d+)?)*)\]\s*TJ|<([0-9a-fA-F]*)>\s*Tj/g;
    for (let op = ops.exec(content); op; op = ops.exec(content)) {
      const hexes = op[1] !== undefined ? [...op[1].matchAll(/<([0-9a-fA-F]*)>/g)].map((h) => h[1]) : [op[2]];
      lines.push(hexes.map(decode).join(''));
    }
  }
  return lines.join('\n');
}
