/** The kinds of file a draft carries, in the order the app lists them. */
export const DRAFT_FILE_KINDS = ['print-a4', 'print-letter', 'copy-shop', 'projector', 'instructions'] as const;
export type DraftFileKind = (typeof DRAFT_FILE_KINDS)[number];

export const DRAFT_FILE_LABELS: Record<DraftFileKind, string> = {
  'print-a4': 'Print at home, A4',
  'print-letter': 'Print at home, US letter',
  'copy-shop': 'Copy shop (large format)',
  projector: 'Projector',
  instructions: 'Instructions',
};
