import type { ReactNode } from 'react';
import type { UseQueryResult } from '@tanstack/react-query';
import { NotFoundContent } from '../../components/errors/not-found-page';
import { ErrorAlert } from '../../components/ui/alert';
import { SkeletonBlock } from '../../components/ui/skeleton';
import { isApiError } from '../../lib/api-client';

interface PageQueryProps<T> {
  query: UseQueryResult<T>;
  /** What is loading, for the loading state and the error title ("the site"). */
  what: string;
  children: (data: T) => ReactNode;
}

/** The three states of a page's main query: loading, failed (a 404 reads as "no such page"), or ready. */
export function PageQuery<T>({ query, what, children }: PageQueryProps<T>) {
  if (query.isPending) return <SkeletonBlock label={`Loading ${what}`} lines={6} />;
  if (query.isError) {
    if (isApiError(query.error) && query.error.status === 404) return <NotFoundContent />;
    return <ErrorAlert error={query.error} title={`${what.replace(/^./, (c) => c.toUpperCase())} could not be loaded`} onRetry={() => void query.refetch()} />;
  }
  return <>{children(query.data)}</>;
}
