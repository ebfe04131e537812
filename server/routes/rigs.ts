import { findDeviceProfile, refreshLabProfiles } from '../acquisition/device-profiles';
import { idParams } from '../../shared/schemas/common';
import { type RigInput, rigInput, rigPatch } from '../../shared/schemas/instruments';
import { EDITORS, STAFF } from '../auth/permissions';
import { badRequest, notFound } from '../http/errors';
import { patched } from '../http/patch';
import { route } from '../http/route';
import { Instrument } from '../models/instrument';
import { Rig } from '../models/rig';
import { audited } from '../services/audit';

/** Every instrument a rig names must exist, and each channel's profile must be known (built-in or the lab's). */
async function assertReferences(rig: RigInput) {
  await refreshLabProfiles();
  for (const [i, c] of rig.channels.entries()) {
    if (rig.mode === 'serial' && !findDeviceProfile(c.profileId)) throw badRequest(`channels.${i}.profileId: unknown device profile "${c.profileId}"`, `channels.${i}.profileId`);
    if (c.instrumentId != null && !(await Instrument.findByPk(c.instrumentId))) throw badRequest(`channels.${i}.instrumentId: no such instrument`, `channels.${i}.instrumentId`);
  }
  if (rig.jackInstrumentId != null) {
    const jack = await Instrument.findByPk(rig.jackInstrumentId);
    if (jack?.kind !== 'jack') throw badRequest('jackInstrumentId: must name a registered jack', 'jackInstrumentId');
  }
}

async function loadRig(id: number): Promise<Rig> {
  const rig = await Rig.findByPk(id);
  if (!rig) throw notFound('Rig');
  return rig;
}

export const rigRoutes = [
  route({
    method: 'get',
    path: '/api/rigs',
    access: STAFF,
    summary: 'Rigs (named sets of channels)',
    handler: async () => ({ items: (await Rig.findAll({ order: [['name', 'ASC']] })).map((r) => r.toDto()) }),
  }),
  route({
    method: 'post',
    path: '/api/rigs',
    access: EDITORS,
    summary: 'Define a rig',
    body: rigInput,
    handler: async ({ body, user }) => {
      await assertReferences(body);
      const rig = await audited(
        (transaction) => Rig.create(body, { transaction }),
        (r) => ({ userId: user!.id, entity: 'rig', entityId: r.id, action: 'created', after: r.toDto() }),
      );
      return rig.toDto();
    },
  }),
  route({
    method: 'get',
    path: '/api/rigs/:id',
    access: STAFF,
    summary: 'One rig',
    params: idParams,
    handler: async ({ params }) => (await loadRig(params.id)).toDto(),
  }),
  route({
    method: 'patch',
    path: '/api/rigs/:id',
    access: EDITORS,
    summary: 'Change a rig (the fields sent; the others keep their values)',
    params: idParams,
    body: rigPatch,
    handler: async ({ params, body, user }) => {
      const rig = await loadRig(params.id);
      const next = patched(rigInput, rig.toDto(), body);
      await assertReferences(next);
      const before = rig.toDto();
      await audited(
        (transaction) => rig.update(next, { transaction }),
        () => ({ userId: user!.id, entity: 'rig', entityId: rig.id, action: 'updated', before, after: rig.toDto() }),
      );
      return rig.toDto();
    },
  }),
];
