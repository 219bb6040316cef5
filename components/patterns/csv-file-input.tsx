/** Native apps paste the CSV text instead; a file picker exists on the web only (see .web.tsx). */
export function CsvFileInput(_props: { onText: (text: string) => void }) {
  return null;
}
