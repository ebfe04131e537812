/**
 * Site and pit photos: content-checked uploads (target S6), thumbnails, who may change what, the
 * lock of a signed report, and the photos printed in the PDF. Images are made with sharp; what the
 * server stored is read back with sharp and file-type (independent readers of the files).
 */
import { createHash } from 'node:crypto';
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileTypeFromBuffer } from 'file-type';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEntry } from '../../server/models/audit-entry';
import { Photo } from '../../server/models/photo';
import { TestLocation } from '../../server/models/test-location';
import { seedDemoMedia } from '../../server/seed/demo-media';
import { DEMO_PASSWORD } from '../../server/seed/demo';
import { PHOTO_MAX_BYTES, PHOTO_RENDITION_PX } from '../../shared/schemas/photos';
import { type Client, signedIn, startTestApp, type TestApp } from '../support/api';
import { binaryBody, pdfText } from '../support/pdf';

let t: TestApp;
let engineer: Client;
let operator: Client;
let client: Client;
let admin: Client;

/** A photo-like JPEG: a gradient (so it does not compress to nothing) of the given size, with EXIF orientation when asked. */
async function jpeg(width: number, height: number, orientation?: number): Promise<Buffer> {
  const pixels = Buffer.alloc(width * height * 3);
  for (let i = 0; i < width * height; i++) pixels.set([(i % width) % 256, Math.floor(i / width) % 256, 90], i * 3);
  const img = sharp(pixels, { raw: { width, height, channels: 3 } });
  return (orientation ? img.withMetadata({ orientation }) : img).jpeg({ quality: 90 }).toBuffer();
}

const photoFiles = () => readdirSync(path.join(t.config.dataDir, 'uploads', 'photos'));
const image = (res: { body: unknown }) => res.body as Buffer;
const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');

let sandJson: string;
async function importedRun(locationId: number): Promise<number> {
  const res = await engineer.post('/api/imports', { locationId, format: 'json', content: sandJson });
  expect(res.status).toBe(201);
  return res.body.runId;
}

beforeAll(async () => {
  t = await startTestApp({ loginAttempts: 10_000 });
  [engineer, operator, client, admin] = await Promise.all([signedIn(t.app, 'engineer'), signedIn(t.app, 'operator'), signedIn(t.app, 'client'), signedIn(t.app, 'admin')]);
  sandJson = readFileSync(path.join(import.meta.dirname, '../fixtures/records/sand-bearing-450-square.json'), 'utf8');
}, 120_000);
afterAll(() => t?.stop());

