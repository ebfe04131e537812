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

type PatchShape<T extends z.ZodRawShape> = { [K in keyof T]: z.ZodOptional<T[K] extends z.ZodDefault<infer Inner> ? Inner : T[K]> };

/**
 * The PATCH form of a create schema: every field optional and none defaulted. zod fills a `.default()`
 * in for a missing field even under `.partial()`, which would overwrite what a write did not name; here
 * a missing field stays missing, so the write keeps it.
 */
export function patchOf<T extends z.ZodRawShape>(schema: z.ZodObject<T>): z.ZodObject<PatchShape<T>> {
  const shape: Record<string, z.ZodType> = {};
  for (const [key, field] of Object.entries(schema.shape)) shape[key] = (field instanceof z.ZodDefault ? (field.unwrap() as z.ZodType) : (field as z.ZodType)).optional();
  return z.object(shape) as unknown as z.ZodObject<PatchShape<T>>;
}

/**
 * Why a chosen image cannot be uploaded, or null when it can: its declared type and its size, checked
 * before sending (the server checks again from the content). `words` names the accepted types.
 */
export function imageFileProblem(file: { type: string; size: number }, accepted: { types: readonly string[]; maxBytes: number; words: string }): string | null {
  if (!accepted.types.includes(file.type)) return `Choose a ${accepted.words} image.`;
  if (file.size > accepted.maxBytes) return `The image is larger than ${accepted.maxBytes / 1024 / 1024} MB.`;
  return null;
}
