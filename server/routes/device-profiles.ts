import { DEFAULT_DEVICE_PROFILES } from '../../shared/devices/default-profiles';
import { type ListedDeviceProfile, labProfileInput, labProfileReplace, profileIdParams, profilePreviewInput } from '../../shared/devices/schema';
import { isBuiltInProfile, refreshLabProfiles } from '../acquisition/device-profiles';
import { previewProfile } from '../acquisition/profile-preview';
import { ADMINS, EDITORS } from '../auth/permissions';
import { badRequest, conflict, notFound } from '../http/errors';
import { route } from '../http/route';
import { DeviceProfileRecord } from '../models/device-profile';
import { audited } from '../services/audit';

const builtIn = (): ListedDeviceProfile[] => DEFAULT_DEVICE_PROFILES.map((p) => ({ ...p, source: 'built-in', updatedAt: null }));

async function loadProfile(id: string): Promise<DeviceProfileRecord> {
  const record = await DeviceProfileRecord.findByPk(id);
  if (!record) throw notFound('Device profile');
  return record;
}

/** Device profiles: the built-in ones (read only) and those the lab defines (admins write, engineers read). */
export const deviceProfileRoutes = [
  route({
    method: 'get',
    path: '/api/device-profiles',
    access: EDITORS,
    summary: 'Device profiles a rig channel can speak: built-in, then the lab’s own',
    handler: async () => {
      const lab = await DeviceProfileRecord.findAll({ order: [['profileId', 'ASC']] });
      return { items: [...builtIn(), ...lab.map((r) => r.toDto())] };
    },
  }),
  route({
    method: 'get',
    path: '/api/device-profiles/:id',
    access: EDITORS,
    summary: 'One device profile',
    params: profileIdParams,
    handler: async ({ params }) => builtIn().find((p) => p.id === params.id) ?? (await loadProfile(params.id)).toDto(),
  }),
  route({
    method: 'post',
    path: '/api/device-profiles',
    access: ADMINS,
    summary: 'Define a device profile of the lab',
    body: labProfileInput,
    handler: async ({ body, user }) => {
      if (isBuiltInProfile(body.id)) throw badRequest(`id: "${body.id}" is a built-in profile`, 'id');
      if (await DeviceProfileRecord.findByPk(body.id)) throw conflict(`id: a profile "${body.id}" exists already`, 'id');
      const record = await audited(
        (transaction) => DeviceProfileRecord.create({ profileId: body.id, protocol: body.protocol, definition: body, createdBy: user!.id }, { transaction }),
        (r) => ({ userId: user!.id, entity: 'device-profile', entityId: r.profileId, action: 'created', after: r.toProfile() }),
      );
      await refreshLabProfiles();
      return record.toDto();
    },
  }),
  route({
    method: 'put',
    path: '/api/device-profiles/:id',
    access: ADMINS,
    summary: 'Replace a lab device profile (the whole profile; its id stays)',
    params: profileIdParams,
    body: labProfileReplace,
    handler: async ({ params, body, user }) => {
      if (isBuiltInProfile(params.id)) throw badRequest('Built-in profiles cannot be changed; define a lab profile instead.');
      const record = await loadProfile(params.id);
      const before = record.toProfile();
      const definition = { ...body, id: params.id };
      await audited(
        (transaction) => record.update({ protocol: body.protocol, definition }, { transaction }),
        () => ({ userId: user!.id, entity: 'device-profile', entityId: params.id, action: 'updated', before, after: record.toProfile() }),
      );
      await refreshLabProfiles();
      return record.toDto();
    },
  }),
  route({
    method: 'post',
    path: '/api/device-profiles/preview',
    access: EDITORS,
    summary: 'Try a profile on a port for a moment (nothing is stored): each sample, and why any had no value',
    body: profilePreviewInput,
    status: 200, // nothing is created
    handler: ({ body }) => previewProfile(body.profile, body.port, body.durationMs),
  }),
];
