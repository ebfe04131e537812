import { idParams } from '../../shared/schemas/common';
import { SITE_PLAN_MAX_BYTES, SITE_PLAN_TYPES } from '../../shared/schemas/projects';
import { EDITORS, EVERYONE } from '../auth/permissions';
import { loadLocation } from '../auth/scope';
import { notFound } from '../http/errors';
import { route } from '../http/route';
import { sendStoredFile, singleUpload, storeUpload, uploadDir } from '../http/uploads';
import { audited } from '../services/audit';


/** Site-plan images of test locations, kept in `<dataDir>/uploads/site-plans`. */
export const sitePlanRoutes = (dataDir: string) => {
  const dir = uploadDir(dataDir, 'site-plans');
  return [
    route({
      method: 'post',
      path: '/api/locations/:id/site-plan',
      access: EDITORS,
      summary: 'Upload the site-plan image of a location (PNG or JPEG, ≤ 10 MB)',
      status: 200,
      params: idParams,
      before: [singleUpload('file', SITE_PLAN_MAX_BYTES)],
      handler: async ({ params, user, req }) => {
        const location = await loadLocation(user!, params.id);
        const name = await storeUpload(req.file, dir, SITE_PLAN_TYPES);
        const before = location.get({ plain: true });
        await audited(
          (transaction) => location.update({ sitePlanFile: name }, { transaction }),
          () => ({ userId: user!.id, entity: 'location', entityId: location.id, action: 'site-plan-uploaded', before, after: location.get({ plain: true }) }),
        );
        return location.toDto();
      },
    }),
    route({
      method: 'get',
      path: '/api/locations/:id/site-plan',
      access: EVERYONE,
      summary: 'The site-plan image of a location',
      params: idParams,
      handler: async ({ params, user, res }) => {
        const location = await loadLocation(user!, params.id);
        if (!location.sitePlanFile) throw notFound('Site plan');
        res.setHeader('Cache-Control', 'private, max-age=300');
        const file = location.sitePlanFile;
        await sendStoredFile(res, dir, file);
      },
    }),
  ];
};
