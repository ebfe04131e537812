import { ROLES, type Role } from '@shared/schemas/users';

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Lab manager (admin)',
  engineer: 'Engineer',
  operator: 'Rig operator',
  client: 'Client',
};

export const ROLE_OPTIONS = ROLES.map((value) => ({ value, label: ROLE_LABELS[value] }));
