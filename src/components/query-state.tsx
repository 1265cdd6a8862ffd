import type { UseQueryResult } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { ApiRequestError } from '../lib/api-client';
import { FormAlert } from './form';

export function Loading({ label = 'Loading…' }: { label?: string }) {
  return (
    <p role="status" className="flex items-center gap-2 py-6 text-sm text-ink/70">
      <span aria-hidden className="h-4 w-4 animate-spin rounded-full border-2 border-dusk border-t-transparent" />
      {label}
    </p>
  );
}

export function errorMessage(error: unknown): string {
  return error instanceof Error ? error.message : 'Something went wrong.';
}

/** Renders loading and error states of a query, and its data otherwise. */
export function QueryState<T>({ query, children }: { query: UseQueryResult<T>; children: (data: T) => ReactNode }) {
  if (query.isPending) return <Loading />;
  if (query.isError) {
    const e = query.error;
    return (
      <FormAlert>
        {errorMessage(e)}
        {e instanceof ApiRequestError && e.requestId ? <span className="block text-xs">Request id: {e.requestId}</span> : null}
      </FormAlert>
    );
  }
  return <>{children(query.data)}</>;
}
