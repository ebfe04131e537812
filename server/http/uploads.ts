import { randomUUID } from 'node:crypto';
import { mkdirSync } from 'node:fs';
import { writeFile } from 'node:fs/promises';
import path from 'node:path';
import { fileTypeFromBuffer } from 'file-type';
import type { Response } from 'express';
import multer from 'multer';
import { HttpError } from './errors';

/** Where uploads of each kind are kept: under the data directory, never under the web root. */
export const uploadDir = (dataDir: string, kind: 'site-plans' | 'certificates' | 'photos') => path.join(dataDir, 'uploads', kind);

/** Multer keeping one file in memory, so its type can be checked from its bytes before anything is stored. */
export const singleUpload = (field: string, maxBytes: number) => multer({ storage: multer.memoryStorage(), limits: { fileSize: maxBytes, files: 1 } }).single(field);

/** The real type of an uploaded file, read from its content; 400 without a file, 415 for any other type than `allowed`. */
export async function checkedUpload(file: { buffer: Buffer } | undefined, allowed: readonly string[], field = 'file'): Promise<{ buffer: Buffer; mime: string; ext: string }> {
  if (!file) throw new HttpError(400, 'invalid_upload', `${field}: a file is required`, field);
  const type = await fileTypeFromBuffer(file.buffer);
  if (!type || !allowed.includes(type.mime)) {
    throw new HttpError(415, 'invalid_upload', `${field}: must be ${allowed.join(' or ')} (got ${type?.mime ?? 'unknown content'})`, field);
  }
  return { buffer: file.buffer, mime: type.mime, ext: type.ext };
}

/**
 * Stores an uploaded file outside the web root under a generated name, after checking its real type
 * from its content (S6). Returns the stored file name.
 */
export async function storeUpload(file: { buffer: Buffer } | undefined, dir: string, allowed: readonly string[], field = 'file'): Promise<string> {
  const type = await checkedUpload(file, allowed, field);
  mkdirSync(dir, { recursive: true });
  const name = `${randomUUID()}.${type.ext}`;
  await writeFile(path.join(dir, name), type.buffer, { flag: 'wx' });
  return name;
}

/** Sends a stored upload by its generated name from its folder (never a path from the request). */
export const sendStoredFile = (res: Response, dir: string, name: string) =>
  new Promise<void>((resolve, reject) => res.sendFile(name, { root: dir, dotfiles: 'deny' }, (err) => (err ? reject(err) : resolve())));
