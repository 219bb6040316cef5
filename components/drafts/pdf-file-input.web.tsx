import { createElement } from 'react';

/** A file chooser for one PDF; the server checks the content, this only narrows the dialog. */
export function PdfFileInput({ label, onFile }: { label: string; onFile: (file: File | null) => void }) {
  return createElement('input', {
    type: 'file',
    accept: 'application/pdf,.pdf',
    'aria-label': label,
    style: { fontFamily: 'Inter_400Regular', fontSize: 14 },
    onChange: (event: { target: HTMLInputElement }) => onFile(event.target.files?.[0] ?? null),
  });
}
