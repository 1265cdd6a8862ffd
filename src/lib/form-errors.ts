import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { ApiRequestError } from './api-client';

/** Puts the server's field errors on the form's fields; returns the message for the whole form. */
export function applyServerErrors<T extends FieldValues>(error: unknown, setError: UseFormSetError<T>): string {
  if (error instanceof ApiRequestError && error.fields) {
    for (const [field, message] of Object.entries(error.fields)) setError(field as Path<T>, { type: 'server', message });
  }
  return error instanceof Error ? error.message : 'Something went wrong.';
}
