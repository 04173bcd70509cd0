import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { errorMessage, isApiError } from './api';

/**
 * Put a server error where the person will look: each `details[].path` that names a field on this form
 * goes under that field; anything else comes back as one general message for the form's alert.
 * `codeToField` maps whole-request error codes to a field (e.g. bad_password -> currentPassword).
 */
export function applyServerError<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  fields: readonly Path<T>[],
  codeToField: Partial<Record<string, Path<T>>> = {},
): string | null {
  if (!isApiError(error)) return errorMessage(error);

  const mapped = codeToField[error.code];
  if (mapped) {
    setError(mapped, { type: 'server', message: error.message }, { shouldFocus: true });
    return null;
  }

  let unplaced = false;
  let first = true;
  for (const issue of error.details) {
    const field = fields.find((f) => f === issue.path);
    if (field) {
      setError(field, { type: 'server', message: issue.message }, { shouldFocus: first });
      first = false;
    } else {
      unplaced = true;
    }
  }
  if (error.details.length === 0 || unplaced) return error.message;
  return null;
}
