import { describe, expect, it, vi } from 'vitest';
import { ApiError } from '../../client/src/lib/api-client';
import { authKeys } from '../../client/src/lib/auth';
import { createQueryClient } from '../../client/src/lib/query-client';

describe('query client', () => {
  it('marks the session ended when a read answers 401', async () => {
    const onSessionEnded = vi.fn();
    const queryClient = createQueryClient({ onSessionEnded });
    queryClient.setQueryData(authKeys.me(), { id: 1 });
    await queryClient
      .fetchQuery({
        queryKey: ['projects'],
        queryFn: () => Promise.reject(new ApiError(401, 'unauthenticated', 'Sign in first.')),
      })
      .catch(() => undefined);
    expect(onSessionEnded).toHaveBeenCalledTimes(1);
    expect(queryClient.getQueryData(authKeys.me())).toBeNull();
  });

  it('does not retry a 4xx answer, and retries a network failure or 5xx twice', () => {
    const retry = createQueryClient().getDefaultOptions().queries?.retry as (failureCount: number, error: unknown) => boolean;
    expect(retry(0, new ApiError(403, 'forbidden', 'No.'))).toBe(false);
    expect(retry(0, new ApiError(404, 'not_found', 'Gone.'))).toBe(false);
    expect(retry(0, new ApiError(0, 'network', 'offline'))).toBe(true);
    expect(retry(1, new ApiError(503, 'http_503', 'busy'))).toBe(true);
    expect(retry(2, new ApiError(503, 'http_503', 'busy'))).toBe(false);
  });
});
