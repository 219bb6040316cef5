/** Printing is a web matter; the native apps share the server's PDF instead. */
export function PrintStyle() {
  return null;
}

export function printPage(): void {}

export const canPrint = false;
