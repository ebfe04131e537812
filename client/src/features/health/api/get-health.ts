import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, isApiError } from '../../../lib/api-client';

export interface Health {
  app: 'ok';
  database: 'ok' | 'down';
}

export const healthKeys = { all: ['health'] as const };

const isHealth = (body: unknown): body is Health => typeof body === 'object' && body !== null && 'database' in body;

/** The server answers 503 with the same body when its database is down. */
export async function getHealth(signal?: AbortSignal): Promise<Health> {
  try {
    return await api.get<Health>('/api/health', signal);
  } catch (error) {
    if (isApiError(error) && error.status === 503 && isHealth(error.body)) return error.body;
    throw error;
  }
}

/** Polled once a minute so a lost database shows without a reload. */
export const healthQueryOptions = () =>
  queryOptions({ queryKey: healthKeys.all, queryFn: ({ signal }) => getHealth(signal), refetchInterval: 60_000, retry: false });

export function useHealth() {
  return useQuery(healthQueryOptions());
}
