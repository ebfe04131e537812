import type { ApiErrorBody } from '@shared/schemas/common';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { ApiError, api } from '../../../lib/api-client';
import { runKeys } from '../../../lib/run-keys';

/** One problem the server found in an imported record: the field, the CSV line and column, or the AGS4 line, group, heading and rule. */
export interface ImportIssue {
  field?: string;
  line?: number;
  column?: string;
  group?: string;
  heading?: string;
  /** The AGS4 rule broken ("8", "10c"…), or "settlescope" for what a test record needs beyond AGS4. */
  rule?: string;
  message: string;
}

/** The run an import created. */
export interface ImportResult {
  runId: number;
  planId: number;
  planName: string;
  stages: number;
  readings: number;
}

/** What to import: pasted text with its format, or a .json/.csv file. */
export type ImportRequest = { locationId: number; planName?: string } & ({ format: 'json' | 'csv'; content: string } | { file: File });

/** Largest file the server takes, bytes (the record's own limit). */
export const IMPORT_MAX_BYTES = 8 * 1024 * 1024;

/** The server refused the record: every problem it listed, and how many more it did not list. */
export class ImportRejected extends Error {
  override readonly name = 'ImportRejected';
  constructor(
    message: string,
    readonly issues: ImportIssue[],
    readonly omitted: number,
  ) {
    super(message);
  }
}

function requestBody(request: ImportRequest): { body: BodyInit; headers: Record<string, string> } {
  if ('file' in request) {
    const form = new FormData();
    form.append('locationId', String(request.locationId));
    if (request.planName) form.append('planName', request.planName);
    form.append('file', request.file);
    return { body: form, headers: {} };
  }
  return { body: JSON.stringify(request), headers: { 'content-type': 'application/json' } };
}

/**
 * Posts to an import route. Unlike other calls it reads the error body itself, because a refused file
 * comes with its list of problems (`issues`), which the shared client does not keep.
 */
export async function postImport<T>(url: string, body: BodyInit, headers: Record<string, string>): Promise<T> {
  const { csrfToken } = await api.get<{ csrfToken: string }>('/api/auth/csrf');
  let response: Response;
  try {
    response = await fetch(url, {
      method: 'POST',
      credentials: 'same-origin',
      headers: { accept: 'application/json', 'x-csrf-token': csrfToken, ...headers },
      body,
    });
  } catch {
    throw new ApiError(0, 'network', 'Cannot reach the server. Check the connection and try again.');
  }
  const parsed = (await response.json().catch(() => null)) as (ApiErrorBody & { issues?: ImportIssue[]; omitted?: number }) | T | null;
  if (response.ok) return parsed as T;
  const error = (parsed as ApiErrorBody | null)?.error;
  if (error?.code === 'invalid_record') {
    const rejected = parsed as { issues?: ImportIssue[]; omitted?: number };
    throw new ImportRejected(error.message, rejected.issues ?? [], rejected.omitted ?? 0);
  }
  throw new ApiError(response.status, error?.code ?? `http_${response.status}`, error?.message ?? `The server answered ${response.status}`, error?.field);
}

/** Posts a record import (JSON, CSV). */
export function importRecord(request: ImportRequest): Promise<ImportResult> {
  const { body, headers } = requestBody(request);
  return postImport<ImportResult>('/api/imports', body, headers);
}

export function useImportRecord() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: importRecord,
    // The new run shows in run lists; let them fetch again.
    onSuccess: () => queryClient.invalidateQueries({ queryKey: runKeys.list() }),
  });
}