describe('photo upload', () => {
  it('keeps the file as sent, with its SHA-256, and makes an upright thumbnail and preview without the metadata', async () => {
    // EXIF orientation 6: stored 1600 × 1200, shown turned a quarter clockwise, i.e. 1200 wide × 1600 high.
    const data = await jpeg(1600, 1200, 6);
    const res = await operator.upload('/api/locations/1/photos', { data, name: 'pit.jpg' }, { kind: 'pit', caption: 'Plate seated on sand' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ locationId: 1, runId: null, kind: 'pit', caption: 'Plate seated on sand', mime: 'image/jpeg', bytes: data.length, width: 1200, height: 1600 });
    expect(res.body.sha256).toBe(sha256(data));
    expect(res.body.uploadedBy).toMatchObject({ name: expect.any(String) });

    const original = await engineer.get(`/api/photos/${res.body.id}/original`);
    expect(original.status).toBe(200);
    expect(Buffer.compare(image(original), data)).toBe(0);

    const thumb = image(await engineer.get(`/api/photos/${res.body.id}/thumb`));
    expect((await fileTypeFromBuffer(thumb))?.mime).toBe('image/jpeg');
    const thumbMeta = await sharp(thumb).metadata();
    expect([thumbMeta.width, thumbMeta.height]).toEqual([(PHOTO_RENDITION_PX.thumb * 3) / 4, PHOTO_RENDITION_PX.thumb]);
    expect(thumbMeta.orientation ?? 1).toBe(1); // already upright
    expect(thumbMeta.exif).toBeUndefined(); // no camera metadata (GPS and all) in what pages and reports show

    const previewMeta = await sharp(image(await engineer.get(`/api/photos/${res.body.id}/preview`))).metadata();
    expect([previewMeta.width, previewMeta.height]).toEqual([(PHOTO_RENDITION_PX.preview * 3) / 4, PHOTO_RENDITION_PX.preview]);
  });

  it('never enlarges a small image, and reads PNG and WebP', async () => {
    const png = await sharp({ create: { width: 200, height: 100, channels: 4, background: { r: 10, g: 120, b: 40, alpha: 0.5 } } }).png().toBuffer();
    const res = await engineer.upload('/api/locations/1/photos', { data: png, name: 'site.png' }, { kind: 'site' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ mime: 'image/png', width: 200, height: 100, caption: '' });
    const thumbMeta = await sharp(image(await engineer.get(`/api/photos/${res.body.id}/thumb`))).metadata();
    expect([thumbMeta.width, thumbMeta.height]).toEqual([200, 100]);

    const webp = await sharp({ create: { width: 640, height: 480, channels: 3, background: '#777' } }).webp().toBuffer();
    expect((await engineer.upload('/api/locations/1/photos', { data: webp, name: 'site.webp' }, { kind: 'site' })).body).toMatchObject({ mime: 'image/webp' });
  });

  it('refuses what is not a readable image, or too large, with a clear error, and stores nothing', async () => {
    const before = { files: photoFiles().length, rows: await Photo.count() };
    const good = await jpeg(64, 48);
    const cases: [Parameters<Client['upload']>, number, string][] = [
      [['/api/locations/1/photos', { data: Buffer.from('<script>alert(1)</script>'), name: 'x.jpg', type: 'image/jpeg' }, { kind: 'pit' }], 415, 'file: must be'],
      [['/api/locations/1/photos', { data: await sharp(good).gif().toBuffer(), name: 'x.gif' }, { kind: 'pit' }], 415, 'got image/gif'],
      // A JPEG's signature with its body cut off: the type sniffs right but the picture cannot be decoded.
      [['/api/locations/1/photos', { data: Buffer.concat([good.subarray(0, 200), Buffer.alloc(200)]), name: 'cut.jpg' }, { kind: 'pit' }], 415, 'could not be read'],
      [['/api/locations/1/photos', { data: Buffer.alloc(PHOTO_MAX_BYTES + 1, 0xff), name: 'big.jpg' }, { kind: 'pit' }], 413, 'File too large'],
      [['/api/locations/1/photos', { data: good, name: 'x.jpg' }, { kind: 'selfie' }], 400, 'kind:'],
      [['/api/locations/1/photos', { data: good, name: 'x.jpg' }, { kind: 'pit', caption: 'x'.repeat(301) }], 400, 'caption:'],
      [['/api/locations/999/photos', { data: good, name: 'x.jpg' }, { kind: 'pit' }], 404, 'Test location'],
    ];
    for (const [args, status, message] of cases) {
      const res = await engineer.upload(...args);
      expect(res.status, message).toBe(status);
      expect(res.body.error.message).toContain(message);
    }
    const noFile = await engineer.agent.post('/api/locations/1/photos').set('x-csrf-token', engineer.token).field('kind', 'pit');
    expect(noFile.status).toBe(400);
    expect(noFile.body.error).toMatchObject({ field: 'file' });
    expect({ files: photoFiles().length, rows: await Photo.count() }).toEqual(before);
  });

  it('ties a photo to a run only at that run’s location', async () => {
    const runId = await importedRun(1);
    const other = await engineer.upload('/api/locations/2/photos', { data: await jpeg(64, 48), name: 'x.jpg' }, { kind: 'pit', runId });
    expect(other.status).toBe(400);
    expect(other.body.error).toMatchObject({ field: 'runId' });
    const own = await engineer.upload('/api/locations/1/photos', { data: await jpeg(64, 48), name: 'x.jpg' }, { kind: 'pit', runId });
    expect(own.status).toBe(201);
    expect(own.body.runId).toBe(runId);
  });
});

