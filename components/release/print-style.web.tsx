import { useEffect } from 'react';

/**
 * While a printable page is open: print on paper without the app around it. Navigation and the
 * page's own buttons (ids starting "print-hide") are left out, every scrolling box shows all of
 * its content, and cards are not split across pages where it can be helped.
 */
const CSS = `@media print {
  @page { margin: 14mm; }
  html, body, #root, #root div { height: auto !important; max-height: none !important; overflow: visible !important; }
  [role="navigation"], [id^="print-hide"] { display: none !important; }
  body { background: #fff !important; }
  [id^="print-card"] { break-inside: avoid; }
}`;

export function PrintStyle() {
  useEffect(() => {
    const style = document.createElement('style');
    style.setAttribute('data-basted', 'print');
    style.textContent = CSS;
    document.head.appendChild(style);
    return () => style.remove();
  }, []);
  return null;
}

/** Opens the browser's print dialogue (save as PDF is one of its choices). */
export function printPage(): void {
  window.print();
}

export const canPrint = true;
