import { z } from 'zod';
import { idParams, idSchema } from '../../shared/schemas/common';
import { PHOTO_LIMIT_PER_LOCATION, PHOTO_MAX_BYTES, PHOTO_SIZES, photoPatch, photoUploadFields } from '../../shared/schemas/photos';
import { STAFF } from '../auth/permissions';
import { loadLocation } from '../auth/scope';
import { badRequest, forbidden, notFound } from '../http/errors';
import { route } from '../http/route';
import { sendStoredFile, singleUpload } from '../http/uploads';
import { Photo } from '../models/photo';
import { Run } from '../models/run';
import { TestPlan } from '../models/test-plan';
import type { User } from '../models/user';
import { audited } from '../services/audit';
import { assertPhotoUnlocked, PhotoFiles, photoFileColumns, photosOfLocation, photosOfRun, processPhoto, withUploader } from '../services/photos';
import { assertRunUnlocked } from '../services/signoff';

/** The test location a run was made at (through its plan); 404 for an unknown run. */
async function locationOfRun(runId: number): Promise<number> {
  const run = await Run.findByPk(runId, { attributes: ['id', 'planId'] });
  const plan = run && (await TestPlan.findByPk(run.planId, { attributes: ['id', 'locationId'] }));
  if (!plan) throw notFound('Run');
  return plan.locationId;
}

async function loadPhoto(id: number): Promise<Photo> {
  const photo = await Photo.findByPk(id, withUploader);
  if (!photo) throw notFound('Photo');
  return photo;
}

/** Engineers and admins change any photo; an operator only the ones they took. */
function assertMayChange(user: User, photo: Photo): void {
  if (user.role === 'operator' && photo.uploadedBy !== user.id) throw forbidden();
}

/** Site and pit photos of test locations and runs; files in `<dataDir>/uploads/photos` (staff only: clients see them in the report). */
export const photoRoutes = (dataDir: string) => {
  const files = new PhotoFiles(dataDir);
  return [
    route({
      method: 'post',
      path: '/api/locations/:id/photos',
      access: STAFF,
      summary: 'Upload a site or pit photo of a location or one of its runs (JPEG, PNG or WebP, ≤ 15 MB); thumbnails are made at once',
      params: idParams,
      before: [singleUpload('file', PHOTO_MAX_BYTES)],
      body: photoUploadFields,
      handler: async ({ params, body, user, req }) => {
        const location = await loadLocation(user!, params.id);
        if (body.runId !== undefined && (await locationOfRun(body.runId)) !== location.id) {
          throw badRequest(`runId: run ${body.runId} was not made at pit ${location.pitId}`, 'runId');
        }
        if ((await Photo.count({ where: { locationId: location.id } })) >= PHOTO_LIMIT_PER_LOCATION) {
          throw badRequest(`file: pit ${location.pitId} already holds ${PHOTO_LIMIT_PER_LOCATION} photos; delete some first`, 'file');
        }
        const processed = await processPhoto(req.file);
        const stored = await files.save(processed);
        try {
          const photo = await audited(
            async (transaction) => {
              if (body.runId !== undefined) await assertRunUnlocked(body.runId, transaction);
              return Photo.create(
                {
                  locationId: location.id,
                  runId: body.runId ?? null,
                  kind: body.kind,
                  caption: body.caption,
                  ...photoFileColumns(processed, stored),
                  uploadedBy: user!.id,
                },
                { transaction },
              );
            },
            (p) => ({ userId: user!.id, entity: 'photo', entityId: p.id, action: 'uploaded', after: { locationId: p.locationId, runId: p.runId, kind: p.kind, caption: p.caption, sha256: p.sha256 } }),
          );
          return (await loadPhoto(photo.id)).toDto();
        } catch (err) {
          await files.remove(stored);
          throw err;
        }
      },
    }),
    route({
      method: 'get',
      path: '/api/locations/:id/photos',
      access: STAFF,
      summary: 'Every photo of a location: its own and its runs’, site views first',
      params: idParams,
      handler: async ({ params, user }) => {
        const location = await loadLocation(user!, params.id);
        return { items: (await photosOfLocation(location.id)).map((p) => p.toDto()) };
      },
    }),
    route({
      method: 'get',
      path: '/api/runs/:id/photos',
      access: STAFF,
      summary: 'The photos a run’s report shows: the run’s own and its location’s (a signed report keeps those it was signed with)',
      params: idParams,
      handler: async ({ params }) => ({ items: (await photosOfRun(params.id, await locationOfRun(params.id))).map((p) => p.toDto()) }),
    }),
    route({
      method: 'get',
      path: '/api/photos/:id/:size',
      access: STAFF,
      summary: 'A photo: its thumbnail, its preview, or the file as uploaded',
      params: z.object({ id: idSchema, size: z.enum(PHOTO_SIZES) }),
      handler: async ({ params, res }) => {
        const photo = await loadPhoto(params.id);
        res.setHeader('Cache-Control', 'private, max-age=86400, immutable');
        if (params.size === 'original') res.setHeader('Content-Disposition', `inline; filename="photo-${photo.id}.${photo.originalExt}"`);
        await sendStoredFile(res, files.dir, files.fileName(photo, params.size));
      },
    }),
    route({
      method: 'patch',
      path: '/api/photos/:id',
      access: STAFF,
      summary: 'Change a photo’s caption or kind (operators: their own photos)',
      params: idParams,
      body: photoPatch,
      handler: async ({ params, body, user }) => {
        const photo = await loadPhoto(params.id);
        assertMayChange(user!, photo);
        const before = { kind: photo.kind, caption: photo.caption };
        await audited(
          async (transaction) => {
            await assertPhotoUnlocked(photo, transaction);
            return photo.update(body, { transaction });
          },
          () => ({ userId: user!.id, entity: 'photo', entityId: photo.id, action: 'updated', before, after: { kind: photo.kind, caption: photo.caption } }),
        );
        return photo.toDto();
      },
    }),
    route({
      method: 'delete',
      path: '/api/photos/:id',
      access: STAFF,
      summary: 'Delete a photo and its files (operators: their own photos)',
      params: idParams,
      handler: async ({ params, user }) => {
        const photo = await loadPhoto(params.id);
        assertMayChange(user!, photo);
        const before = { locationId: photo.locationId, runId: photo.runId, kind: photo.kind, caption: photo.caption, sha256: photo.sha256 };
        await audited(
          async (transaction) => {
            await assertPhotoUnlocked(photo, transaction);
            await photo.destroy({ transaction });
          },
          () => ({ userId: user!.id, entity: 'photo', entityId: params.id, action: 'deleted', before }),
        );
        await files.remove(photo);
        return undefined;
      },
    }),
  ];
};
