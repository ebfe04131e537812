/**
 * A list shown in one feature refreshes when another feature saves to it: the rig picker of the run
 * set-up after a rig is saved, and the import form's locations after a location is saved. Both read
 * under the owning feature's query key, so its invalidation reaches them.
 */
import type { RigInput } from '@shared/schemas/instruments';
import type { LocationInput } from '@shared/schemas/projects';
import { QueryClient, QueryClientProvider, useQuery } from '@tanstack/react-query';
import { act, renderHook, waitFor } from '@testing-library/react';
import type { ReactNode } from 'react';
import { describe, expect, it } from 'vitest';
import { locationsQueryOptions } from '../../client/src/features/locations/api/get-locations';
import { useSaveLocation } from '../../client/src/features/locations/api/save-location';
import { useSaveRig } from '../../client/src/features/rigs/api/save-rig';
import { useRigs } from '../../client/src/features/runs/api/get-rigs';
import { json, requests, stubFetch } from './support/fetch-stub';

function wrapper() {
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  return ({ children }: { children: ReactNode }) => <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
}

const gets = (fetchMock: ReturnType<typeof stubFetch>, key: string) => requests(fetchMock).filter((r) => r.key === key).length;

describe('lists shared between features refresh after a save', () => {
  it('the run set-up’s rig picker fetches the rigs again when a rig is saved', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': json(200, { csrfToken: 'tok' }),
      'GET /api/rigs': [json(200, { items: [{ id: 3, name: 'Rig A' }] }), json(200, { items: [{ id: 3, name: 'Rig A (renamed)' }] })],
      'PATCH /api/rigs/3': json(200, { id: 3, name: 'Rig A (renamed)' }),
    });
    const { result } = renderHook(() => ({ picker: useRigs(), save: useSaveRig(3) }), { wrapper: wrapper() });
    await waitFor(() => expect(result.current.picker.data?.[0]?.name).toBe('Rig A'));
    await act(() => result.current.save.mutateAsync({ name: 'Rig A (renamed)' } as RigInput));
    await waitFor(() => expect(result.current.picker.data?.[0]?.name).toBe('Rig A (renamed)'));
    expect(gets(fetchMock, 'GET /api/rigs')).toBe(2);
  });

  it('the import form’s locations of a project are fetched again when a location there is saved', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': json(200, { csrfToken: 'tok' }),
      'GET /api/projects/5/locations': [json(200, { items: [] }), json(200, { items: [{ id: 9, projectId: 5, pitId: 'TP-1' }] })],
      'POST /api/projects/5/locations': json(201, { id: 9, projectId: 5, pitId: 'TP-1' }),
    });
    // The import form reads its locations through the query options the page hands it: the locations feature's own.
    const { result } = renderHook(() => ({ listed: useQuery(locationsQueryOptions(5)), save: useSaveLocation({ projectId: 5 }) }), { wrapper: wrapper() });
    await waitFor(() => expect(result.current.listed.data).toEqual([]));
    await act(() => result.current.save.mutateAsync({ pitId: 'TP-1' } as LocationInput));
    await waitFor(() => expect(result.current.listed.data?.map((l) => l.pitId)).toEqual(['TP-1']));
    expect(gets(fetchMock, 'GET /api/projects/5/locations')).toBe(2);
  });
});
