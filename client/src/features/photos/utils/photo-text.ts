import type { Photo, PhotoKind } from '@shared/schemas/photos';
import { formatDate } from '../../../lib/format';

/** The word on a photo's badge. */
export const KIND_WORDS: Record<PhotoKind, string> = { site: 'Site', pit: 'Pit' };

export const KIND_OPTIONS = [
  { value: 'site', label: 'Site — a view over the site' },
  { value: 'pit', label: 'Pit — the pit, plate and reaction at the test' },
] as const;

/** Local date and time of an ISO timestamp, "2026-03-04 09:15". */
export function formatTaken(iso: string): string {
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return '—';
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${formatDate(iso)} ${pad(date.getHours())}:${pad(date.getMinutes())}`;
}

/** "4.2 MB", "830 kB": a file size for people. */
export function formatBytes(bytes: number): string {
  if (bytes >= 1024 * 1024) return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
  return `${Math.max(1, Math.round(bytes / 1024))} kB`;
}

const TYPE_WORDS: Record<string, string> = { 'image/jpeg': 'JPEG', 'image/png': 'PNG', 'image/webp': 'WebP' };
export const typeWord = (mime: string) => TYPE_WORDS[mime] ?? mime;

/** What a photo shows in words, for its alt text and its button: the caption, or its kind and date. */
export function describePhoto(photo: Pick<Photo, 'kind' | 'caption' | 'createdAt'>): string {
  const kind = `${KIND_WORDS[photo.kind]} photo`;
  return photo.caption ? `${kind}: ${photo.caption}` : `${kind} of ${formatTaken(photo.createdAt)}`;
}

/** "Ines Okafor · 2026-03-04 09:15"; the uploader may since have been removed. */
export const uploadedLine = (photo: Pick<Photo, 'uploadedBy' | 'createdAt'>) => `${photo.uploadedBy?.name ?? 'Unknown user'} · ${formatTaken(photo.createdAt)}`;
