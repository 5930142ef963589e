import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { isApiError } from './api-client';

/**
 * Puts the server's 400 field messages beside the inputs they name. Returns true when at
 * least one field of the form was named, so the caller can skip a general message.
 */
export function applyServerFieldErrors<T extends FieldValues>(error: unknown, setError: UseFormSetError<T>, fieldNames: readonly Path<T>[]): boolean {
  if (!isApiError(error) || error.code !== 'VALIDATION_FAILED') return false;
  let named = false;
  for (const [path, message] of Object.entries(error.fields)) {
    const field = fieldNames.find((name) => name === path);
    if (field) {
      setError(field, { type: 'server', message });
      named = true;
    }
  }
  return named;
}
