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
