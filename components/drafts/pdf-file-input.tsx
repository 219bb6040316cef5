/** Native apps pick files with a document picker (not wired yet); uploads work on the web. */
export function PdfFileInput(_props: { label: string; onFile: (file: File | null) => void }) {
  return null;
}
