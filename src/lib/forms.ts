import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { isApiError } from './api';

/**
 * Puts a server error next to the input it names (`error.field`), or on the form as a whole
 * (`root.server`) when the field is not one of this form's inputs.
 */
export function applyServerError<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  fields: readonly Path<T>[],
): void {
  const message = error instanceof Error ? error.message : 'Something went wrong. Try again.';
  const field = isApiError(error) ? error.field : undefined;
  if (field && (fields as readonly string[]).includes(field)) {
    setError(field as Path<T>, { type: 'server', message }, { shouldFocus: true });
  } else {
    setError('root.server' as Path<T>, { type: 'server', message });
  }
}
