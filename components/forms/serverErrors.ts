import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';

import { isApiError } from '@/components/queries';

/**
 * Puts the server's per-field messages (`details[].path`) next to the fields they name, moves
 * focus to the first of them (so a keyboard or screen-reader user lands on what to fix), and
 * returns the message left for the form as a whole, if any. `fieldOf` maps a server path to a
 * form field when the two are named differently.
 */
export function applyServerErrors<T extends FieldValues>(
  error: unknown,
  fields: readonly Path<T>[],
  setError: UseFormSetError<T>,
  fieldOf: (serverPath: string) => string | undefined = (p) => p,
): string | null {
  if (!isApiError(error)) return error instanceof Error ? error.message : 'Something went wrong.';
  let placed = false;
  for (const detail of error.details) {
    const name = fieldOf(detail.path);
    const field = fields.find((f) => f === name);
    if (field) {
      setError(field, { type: 'server', message: detail.message }, { shouldFocus: !placed });
      placed = true;
    }
  }
  // A field message says what to fix; the sentence adds why only when nothing was placed.
  return placed && error.status === 400 ? null : error.message;
}
