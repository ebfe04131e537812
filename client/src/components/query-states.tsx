import type { UseQueryResult } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { Button } from './button';

export function LoadingState({ label = 'Loading…' }: { label?: string }) {
  return (
    <p role="status" className="py-6 text-lg text-neutral-800">
      <span aria-hidden="true" className="mr-2 inline-block animate-pulse">
        ●
      </span>
      {label}
    </p>
  );
}

/** A failed load, with the server's message and a retry. */
export function ErrorState({ title = 'Could not load this', error, onRetry }: { title?: string; error: unknown; onRetry?: () => void }) {
  const message = error instanceof Error ? error.message : String(error);
  return (
    <div role="alert" className="my-4 flex flex-col items-start gap-3 rounded-md border-2 border-alarm-700 bg-alarm-50 p-4 text-alarm-900">
      <p className="text-lg font-bold">
        <span aria-hidden="true">✖ </span>
        {title}
      </p>
      <p>{message}</p>
      {onRetry && (
        <Button variant="secondary" onClick={onRetry}>
          Try again
        </Button>
      )}
    </div>
  );
}

export function EmptyState({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <div className="my-4 rounded-md border-2 border-dashed border-neutral-500 p-5">
      <p className="text-lg font-semibold text-neutral-950">{title}</p>
      {children && <div className="mt-2 text-neutral-800">{children}</div>}
    </div>
  );
}

/** Renders a query's data, or its loading or error state with a retry. */
export function QueryResult<T>({ query, loadingLabel, children }: { query: UseQueryResult<T>; loadingLabel?: string; children: (data: T) => ReactNode }) {
  if (query.isPending) return <LoadingState label={loadingLabel} />;
  if (query.isError) return <ErrorState error={query.error} onRetry={() => void query.refetch()} />;
  return <>{children(query.data)}</>;
}
