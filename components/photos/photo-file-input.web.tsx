import { createElement } from 'react';
import type { UploadFile } from '@/hooks/upload';

/** A file chooser for one photo; on a phone browser it offers the camera too. The server checks the content. */
export function PhotoFileInput({ label, onFile, disabled = false }: { label: string; onFile: (file: UploadFile) => void; disabled?: boolean }) {
  return createElement('input', {
    type: 'file',
    accept: 'image/jpeg,image/png,image/webp',
    'aria-label': label,
    disabled,
    style: { fontFamily: 'Inter_400Regular', fontSize: 14 },
    onChange: (event: { target: HTMLInputElement }) => {
      const file = event.target.files?.[0];
      if (file) onFile(file);
      // Cleared so that choosing the same file again still counts as a choice.
      event.target.value = '';
    },
  });
}
