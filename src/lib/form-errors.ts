import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { ApiError } from './api-client.ts';

/** Puts the server's field-level errors onto the form; returns the message for anything else. */
export function applyServerErrors<T extends FieldValues>(error: unknown, setError: UseFormSetError<T>, known: readonly string[]): string | null {
  if (!(error instanceof ApiError)) return 'Something went wrong. Try again.';
  let unplaced = false;
  for (const f of error.fields) {
    if (known.includes(f.path)) setError(f.path as Path<T>, { message: f.message });
    else unplaced = true;
  }
  return error.fields.length === 0 || unplaced ? error.message : null;
}
