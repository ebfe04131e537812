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

// biome-ignore lint/suspicious/noControlCharactersInRegex: control characters are what is refused
const ONE_LINE = /^[^\u0000-\u001f\u007f\u2028\u2029]*$/;
// biome-ignore lint/suspicious/noControlCharactersInRegex: control characters are what is refused
const LINES = /^[^\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]*$/;
/** Names, codes, captions: one line, so a value cannot forge a header line (e-mail subject, CSV, PDF) or hide text. */
const oneLine = (s: z.ZodString) => s.regex(ONE_LINE, 'must be one line without control characters');
/** Notes and reasons: line breaks and tabs allowed, other control characters not. */
const lines = (s: z.ZodString) => s.regex(LINES, 'must not contain control characters');

export const trimmed = (max: number) => oneLine(z.string().trim().max(max));
export const requiredText = (max: number) => oneLine(z.string().trim().min(1, 'required').max(max));
export const optionalText = (max: number) => lines(z.string().trim().max(max)).default('');
/** Required free text that may run over several lines (notes, reasons). */
export const requiredLines = (max: number) => lines(z.string().trim().min(1, 'required').max(max));

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
