import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { ApiError, errorMessage } from '../api/client';

/**
 * Puts a rejected submission's errors onto the form: each `fields` entry whose dot path names a
 * form field goes to that field; anything else (and the message itself) goes to `root.server`.
 */
export function applyServerErrors<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  fieldNames: ReadonlyArray<Path<T>>,
): void {
  const known = new Set<string>(fieldNames);
  let placed = 0;
  const unplaced: string[] = [];
  if (error instanceof ApiError) {
    for (const [path, message] of Object.entries(error.fields)) {
      if (known.has(path)) {
        setError(path as Path<T>, { type: 'server', message });
        placed += 1;
      } else {
        unplaced.push(message);
      }
    }
  }
  if (placed === 0 || unplaced.length > 0) {
    const message = placed === 0 ? errorMessage(error) : unplaced.join(' ');
    setError('root.server' as Path<T>, { type: 'server', message });
  }
}
