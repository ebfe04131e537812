import type { Ags4ImportResult } from '@shared/schemas/ags4';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { runKeys } from '../../../lib/run-keys';
import { postImport } from './import-record';

/** Posts an AGS4 file: every plate loading test in it becomes a completed run of the project, or none does. */
export function importAgs4(request: { projectId: number; file: File }): Promise<Ags4ImportResult> {
  const form = new FormData();
  form.append('projectId', String(request.projectId));
  form.append('file', request.file);
  return postImport<Ags4ImportResult>('/api/imports/ags4', form, {});
}

export function useImportAgs4() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: importAgs4,
    // New runs (and perhaps new locations) show in lists; let them fetch again.
    onSuccess: () => queryClient.invalidateQueries({ queryKey: runKeys.list() }),
  });
}
