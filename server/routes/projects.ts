import { idParams } from '../../shared/schemas/common';
import { locationInput, locationPatch, projectInput, projectPatch } from '../../shared/schemas/projects';
import { ADMINS, EDITORS, EVERYONE } from '../auth/permissions';
import { loadLocation, loadProject, projectScope } from '../auth/scope';
import { badRequest } from '../http/errors';
import { route } from '../http/route';
import { Organization } from '../models/organization';
import { Project } from '../models/project';
import { TestLocation } from '../models/test-location';
import { audited } from '../services/audit';
import { assertNoPhotosAt } from '../services/photos';
import { assertNoSignedRunFrom } from '../services/signoff';

async function assertOrganization(id: number | undefined) {
  if (id !== undefined && !(await Organization.findByPk(id))) throw badRequest('organizationId: no such organisation', 'organizationId');
}

/** Project fields a signed report shows or depends on (the organisation decides which client sees it). */
const REPORTED_PROJECT_FIELDS = ['code', 'name', 'site', 'address', 'organizationId'] as const;

const withOrganization = { include: [{ model: Organization, as: 'organization' }] };

export const projectRoutes = [
  route({
    method: 'get',
    path: '/api/projects',
    access: EVERYONE,
    summary: 'Projects the user may see',
    handler: async ({ user }) => ({
      items: (await Project.findAll({ where: projectScope(user!), ...withOrganization, order: [['updatedAt', 'DESC']] })).map((p) => p.toDto()),
    }),
  }),
  route({
    method: 'post',
    path: '/api/projects',
    access: EDITORS,
    summary: 'Create a project',
    body: projectInput,
    handler: async ({ body, user }) => {
      await assertOrganization(body.organizationId);
      const p = await audited(
        (transaction) => Project.create(body, { transaction }),
        (created) => ({ userId: user!.id, entity: 'project', entityId: created.id, action: 'created', after: created.get({ plain: true }) }),
      );
      return (await loadProject(user!, p.id)).toDto();
    },
  }),
  route({
    method: 'get',
    path: '/api/projects/:id',
    access: EVERYONE,
    summary: 'One project',
    params: idParams,
    handler: async ({ params, user }) => (await loadProject(user!, params.id)).toDto(),
  }),
  route({
    method: 'patch',
    path: '/api/projects/:id',
    access: EDITORS,
    summary: 'Change a project',
    params: idParams,
    body: projectPatch,
    handler: async ({ params, body, user }) => {
      await assertOrganization(body.organizationId);
      const project = await loadProject(user!, params.id);
      // What a report prints of the project (and the organisation that may read it) stays as signed; notes are not printed.
      if (REPORTED_PROJECT_FIELDS.some((f) => body[f] !== undefined)) await assertNoSignedRunFrom({ projectId: project.id });
      const before = project.get({ plain: true });
      await audited(
        (transaction) => project.update(body, { transaction }),
        () => ({ userId: user!.id, entity: 'project', entityId: project.id, action: 'updated', before, after: project.get({ plain: true }) }),
      );
      return (await loadProject(user!, project.id)).toDto();
    },
  }),
  route({
    method: 'delete',
    path: '/api/projects/:id',
    access: ADMINS,
    summary: 'Delete a project with its locations and plans',
    params: idParams,
    handler: async ({ params, user }) => {
      const project = await loadProject(user!, params.id);
      const before = project.get({ plain: true });
      await assertNoPhotosAt({ projectId: project.id });
      await audited(
        (transaction) => project.destroy({ transaction }),
        () => ({ userId: user!.id, entity: 'project', entityId: params.id, action: 'deleted', before }),
      );
      return undefined;
    },
  }),
  route({
    method: 'get',
    path: '/api/projects/:id/locations',
    access: EVERYONE,
    summary: 'Test locations of a project',
    params: idParams,
    handler: async ({ params, user }) => {
      await loadProject(user!, params.id);
      return { items: (await TestLocation.findAll({ where: { projectId: params.id }, order: [['pitId', 'ASC']] })).map((l) => l.toDto()) };
    },
  }),
  route({
    method: 'post',
    path: '/api/projects/:id/locations',
    access: EDITORS,
    summary: 'Add a test location to a project',
    params: idParams,
    body: locationInput,
    handler: async ({ params, body, user }) => {
      await loadProject(user!, params.id);
      const created = await audited(
        (transaction) => TestLocation.create({ ...body, projectId: params.id }, { transaction }),
        (l) => ({ userId: user!.id, entity: 'location', entityId: l.id, action: 'created', after: l.get({ plain: true }) }),
      );
      return created.toDto();
    },
  }),
  route({
    method: 'get',
    path: '/api/locations/:id',
    access: EVERYONE,
    summary: 'One test location',
    params: idParams,
    handler: async ({ params, user }) => (await loadLocation(user!, params.id)).toDto(),
  }),
  route({
    method: 'patch',
    path: '/api/locations/:id',
    access: EDITORS,
    summary: 'Change a test location',
    params: idParams,
    body: locationPatch,
    handler: async ({ params, body, user }) => {
      const location = await loadLocation(user!, params.id);
      await assertNoSignedRunFrom({ locationId: location.id });
      const before = location.get({ plain: true });
      await audited(
        (transaction) => location.update(body, { transaction }),
        () => ({ userId: user!.id, entity: 'location', entityId: location.id, action: 'updated', before, after: location.get({ plain: true }) }),
      );
      return location.toDto();
    },
  }),
  route({
    method: 'delete',
    path: '/api/locations/:id',
    access: EDITORS,
    summary: 'Delete a test location and its plans',
    params: idParams,
    handler: async ({ params, user }) => {
      const location = await loadLocation(user!, params.id);
      const before = location.get({ plain: true });
      await assertNoPhotosAt({ locationId: location.id });
      await audited(
        (transaction) => location.destroy({ transaction }),
        () => ({ userId: user!.id, entity: 'location', entityId: params.id, action: 'deleted', before }),
      );
      return undefined;
    },
  }),
];
