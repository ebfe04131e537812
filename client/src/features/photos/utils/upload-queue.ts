import { photoFileProblem } from '@shared/schemas/photos';
import { isApiError } from '../../../lib/api-client';

/**
 * A chosen file on its way to the server. `refused`: it failed the check here and is never sent;
 * `failed`: the server or the network refused it, and it can be sent again.
 */
export interface QueuedPhoto {
  key: string;
  file: File;
  status: 'ready' | 'sending' | 'failed' | 'refused';
  reason: string | null;
}

/** Lists chosen files, each checked for type and size before anything is sent. */
export function queueFiles(files: readonly File[], keyOf: (file: File, index: number) => string): QueuedPhoto[] {
  return files.map((file, i) => {
    const reason = photoFileProblem(file);
    return { key: keyOf(file, i), file, status: reason ? 'refused' : 'ready', reason };
  });
}

/** The files the next press of Upload sends: new ones and those that failed before. */
export const sendable = (queue: readonly QueuedPhoto[]) => queue.filter((q) => q.status === 'ready' || q.status === 'failed');

export function updateQueued(queue: readonly QueuedPhoto[], key: string, change: Partial<QueuedPhoto>): QueuedPhoto[] {
  return queue.map((q) => (q.key === key ? { ...q, ...change } : q));
}

/** Said instead of a status line without our JSON body (a proxy's page, a size limit hit before the app). */
const STATUS_WORDS: Record<number, string> = {
  413: 'The server refused the file as too large.',
  415: 'The server did not accept the file as a JPEG, PNG or WebP image.',
};

/** Why the server refused one upload, in words for the person who chose the file. */
export function uploadProblem(error: unknown): string {
  if (!isApiError(error)) return error instanceof Error ? error.message : 'The upload failed.';
  // Our own error bodies carry a message meant for people; beside the file it need not name the field.
  if (!error.code.startsWith('http_')) return error.field ? error.message.replace(/^[\w.]+: /, '') : error.message;
  return STATUS_WORDS[error.status] ?? error.message;
}

/** "1 photo", "3 photos". */
export const photoCount = (n: number) => `${n} photo${n === 1 ? '' : 's'}`;
