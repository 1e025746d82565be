/** Server errors placed beside a form's field: the field's key, which the server puts first so its messages stand alone, is dropped there. */
import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { describe, expect, it } from 'vitest';
import { ApiError } from '@/lib/api';
import { applyServerError, withoutFieldKey } from '@/lib/forms';

function capture() {
  const calls: { name: string; message?: string }[] = [];
  const setError = ((name: Path<FieldValues>, error: { message?: string }) => {
    calls.push({ name, message: error.message });
  }) as UseFormSetError<FieldValues>;
  return { calls, setError };
}

describe('server errors in forms', () => {
  it('shows a field error beside its input without the field key', () => {
    const { calls, setError } = capture();
    applyServerError(new ApiError(400, 'currentPassword: This is not your current password.', 'currentPassword'), setError, ['currentPassword', 'newPassword']);
    expect(calls).toEqual([{ name: 'currentPassword', message: 'This is not your current password.' }]);
  });

  it('keeps the whole message when it goes on the form as a whole (no input names it there)', () => {
    const { calls, setError } = capture();
    applyServerError(new ApiError(400, 'datasetId: no such dataset in this workspace.', 'datasetId'), setError, ['name']);
    expect(calls).toEqual([{ name: 'root.server', message: 'datasetId: no such dataset in this workspace.' }]);
  });

  it('drops only a leading key that is the field itself', () => {
    expect(withoutFieldKey('cv.folds: More folds than rows.', 'cv.folds')).toBe('More folds than rows.');
    expect(withoutFieldKey('Choose a password: at least 12 characters.', 'password')).toBe('Choose a password: at least 12 characters.');
    expect(withoutFieldKey('password: ', 'password')).toBe('password: ');
  });
});
