import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { isApiError } from './api';

/**
 * Puts a server error next to the input it names (`error.field`), or on the form as a whole
 * (`root.server`) when the field is not one of this form's inputs. The server's messages start with
 * the field's key ("currentPassword: ...") so that they stand alone; beside the field's own label
 * that key is noise, so it is dropped there.
 */
export function applyServerError<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  fields: readonly Path<T>[],
): void {
  const message = error instanceof Error ? error.message : 'Something went wrong. Try again.';
  const field = isApiError(error) ? error.field : undefined;
  if (field && (fields as readonly string[]).includes(field)) {
    setError(field as Path<T>, { type: 'server', message: withoutFieldKey(message, field) }, { shouldFocus: true });
  } else {
    setError('root.server' as Path<T>, { type: 'server', message });
  }
}

/** `message` without a leading "field: " (the server's way of naming the field in a standalone message). */
export function withoutFieldKey(message: string, field: string): string {
  const prefix = `${field}: `;
  return message.startsWith(prefix) && message.length > prefix.length ? message.slice(prefix.length) : message;
}
