/**
 * Site and pit photos: checking an upload, making its renditions, keeping its files, and choosing
 * which photos a run's report shows. Files live outside the web root under generated names.
 */
import { createHash, randomUUID } from 'node:crypto';
import { mkdir, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { Op, QueryTypes, type Transaction } from 'sequelize';
import sharp from 'sharp';
import { PHOTO_RENDITION_PX, PHOTO_SIZES, PHOTO_TYPES, type PhotoSize } from '../../shared/schemas/photos';
import { conflict, HttpError } from '../http/errors';
import { checkedUpload, uploadDir } from '../http/uploads';
import { Photo } from '../models/photo';
import { Signature, Signoff } from '../models/signoff';
import { TestLocation } from '../models/test-location';
import { User } from '../models/user';
import { assertRunUnlocked, runSigned } from './signoff';

/** Decoding stops above this many pixels, so a small file cannot expand into gigabytes (a "pixel bomb"). */
const MAX_INPUT_PIXELS = 120_000_000;

/** An accepted upload: its type, its SHA-256, the upright size, and the two JPEG renditions. */
export interface ProcessedPhoto {
  buffer: Buffer;
  mime: string;
  ext: string;
  sha256: string;
  width: number;
  height: number;
  thumb: Buffer;
  preview: Buffer;
}

const unreadable = (field: string) => new HttpError(415, 'invalid_upload', `${field}: the image could not be read (damaged, or too many pixels)`, field);

/** A rendition, turned upright by its EXIF orientation, at most `px` on its longest side; metadata (GPS and all) is not copied. */
const rendition = (input: Buffer, px: number) =>
  sharp(input, { limitInputPixels: MAX_INPUT_PIXELS, failOn: 'error' })
    .rotate()
    .resize(px, px, { fit: 'inside', withoutEnlargement: true })
    .flatten({ background: '#ffffff' })
    .jpeg({ quality: 82, mozjpeg: true })
    .toBuffer();

/** Checks an uploaded image by its content and makes its renditions; 415 for anything that is not a readable JPEG, PNG or WebP. */
export async function processPhoto(file: { buffer: Buffer } | undefined, field = 'file'): Promise<ProcessedPhoto> {
  const { buffer, mime, ext } = await checkedUpload(file, PHOTO_TYPES, field);
  try {
    const meta = await sharp(buffer, { limitInputPixels: MAX_INPUT_PIXELS }).metadata();
    const upright = meta.autoOrient ?? { width: meta.width, height: meta.height };
    const preview = await rendition(buffer, PHOTO_RENDITION_PX.preview);
    const thumb = await rendition(preview, PHOTO_RENDITION_PX.thumb); // from the small upright preview, not by decoding the upload again
    return { buffer, mime, ext, sha256: createHash('sha256').update(buffer).digest('hex'), width: upright.width, height: upright.height, thumb, preview };
  } catch {
    throw unreadable(field);
  }
}

/** The columns of a photo row that come from its processed upload and stored files. */
export const photoFileColumns = (p: ProcessedPhoto, stored: { fileKey: string; originalExt: string }) => ({
  ...stored,
  mime: p.mime,
  bytes: p.buffer.length,
  width: p.width,
  height: p.height,
  sha256: p.sha256,
});

const fileName = (photo: Pick<Photo, 'fileKey' | 'originalExt'>, size: PhotoSize) =>
  size === 'original' ? `${photo.fileKey}.${photo.originalExt}` : `${photo.fileKey}-${size}.jpg`;

/** The stored files of photos, in `<dataDir>/uploads/photos`. */
export class PhotoFiles {
  readonly dir: string;
  constructor(dataDir: string) {
    this.dir = uploadDir(dataDir, 'photos');
  }

  /** Writes the three files under a new key and returns it; writes nothing that could overwrite. */
  async save(p: ProcessedPhoto): Promise<{ fileKey: string; originalExt: string }> {
    await mkdir(this.dir, { recursive: true });
    const key = { fileKey: randomUUID(), originalExt: p.ext };
    const write = (size: PhotoSize, data: Buffer) => writeFile(this.path(key, size), data, { flag: 'wx' });
    try {
      await Promise.all([write('original', p.buffer), write('thumb', p.thumb), write('preview', p.preview)]);
    } catch (err) {
      await this.remove(key);
      throw err;
    }
    return key;
  }

  path(photo: Pick<Photo, 'fileKey' | 'originalExt'>, size: PhotoSize): string {
    return path.join(this.dir, fileName(photo, size));
  }

  fileName(photo: Pick<Photo, 'fileKey' | 'originalExt'>, size: PhotoSize): string {
    return fileName(photo, size);
  }

  async remove(photo: Pick<Photo, 'fileKey' | 'originalExt'>): Promise<void> {
    await Promise.all(PHOTO_SIZES.map((size) => rm(this.path(photo, size), { force: true })));
  }
}

/** Loads a photo's uploader with it, for the name its view shows. */
export const withUploader = { include: [{ model: User, as: 'uploader', attributes: ['id', 'name'] }] };
/** Site views first, then the pit; each in the order taken. */
const reportOrder: [string, string][] = [
  ['kind', 'DESC'],
  ['createdAt', 'ASC'],
  ['id', 'ASC'],
];

export const photosOfLocation = (locationId: number) => Photo.findAll({ where: { locationId }, order: reportOrder, ...withUploader });

/** When the run's current revision was first signed (and so locked), or null when it is not signed. */
async function signedAt(runId: number): Promise<Date | null> {
  const s = await Signoff.findByPk(runId);
  if (s?.state !== 'signed') return null;
  const first = await Signature.findOne({ where: { runId, revision: s.revision }, order: [['signedAt', 'ASC']] });
  return first?.signedAt ?? null;
}

/**
 * The photos a run's report shows: the run's own and its location's. A signed report keeps the location
 * photos it was signed with: ones added to the location later wait for the next revision.
 */
export async function photosOfRun(runId: number, locationId: number): Promise<Photo[]> {
  const until = await signedAt(runId);
  const locationPhotos = { runId: null, ...(until ? { createdAt: { [Op.lte]: until } } : {}) };
  return Photo.findAll({ where: { locationId, [Op.or]: [{ runId }, locationPhotos] }, order: reportOrder, ...withUploader });
}

/**
 * Refuses (409) a change to a photo that a signed report shows: a photo of a signed run, or a location
 * photo taken before a signed run of that location was signed. Call it inside the writing transaction.
 */
export async function assertPhotoUnlocked(photo: Pick<Photo, 'locationId' | 'runId' | 'createdAt'>, transaction?: Transaction): Promise<void> {
  if (photo.runId !== null) return assertRunUnlocked(photo.runId, transaction);
  const rows = (await Photo.sequelize!.query(
    `SELECT s.run_id AS runId FROM signoffs s JOIN runs r ON r.id = s.run_id JOIN test_plans tp ON tp.id = r.plan_id
     WHERE s.state = 'signed' AND tp.location_id = :locationId
       AND (SELECT MIN(g.signed_at) FROM signatures g WHERE g.run_id = s.run_id AND g.revision = s.revision) >= :createdAt
     LIMIT 1`,
    { replacements: { locationId: photo.locationId, createdAt: photo.createdAt }, type: QueryTypes.SELECT, transaction },
  )) as { runId: number }[];
  if (rows.length) throw runSigned(rows[0].runId);
}

/** Refuses (409) to delete a location or project that still holds photos: they are evidence, removed one by one on purpose. */
export async function assertNoPhotosAt(where: { locationId: number } | { projectId: number }): Promise<void> {
  const locationIds =
    'locationId' in where ? [where.locationId] : (await TestLocation.findAll({ where: { projectId: where.projectId }, attributes: ['id'] })).map((l) => l.id);
  const count = locationIds.length ? await Photo.count({ where: { locationId: locationIds } }) : 0;
  if (count) throw conflict(`${count === 1 ? 'One photo is' : `${count} photos are`} still kept here; delete them first.`);
}
