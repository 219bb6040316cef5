import { createElement } from 'react';

/** A file chooser for a .csv; its text is handed over as it is, to be checked by the server. */
export function CsvFileInput({ onText }: { onText: (text: string) => void }) {
  return createElement('input', {
    type: 'file',
    accept: '.csv,text/csv,text/plain',
    'aria-label': 'Choose a CSV file',
    style: { fontFamily: 'Inter_400Regular', fontSize: 14 },
    onChange: async (event: { target: HTMLInputElement }) => {
      const file = event.target.files?.[0];
      if (file) onText(await file.text());
      event.target.value = '';
    },
  });
}
