import type { PhotoConsent, PhotoStage, PhotoView } from '@/hooks/use-photos';

/** Who may see a photo, in the tester's words. */
export const CONSENT_OPTIONS: readonly { value: PhotoConsent; label: string }[] = [
  { value: 'staff-only', label: 'Only the studio’s trial team' },
  { value: 'may-share', label: 'The studio may share it' },
];
export const CONSENT_LABELS: Record<PhotoConsent, string> = { 'staff-only': 'Only the studio’s trial team', 'may-share': 'The studio may share it' };
/** Short forms for a thumbnail's caption. */
export const CONSENT_SHORT: Record<PhotoConsent, string> = { 'staff-only': 'team only', 'may-share': 'may be shared' };

export const VIEW_LABELS: Record<PhotoView, string> = { front: 'Front', side: 'Side', back: 'Back', detail: 'Details' };
/** Left to right, whole figure first. */
export const VIEWS: readonly PhotoView[] = ['front', 'side', 'back', 'detail'];

export const STAGE_LABELS: Record<PhotoStage, string> = { 'check-in': 'Toile check-in', final: 'Final' };

/**
 * The server refuses photos over 15 MB (PHOTO_MAX_BYTES in server/files/content-check.ts); checking
 * here first spares a long upload that would be refused. The server stays the authority.
 */
export const PHOTO_MAX_BYTES = 15 * 1024 * 1024;
