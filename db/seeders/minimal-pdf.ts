/**
 * A PDF written out by hand from its objects (numbered 1, 2, … in order; object 1 is the catalog):
 * the "%PDF-1.4" header (ISO 32000-1 §7.5.2), the objects, a cross-reference table with each
 * object's byte offset, and the trailer ending in %%EOF (§7.5.4–7.5.5). Enough for demo drafts and
 * test files; no fonts are embedded (the standard Type 1 fonts need none).
 */
export function assemblePdf(objects: string[]): Buffer {
  let text = '%PDF-1.4\n';
  const offsets: number[] = [];
  objects.forEach((body, i) => {
    offsets.push(Buffer.byteLength(text, 'latin1'));
    text += `${i + 1} 0 obj\n${body}\nendobj\n`;
  });
  const xref = Buffer.byteLength(text, 'latin1');
  // Each entry is exactly 20 bytes: 10-digit offset, 5-digit generation, n/f, space and line feed.
  text += `xref\n0 ${objects.length + 1}\n0000000000 65535 f \n`;
  for (const offset of offsets) text += `${String(offset).padStart(10, '0')} 00000 n \n`;
  text += `trailer\n<< /Size ${objects.length + 1} /Root 1 0 R >>\nstartxref\n${xref}\n%%EOF\n`;
  return Buffer.from(text, 'latin1');
}
