import { randomUUID } from 'node:crypto';
import { mkdirSync } from 'node:fs';
import { writeFile } from 'node:fs/promises';
import path from 'node:path';
import { fileTypeFromBuffer } from 'file-type';
import multer from 'multer';
import { HttpError } from './errors';

/** Multer keeping one file in memory, so its type can be checked from its bytes before anything is stored. */
export const singleUpload = (field: string, maxBytes: number) => multer({ storage: multer.memoryStorage(), limits: { fileSize: maxBytes, files: 1 } }).single(field);

/**
 * Stores an uploaded file outside the web root under a generated name, after checking its real type
 * from its content (S6). Returns the stored file name.
 */
export async function storeUpload(file: Express.Multer.File | undefined, dir: string, allowed: readonly string[], field = 'file'): Promise<string> {
  if (!file) throw new HttpError(400, 'invalid_upload', `${field}: a file is required`, field);
  const type = await fileTypeFromBuffer(file.buffer);
  if (!type || !allowed.includes(type.mime)) {
    throw new HttpError(415, 'invalid_upload', `${field}: must be ${allowed.join(' or ')} (got ${type?.mime ?? 'unknown content'})`, field);
  }
  mkdirSync(dir, { recursive: true });
  const name = `${randomUUID()}.${type.ext}`;
  await writeFile(path.join(dir, name), file.buffer, { flag: 'wx' });
  return name;
}
