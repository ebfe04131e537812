/** Site and pit photos of a test location or of one run: the upload contract and what the API answers. */
import { z } from 'zod';
import { idSchema, imageFileProblem, optionalText, trimmed } from './common';

/** A view over the whole site, or of the pit, plate and reaction at the test. */
export const PHOTO_KINDS = ['site', 'pit'] as const;
export type PhotoKind = (typeof PHOTO_KINDS)[number];

/** Image types accepted, checked from the file's content on the server (target S6). */
export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;
export const PHOTO_MAX_BYTES = 15 * 1024 * 1024;
/** Photos kept per test location (its own and its runs' together). */
export const PHOTO_LIMIT_PER_LOCATION = 60;

/** The stored renditions: a small square-ish thumbnail, a preview for pages and the report, and the file as uploaded. */
export const PHOTO_SIZES = ['thumb', 'preview', 'original'] as const;
export type PhotoSize = (typeof PHOTO_SIZES)[number];
/** Longest side in pixels of the renditions made on upload. */
export const PHOTO_RENDITION_PX = { thumb: 320, preview: 1280 } as const;

/** Why a chosen file cannot be uploaded as a photo, or null when it can. */
export const photoFileProblem = (file: { type: string; size: number }) =>
  imageFileProblem(file, { types: PHOTO_TYPES, maxBytes: PHOTO_MAX_BYTES, words: 'JPEG, PNG or WebP' });

/** The form fields sent with the file (multipart, so every value arrives as text). */
export const photoUploadFields = z.object({
  kind: z.enum(PHOTO_KINDS),
  caption: optionalText(300),
  /** The run the photo belongs to; none for a photo of the location itself. */
  runId: z.preprocess((v) => (v === '' ? undefined : v), idSchema.optional()),
});
export type PhotoUploadFields = z.input<typeof photoUploadFields>;

export const photoPatch = z
  .strictObject({ caption: trimmed(300).optional(), kind: z.enum(PHOTO_KINDS).optional() })
  .refine((v) => v.caption !== undefined || v.kind !== undefined, { message: 'give a caption or a kind to change' });
export type PhotoPatch = z.infer<typeof photoPatch>;

export interface Photo {
  id: number;
  locationId: number;
  runId: number | null;
  kind: PhotoKind;
  caption: string;
  /** Of the upright (EXIF-rotated) image. */
  width: number;
  height: number;
  /** The uploaded file's type and size. */
  mime: string;
  bytes: number;
  /** SHA-256 of the uploaded file, printed on the report beside the photo. */
  sha256: string;
  uploadedBy: { id: number; name: string } | null;
  createdAt: string;
}

/** Where the API serves one rendition of a photo. */
export const photoUrl = (id: number, size: PhotoSize) => `/api/photos/${id}/${size}`;
