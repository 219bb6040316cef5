import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { ApiError } from '@/hooks/api';

/** The label a form shows for a field path: the longest labelled prefix ("milestones.selection" → "Testers chosen"). */
function labelOf(path: string, labels: Record<string, string>): string | null {
  let best: string | null = null;
  for (const key of Object.keys(labels)) {
    if ((path === key || path.startsWith(`${key}.`)) && (best === null || key.length > best.length)) best = key;
  }
  return best === null ? null : labels[best];
}

/**
 * A failed request in words for the form's banner: the server's message and, for answers it
 * refused, the fields by the labels the person sees ("Please check: Sewing experience,
 * Deadlines."), never the fields' names in the code.
 */
export function describeApiError(error: unknown, labels: Record<string, string>, fallback = 'Something went wrong. Please try again.'): string {
  if (!(error instanceof ApiError)) return error instanceof Error ? error.message : fallback;
  const paths = Object.keys(error.fields ?? {});
  if (paths.length === 0) return error.message;
  const named = [...new Set(paths.map((p) => labelOf(p, labels) ?? 'another answer'))];
  return `${error.message} Please check: ${named.join(', ')}.`;
}

/**
 * Puts a failed request's per-field messages beside the fields the form has, and returns the
 * message for the form as a whole (null when every problem found its field). `labels` names
 * the fields in the banner when some problem has no field of its own.
 */
export function applyApiError<T extends FieldValues>(error: unknown, setError: UseFormSetError<T>, fields: readonly Path<T>[], labels: Record<string, string> = {}): string | null {
  if (!(error instanceof ApiError)) return 'Something went wrong. Please try again.';
  let unplaced = false;
  for (const [name, message] of Object.entries(error.fields ?? {})) {
    const field = fields.find((f) => f === name || name.startsWith(`${f}.`));
    // A nested path (measurementsMm.hip) goes to its own input when the form has one.
    if (field) setError(name as Path<T>, { type: 'server', message });
    else unplaced = true;
  }
  if (!error.fields || Object.keys(error.fields).length === 0) return error.message;
  return unplaced ? describeApiError(error, labels) : null;
}
