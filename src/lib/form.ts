// Carries an API error into a react-hook-form: per-field messages go next to their fields, the
// overall message goes to the top of the form (errors.root.server).
import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { isApiError } from './api-client';

export function applyServerError<T extends FieldValues>(err: unknown, setError: UseFormSetError<T>, fieldNames: readonly Path<T>[]): void {
  if (isApiError(err)) {
    for (const [field, message] of Object.entries(err.fields ?? {})) {
      if ((fieldNames as readonly string[]).includes(field)) setError(field as Path<T>, { type: 'server', message });
    }
    setError('root.server', { type: String(err.status), message: err.message });
    return;
  }
  setError('root.server', { type: 'unknown', message: err instanceof Error ? err.message : 'Something went wrong.' });
}
