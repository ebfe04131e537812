import type { CalibrationRecord, CalibrationRecordInput } from '@shared/schemas/instruments';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { instrumentKeys } from './instrument-keys';

export function recordCalibration(instrumentId: number, input: CalibrationRecordInput): Promise<CalibrationRecord> {
  return api.post<CalibrationRecord>(`/api/instruments/${instrumentId}/calibrations`, input);
}

/** Attaches a certificate (PDF, PNG or JPEG, at most 10 MB) to a calibration. */
export function uploadCertificate(calibrationId: number, file: File): Promise<CalibrationRecord> {
  const body = new FormData();
  body.append('file', file);
  return api.post<CalibrationRecord>(`/api/calibrations/${calibrationId}/certificate`, body);
}

/** Where the browser opens a calibration's certificate. */
export const certificateHref = (calibrationId: number) => `/api/calibrations/${calibrationId}/certificate`;

/** A new calibration changes the instrument's status everywhere, so every instrument query refetches. */
export function useRecordCalibration(instrumentId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CalibrationRecordInput) => recordCalibration(instrumentId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: instrumentKeys.all }),
  });
}

export function useUploadCertificate() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ calibrationId, file }: { calibrationId: number; file: File }) => uploadCertificate(calibrationId, file),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: instrumentKeys.all }),
  });
}
