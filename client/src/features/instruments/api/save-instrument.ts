import type { Instrument, InstrumentInput } from '@shared/schemas/instruments';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { instrumentKeys } from './instrument-keys';

export function createInstrument(input: InstrumentInput): Promise<Instrument> {
  return api.post<Instrument>('/api/instruments', input);
}

export function updateInstrument(id: number, input: InstrumentInput): Promise<Instrument> {
  return api.patch<Instrument>(`/api/instruments/${id}`, input);
}

/** Registers an instrument, or changes it when an id is given; lists and the detail refetch. */
export function useSaveInstrument(id?: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: InstrumentInput) => (id === undefined ? createInstrument(input) : updateInstrument(id, input)),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: instrumentKeys.all }),
  });
}
