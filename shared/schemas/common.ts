import { z } from 'zod';

export const idSchema = z.coerce.number().int().positive();
export const idParams = z.object({ id: idSchema });

/** Error body of every failed API call. */
export interface ApiErrorBody {
  error: { code: string; message: string; field?: string };
}

export interface ListResponse<T> {
  items: T[];
}

export const trimmed = (max: number) => z.string().trim().max(max);
export const requiredText = (max: number) => z.string().trim().min(1, 'required').max(max);
export const optionalText = (max: number) => z.string().trim().max(max).default('');

/**
 * Why a chosen image cannot be uploaded, or null when it can: its declared type and its size, checked
 * before sending (the server checks again from the content). `words` names the accepted types.
 */
export function imageFileProblem(file: { type: string; size: number }, accepted: { types: readonly string[]; maxBytes: number; words: string }): string | null {
  if (!accepted.types.includes(file.type)) return `Choose a ${accepted.words} image.`;
  if (file.size > accepted.maxBytes) return `The image is larger than ${accepted.maxBytes / 1024 / 1024} MB.`;
  return null;
}