describe('who may see and change photos', () => {
  it('keeps them from clients (they see them in the signed report) and lets operators change only their own', async () => {
    const mine = (await operator.upload('/api/locations/1/photos', { data: await jpeg(64, 48), name: 'x.jpg' }, { kind: 'pit' })).body;
    const theirs = (await engineer.upload('/api/locations/1/photos', { data: await jpeg(64, 48), name: 'y.jpg' }, { kind: 'site' })).body;
    expect((await client.get('/api/locations/1/photos')).status).toBe(403);
    expect((await client.get(`/api/photos/${mine.id}/thumb`)).status).toBe(403);

    expect((await operator.patch(`/api/photos/${theirs.id}`, { caption: 'mine now' })).status).toBe(403);
    expect((await operator.delete(`/api/photos/${theirs.id}`)).status).toBe(403);
    const renamed = await operator.patch(`/api/photos/${mine.id}`, { caption: 'North-east corner of the pit', kind: 'site' });
    expect(renamed.status).toBe(200);
    expect(renamed.body).toMatchObject({ caption: 'North-east corner of the pit', kind: 'site' });
    expect((await operator.patch(`/api/photos/${mine.id}`, {})).status).toBe(400);
    expect((await admin.patch(`/api/photos/${mine.id}`, { caption: 'North-east corner', extra: 1 })).status).toBe(400);

    const filesBefore = photoFiles().length;
    expect((await engineer.delete(`/api/photos/${mine.id}`)).status).toBe(204);
    expect(photoFiles().length).toBe(filesBefore - 3); // the upload and both renditions
    expect((await engineer.get(`/api/photos/${mine.id}/thumb`)).status).toBe(404);

    const trail = await AuditEntry.findAll({ where: { entity: 'photo', entityId: String(mine.id) }, order: [['id', 'ASC']] });
    expect(trail.map((a) => a.action)).toEqual(['uploaded', 'updated', 'deleted']);
  });

  it('lists a location’s photos site views first and refuses to delete a location that still holds photos', async () => {
    const list = (await engineer.get('/api/locations/1/photos')).body.items as { kind: string }[];
    expect(list.length).toBeGreaterThan(2);
    expect(list.map((p) => p.kind)).toEqual([...list.map((p) => p.kind)].sort().reverse());
    const refused = await engineer.delete('/api/locations/1');
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/photos? (is|are) still kept here/);
  });
});

