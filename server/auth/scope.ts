import { forbidden, notFound } from '../http/errors';
import { Organization } from '../models/organization';
import { Project } from '../models/project';
import { TestLocation } from '../models/test-location';
import { TestPlan } from '../models/test-plan';
import type { User } from '../models/user';

/** Clients see their own organisation's projects only; staff see all. */
export function projectScope(user: User): { organizationId?: number } {
  return user.role === 'client' ? { organizationId: user.organizationId ?? -1 } : {};
}

/** Loads a project the user may see, or answers 404 (never revealing another client's records). */
export async function loadProject(user: User, id: number): Promise<Project> {
  const project = await Project.findOne({ where: { id, ...projectScope(user) }, include: [{ model: Organization, as: 'organization' }] });
  if (!project) throw notFound('Project');
  return project;
}

/** Loads a test location the user may see, or answers the same 404 whether it is missing or another client's. */
export async function loadLocation(user: User, id: number): Promise<TestLocation> {
  const location = await TestLocation.findByPk(id);
  if (!location || (await Project.count({ where: { id: location.projectId, ...projectScope(user) } })) === 0) throw notFound('Test location');
  return location;
}

export async function loadPlan(user: User, id: number): Promise<TestPlan> {
  if (user.role === 'client') throw forbidden();
  const plan = await TestPlan.findByPk(id, { include: [{ model: TestLocation, as: 'location' }] });
  if (!plan) throw notFound('Test plan');
  return plan;
}
