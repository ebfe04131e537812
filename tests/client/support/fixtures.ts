import type { Project } from '@shared/schemas/projects';
import type { Organization, Role, User } from '@shared/schemas/users';

/* Invented people, clients and projects for the client tests. */

export const HARROW_VALE: Organization = { id: 12, name: 'Harrow Vale Developments', contactEmails: [], createdAt: '2025-02-01T00:00:00Z' };

export function aUser(role: Role, name: string, email: string): User {
  return { id: name.length, email, name, role, organizationId: null, active: true, createdAt: '2025-01-01T00:00:00Z' };
}

export function aProject(fields: Partial<Project> & Pick<Project, 'id' | 'code' | 'name'>): Project {
  return {
    organizationId: HARROW_VALE.id,
    organizationName: HARROW_VALE.name,
    site: `Plot ${fields.id}`,
    address: '',
    notes: '',
    createdAt: '2025-04-01T00:00:00Z',
    updatedAt: '2025-04-01T00:00:00Z',
    ...fields,
  };
}
