import type { Signature, SignatureMeaning, SignoffState, SignoffView, Verification } from '@shared/schemas/signoff';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export type { Signature, SignatureMeaning, SignoffState, SignoffView, Verification };

export const signoffKeys = {
  all: ['signoff'] as const,
  run: (runId: number) => [...signoffKeys.all, runId] as const,
  verify: (runId: number) => [...signoffKeys.all, runId, 'verify'] as const,
};

export const signoffQueryOptions = (runId: number) =>
  queryOptions({ queryKey: signoffKeys.run(runId), queryFn: ({ signal }) => api.get<SignoffView>(`/api/runs/${runId}/signoff`, signal) });

export const useSignoff = (runId: number) => useQuery(signoffQueryOptions(runId));

/** Recomputes the hash on demand (it reads the whole run). */
export const useVerification = (runId: number, enabled: boolean) =>
  useQuery({ queryKey: signoffKeys.verify(runId), queryFn: ({ signal }) => api.get<Verification>(`/api/runs/${runId}/verify`, signal), enabled });

/** A sign-off step; on success the cached review state is replaced by the server's answer. */
function useSignoffStep<Input>(runId: number, call: (input: Input) => Promise<SignoffView>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: call,
    onSuccess: (view) => {
      queryClient.setQueryData(signoffKeys.run(runId), view);
      void queryClient.invalidateQueries({ queryKey: signoffKeys.verify(runId) });
    },
  });
}

export const useSubmitForReview = (runId: number) => useSignoffStep(runId, () => api.post<SignoffView>(`/api/runs/${runId}/signoff/submit`, {}));
export const useSignRun = (runId: number) =>
  useSignoffStep(runId, (input: { password: string; meaning: SignatureMeaning }) => api.post<SignoffView>(`/api/runs/${runId}/signoff/sign`, input));
export const useReopenRun = (runId: number) =>
  useSignoffStep(runId, (input: { reason: string }) => api.post<SignoffView>(`/api/runs/${runId}/signoff/reopen`, input));

/** POST /api/runs/:id/send */
export const useSendReport = (runId: number) =>
  useMutation({ mutationFn: () => api.post<{ to: string[]; subject: string; attachments: string[] }>(`/api/runs/${runId}/send`, {}) });

export const reportPdfUrl = (runId: number) => `/api/runs/${runId}/report.pdf`;
