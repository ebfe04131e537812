import type { RunCommand, RunView } from '@shared/schemas/runs';
import { useMutation } from '@tanstack/react-query';
import { api, isApiError } from '../../../lib/api-client';
import { getRun } from './get-run';

export function sendRunCommand(runId: number, version: number, command: RunCommand): Promise<RunView> {
  return api.post<RunView>(`/api/runs/${runId}/commands`, { version, command });
}

/** Options of {@link useRunCommand}. */
export interface RunCommandOptions {
  runId: number;
  /** The version of the view the person decided on; read when the command is sent. */
  version: () => number;
  /** Receives the run's new view: the command's answer, or a fresh copy after a refusal. */
  onView: (view: RunView) => void;
}

/**
 * Sends console commands quoting the version they were decided on. When the server refuses one
 * because the run moved on (409), the error keeps the server's reason and the view is fetched
 * again, so the person sees what changed before deciding again.
 */
export function useRunCommand({ runId, version, onView }: RunCommandOptions) {
  return useMutation({
    mutationFn: (command: RunCommand) => sendRunCommand(runId, version(), command),
    onSuccess: onView,
    onError: (error) => {
      // A failed refresh leaves the live feed to bring the view up to date.
      if (isApiError(error) && error.status === 409) getRun(runId).then(onView, () => {});
    },
  });
}

export type RunCommandMutation = ReturnType<typeof useRunCommand>;
