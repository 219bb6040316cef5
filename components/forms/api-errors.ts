import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { ApiError } from '@/hooks/api';

/**
 * Puts a failed request's per-field messages beside the fields the form has, and returns the
 * message for the form as a whole (null when every problem found its field).
 */
export function applyApiError<T extends FieldValues>(error: unknown, setError: UseFormSetError<T>, fields: readonly Path<T>[]): string | null {
  if (!(error instanceof ApiError)) return 'Something went wrong. Please try again.';
  let unplaced = false;
  for (const [name, message] of Object.entries(error.fields ?? {})) {
    const field = fields.find((f) => f === name || name.startsWith(`${f}.`));
    if (field) setError(field, { type: 'server', message });
    else unplaced = true;
  }
  return !error.fields || unplaced ? error.message : null;
}