describe('photos and the signed report', () => {
  it('prints the photos with captions and hashes, keeps them as signed, and takes later site photos into the next revision only', async () => {
    const location = (await engineer.post('/api/projects/1/locations', { pitId: 'PH-01', testDepthM: 1.2, pitWidthM: 1.6, soilDescription: 'Dense sand' })).body;
    expect(location.id).toBeGreaterThan(0);
    const runId = await importedRun(location.id);
    const site = (await engineer.upload(`/api/locations/${location.id}/photos`, { data: await jpeg(800, 600), name: 's.jpg' }, { kind: 'site', caption: 'Access road and spoil heap' })).body;
    const pit = (await operator.upload(`/api/locations/${location.id}/photos`, { data: await jpeg(600, 800), name: 'p.jpg' }, { kind: 'pit', caption: 'Kentledge over the pit', runId })).body;

    expect((await engineer.get(`/api/runs/${runId}/photos`)).body.items.map((p: { id: number }) => p.id)).toEqual([site.id, pit.id]);

    await engineer.post(`/api/runs/${runId}/interpretations`, { chosenMethod: 'hyperbolic', reason: 'Smooth curve.' });
    await engineer.post(`/api/runs/${runId}/signoff/submit`);
    expect((await admin.post(`/api/runs/${runId}/signoff/sign`, { password: DEMO_PASSWORD, meaning: 'approved' })).status).toBe(200);

    // Locked: the run's photos, and the location's photos the signed report shows.
    for (const res of [
      await engineer.upload(`/api/locations/${location.id}/photos`, { data: await jpeg(64, 48), name: 'late.jpg' }, { kind: 'pit', runId }),
      await engineer.delete(`/api/photos/${pit.id}`),
      await engineer.patch(`/api/photos/${site.id}`, { caption: 'changed' }),
    ]) {
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('run_signed');
    }
    // A site photo added after signing is free to change, and waits for the next revision.
    const later = (await engineer.upload(`/api/locations/${location.id}/photos`, { data: await jpeg(64, 48), name: 'later.jpg' }, { kind: 'site', caption: 'After backfill' })).body;
    expect((await engineer.get(`/api/runs/${runId}/photos`)).body.items.map((p: { id: number }) => p.id)).toEqual([site.id, pit.id]);
    expect((await engineer.patch(`/api/photos/${later.id}`, { caption: 'After backfilling' })).status).toBe(200);

    const pdf = await binaryBody(engineer.get(`/api/runs/${runId}/report.pdf`));
    const { text } = await pdfText(pdf.body as Buffer);
    expect(text).toContain('Site: Access road and spoil heap');
    expect(text).toContain('Pit (this run): Kentledge over the pit');
    expect(text.replace(/ /g, '')).toContain(`SHA-256${pit.sha256}`);
    expect(text).not.toContain('After backfilling');
    expect(text).toContain('Pit and reaction');
    expect(text).toContain('1.60 m wide');

    // The two previews are embedded as images at their own size (pdfkit leaves object dictionaries uncompressed).
    const dictionaries = (pdf.body as Buffer).toString('latin1').match(/<<[^<>]*\/Subtype \/Image[^<>]*>>/g) ?? [];
    const sizes = dictionaries.map((d) => [Number(/\/Width (\d+)/.exec(d)?.[1]), Number(/\/Height (\d+)/.exec(d)?.[1])]);
    expect(sizes).toEqual([
      [800, 600],
      [600, 800],
    ]);
  });

  it('draws the site plan with the test location pinned, and the weather of the test', async () => {
    const plan = await sharp({ create: { width: 2400, height: 1200, channels: 3, background: '#f4f1e8' } }).png().toBuffer();
    expect((await engineer.agent.post('/api/locations/1/site-plan').set('x-csrf-token', engineer.token).attach('file', plan, 'plan.png')).status).toBe(200);
    expect((await engineer.patch('/api/locations/1', { planX: 0.25, planY: 0.75 })).status).toBe(200);
    const runId = await importedRun(1);
    const pdf = await binaryBody(engineer.get(`/api/runs/${runId}/report.pdf`));
    const { text } = await pdfText(pdf.body as Buffer);
    expect(text).toContain('Site plan with the test location pinned.');
    expect(text).toContain('Weather: Dry, overcast, 14 °C'); // the imported record's own weather line
    // Scaled down for print to at most 1600 px on its longest side, keeping its 2:1 shape.
    expect((pdf.body as Buffer).toString('latin1')).toMatch(/\/Subtype \/Image[^<>]*\/Width 1600[^<>]*\/Height 800|\/Width 1600[^<>]*\/Height 800[^<>]*\/Subtype \/Image/);
  });
});

describe('demo pictures', () => {
  it('gives the demo project a site plan and the simulated rig’s pit two drawn photos, once', async () => {
    const pit = await TestLocation.findOne({ where: { pitId: 'PLT-03' } });
    await Photo.destroy({ where: {} }); // the demo pictures go only into a demo nobody has added photos to
    await TestLocation.update({ sitePlanFile: null }, { where: {} });
    await seedDemoMedia(t.config.dataDir);
    await seedDemoMedia(t.config.dataDir);
    const photos = (await engineer.get(`/api/locations/${pit!.id}/photos`)).body.items as { kind: string; width: number; height: number; caption: string }[];
    expect(photos.map((p) => [p.kind, p.width, p.height])).toEqual([
      ['site', 1600, 1200],
      ['pit', 1200, 1600],
    ]);
    expect(photos.every((p) => p.caption.includes('(drawing)'))).toBe(true);
    const plan = await engineer.get(`/api/locations/${pit!.id}/site-plan`);
    expect(plan.status).toBe(200);
    expect((await sharp(plan.body as Buffer).metadata()).width).toBe(1600);
  });
});

