import { idParams } from '../../shared/schemas/common';
import { planInput, planPatch } from '../../shared/schemas/plans';
import { checkPlan } from '../../shared/plans/checks';
import { findProfile } from '../../shared/procedures/profiles';
import { EDITORS, STAFF } from '../auth/permissions';
import { loadLocation, loadPlan } from '../auth/scope';
import { patched } from '../http/patch';
import { route } from '../http/route';
import { Project } from '../models/project';
import { Run } from '../models/run';
import { TestLocation } from '../models/test-location';
import { TestPlan, planColumns } from '../models/test-plan';
import { audited } from '../services/audit';
import { assertNoSignedRunFrom } from '../services/signoff';

async function present(plan: TestPlan) {
  const location = plan.location ?? (await TestLocation.findByPk(plan.locationId));
  return { plan: plan.toDto(), checks: checkPlan(plan.toInput(), findProfile(plan.procedureId), location ?? undefined) };
}

export const planRoutes = [
  route({
    method: 'get',
    path: '/api/plans/ready',
    access: STAFF,
    summary: 'Plans no run has used yet, newest first, with their project and pit: the runs to come',
    handler: async () => {
      const used = new Set((await Run.findAll({ attributes: ['planId'], group: ['planId'] })).map((r) => r.planId));
      const plans = await TestPlan.findAll({
        order: [['id', 'DESC']],
        limit: 200,
        include: [{ model: TestLocation, as: 'location', include: [{ model: Project, as: 'project' }] }],
      });
      return {
        items: plans
          .filter((p) => !used.has(p.id))
          .slice(0, 50)
          .map((p) => ({ id: p.id, name: p.name, pitId: p.location?.pitId ?? '', projectCode: p.location?.project?.code ?? '', createdAt: p.createdAt.toISOString() })),
      };
    },
  }),
  route({
    method: 'get',
    path: '/api/locations/:id/plans',
    access: STAFF,
    summary: 'Test plans of a location',
    params: idParams,
    handler: async ({ params, user }) => {
      await loadLocation(user!, params.id);
      return { items: (await TestPlan.findAll({ where: { locationId: params.id }, order: [['createdAt', 'ASC']] })).map((p) => p.toDto()) };
    },
  }),
  route({
    method: 'post',
    path: '/api/locations/:id/plans',
    access: EDITORS,
    summary: 'Write a test plan for a location',
    params: idParams,
    body: planInput,
    handler: async ({ params, body, user }) => {
      await loadLocation(user!, params.id);
      const plan = await audited(
        (transaction) => TestPlan.create({ locationId: params.id, ...planColumns(body) }, { transaction }),
        (p) => ({ userId: user!.id, entity: 'plan', entityId: p.id, action: 'created', after: p.toDto() }),
      );
      return present(plan);
    },
  }),
  route({
    method: 'get',
    path: '/api/plans/:id',
    access: STAFF,
    summary: 'One test plan with its self-check',
    params: idParams,
    handler: async ({ params, user }) => present(await loadPlan(user!, params.id)),
  }),
  route({
    method: 'patch',
    path: '/api/plans/:id',
    access: EDITORS,
    summary: 'Change a test plan (the fields sent; the others keep their values)',
    params: idParams,
    body: planPatch,
    handler: async ({ params, body, user }) => {
      const plan = await loadPlan(user!, params.id);
      await assertNoSignedRunFrom({ planId: plan.id });
      const next = patched(planInput, plan.toInput(), body);
      const before = plan.toDto();
      await audited(
        (transaction) => plan.update(planColumns(next), { transaction }),
        () => ({ userId: user!.id, entity: 'plan', entityId: plan.id, action: 'updated', before, after: plan.toDto() }),
      );
      return present(plan);
    },
  }),
  route({
    method: 'delete',
    path: '/api/plans/:id',
    access: EDITORS,
    summary: 'Delete a test plan',
    params: idParams,
    handler: async ({ params, user }) => {
      const plan = await loadPlan(user!, params.id);
      await assertNoSignedRunFrom({ planId: plan.id });
      const before = plan.toDto();
      await audited(
        (transaction) => plan.destroy({ transaction }),
        () => ({ userId: user!.id, entity: 'plan', entityId: params.id, action: 'deleted', before }),
      );
      return undefined;
    },
  }),
];
