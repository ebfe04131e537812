import { idParams } from '../../shared/schemas/common';
import { createUserInput, organizationInput, organizationPatch, updateUserInput } from '../../shared/schemas/users';
import { hashPassword } from '../auth/passwords';
import { ADMINS, EDITORS, STAFF } from '../auth/permissions';
import { badRequest, notFound } from '../http/errors';
import { route } from '../http/route';
import { Organization } from '../models/organization';
import { User } from '../models/user';
import { audit } from '../services/audit';

async function assertOrganization(id: number | null | undefined) {
  if (id != null && !(await Organization.findByPk(id))) throw badRequest('organizationId: no such organisation', 'organizationId');
}

export interface UserRouteDeps {
  /** Ends a user's sessions (all but `exceptSid`) and closes their live connections. */
  endSessionsOf: (userId: number, exceptSid?: string) => Promise<void>;
}

export const userRoutes = ({ endSessionsOf }: UserRouteDeps) => [
  route({
    method: 'get',
    path: '/api/users',
    access: ADMINS,
    summary: 'All user accounts',
    handler: async () => ({ items: (await User.findAll({ order: [['name', 'ASC']] })).map((u) => u.toDto()) }),
  }),
  route({
    method: 'post',
    path: '/api/users',
    access: ADMINS,
    summary: 'Create a user account',
    body: createUserInput,
    handler: async ({ body, user }) => {
      await assertOrganization(body.organizationId);
      const { password, ...fields } = body;
      const created = await User.create({ ...fields, passwordHash: await hashPassword(password), lastLoginAt: null });
      await audit({ userId: user!.id, entity: 'user', entityId: created.id, action: 'created', after: created.toDto() });
      return created.toDto();
    },
  }),
  route({
    method: 'patch',
    path: '/api/users/:id',
    access: ADMINS,
    summary: 'Change a user account (role, organisation, active, password); a change of rights ends their sessions',
    params: idParams,
    body: updateUserInput,
    handler: async ({ params, body, user, req }) => {
      const target = await User.findByPk(params.id);
      if (!target) throw notFound('User');
      await assertOrganization(body.organizationId);
      const role = body.role ?? target.role;
      const organizationId = body.organizationId !== undefined ? body.organizationId : target.organizationId;
      if (role === 'client' && organizationId == null) throw badRequest('organizationId: a client user needs an organisation', 'organizationId');
      if (target.id === user!.id && (body.active === false || (body.role && body.role !== 'admin'))) {
        throw badRequest('role: you cannot demote or deactivate your own account', body.active === false ? 'active' : 'role');
      }
      const before = target.toDto();
      const { password, ...fields } = body;
      const rightsChanged =
        (body.role !== undefined && body.role !== before.role) ||
        (body.organizationId !== undefined && body.organizationId !== before.organizationId) ||
        (body.active === false && before.active) ||
        password !== undefined;
      await target.update({ ...fields, ...(password ? { passwordHash: await hashPassword(password) } : {}) });
      // Sessions and sockets opened with the old rights or password end now (the admin's own session stays).
      if (rightsChanged) await endSessionsOf(target.id, target.id === user!.id ? req.sessionID : undefined);
      await audit({ userId: user!.id, entity: 'user', entityId: target.id, action: password ? 'updated+password' : 'updated', before: before, after: target.toDto() });
      return target.toDto();
    },
  }),
  route({
    method: 'get',
    path: '/api/organizations',
    access: STAFF,
    summary: 'Client organisations',
    handler: async () => ({ items: (await Organization.findAll({ order: [['name', 'ASC']] })).map((o) => o.toDto()) }),
  }),
  route({
    method: 'post',
    path: '/api/organizations',
    access: EDITORS,
    summary: 'Create a client organisation',
    body: organizationInput,
    handler: async ({ body, user }) => {
      const org = await Organization.create(body);
      await audit({ userId: user!.id, entity: 'organization', entityId: org.id, action: 'created', after: org.toDto() });
      return org.toDto();
    },
  }),
  route({
    method: 'patch',
    path: '/api/organizations/:id',
    access: EDITORS,
    summary: 'Change a client organisation',
    params: idParams,
    body: organizationPatch,
    handler: async ({ params, body, user }) => {
      const org = await Organization.findByPk(params.id);
      if (!org) throw notFound('Organisation');
      const before = org.toDto();
      await org.update(body);
      await audit({ userId: user!.id, entity: 'organization', entityId: org.id, action: 'updated', before: before, after: org.toDto() });
      return org.toDto();
    },
  }),
];
