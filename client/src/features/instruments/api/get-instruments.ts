import type { ListResponse } from '@shared/schemas/common';
import type { CalibrationRecord, Instrument } from '@shared/schemas/instruments';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { instrumentKeys } from './instrument-keys';

/** One instrument with its calibrations, newest calibration date first. */
export interface InstrumentDetail extends Instrument {
  calibrations: CalibrationRecord[];
}

export async function getInstruments(signal?: AbortSignal): Promise<Instrument[]> {
  return (await api.get<ListResponse<Instrument>>('/api/instruments', signal)).items;
}

export function getInstrument(id: number, signal?: AbortSignal): Promise<InstrumentDetail> {
  return api.get<InstrumentDetail>(`/api/instruments/${id}`, signal);
}

export const instrumentsQueryOptions = () => queryOptions({ queryKey: instrumentKeys.list(), queryFn: ({ signal }) => getInstruments(signal) });

export const instrumentQueryOptions = (id: number) => queryOptions({ queryKey: instrumentKeys.detail(id), queryFn: ({ signal }) => getInstrument(id, signal) });

export function useInstruments() {
  return useQuery(instrumentsQueryOptions());
}

export function useInstrument(id: number) {
  return useQuery(instrumentQueryOptions(id));
}
