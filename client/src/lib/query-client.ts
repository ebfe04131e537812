import { QueryCache, QueryClient } from '@tanstack/react-query';
import { isApiError } from './api-client';
import { authKeys } from './auth';

/** Client errors (4xx) will not change on a retry; network faults and 5xx may. */
function shouldRetry(failureCount: number, error: unknown): boolean {
  if (isApiError(error) && error.status >= 400 && error.status < 500) return false;
  return failureCount < 2;
}

export interface QueryClientOptions {
  /**
   * Called when a read answers 401: the session ended elsewhere (expiry, sign-out in another tab).
   * The cached user is already set to signed out; the app sends the user to sign-in. Default: none.
   */
  onSessionEnded?: () => void;
}

/** The cache for all server state. */
export function createQueryClient({ onSessionEnded }: QueryClientOptions = {}): QueryClient {
  const queryClient: QueryClient = new QueryClient({
    queryCache: new QueryCache({
      onError(error) {
        if (isApiError(error) && error.status === 401) {
          queryClient.setQueryData(authKeys.me(), null);
          onSessionEnded?.();
        }
      },
    }),
    defaultOptions: {
      queries: { staleTime: 30_000, retry: shouldRetry, refetchOnWindowFocus: false },
      mutations: { retry: false },
    },
  });
  return queryClient;
}
