import { z } from 'zod';
import { patchOf, requiredText } from './common';

export const ROLES = ['admin', 'engineer', 'operator', 'client'] as const;
export const roleSchema = z.enum(ROLES);
export type Role = z.infer<typeof roleSchema>;

/** Password policy (QUALITY.md S3): at least 8, up to 128 characters. */
export const passwordSchema = z.string().min(8, 'at least 8 characters').max(128, 'at most 128 characters');

export const loginInput = z.object({
  email: z.string().trim().toLowerCase().email('a valid e-mail address'),
  password: z.string().min(1, 'required').max(128),
});
export type LoginInput = z.infer<typeof loginInput>;

export const changePasswordInput = z.object({
  currentPassword: z.string().min(1, 'required').max(128),
  newPassword: passwordSchema,
});
export type ChangePasswordInput = z.infer<typeof changePasswordInput>;

export const createUserInput = z
  .object({
    email: z.string().trim().toLowerCase().email('a valid e-mail address').max(190),
    name: requiredText(120),
    role: roleSchema,
    organizationId: z.number().int().positive().nullable().default(null),
    password: passwordSchema,
  })
  .refine((u) => u.role !== 'client' || u.organizationId !== null, {
    message: 'a client user needs an organisation',
    path: ['organizationId'],
  });
export type CreateUserInput = z.infer<typeof createUserInput>;

export const updateUserInput = z.object({
  name: requiredText(120).optional(),
  role: roleSchema.optional(),
  organizationId: z.number().int().positive().nullable().optional(),
  active: z.boolean().optional(),
  password: passwordSchema.optional(),
});
export type UpdateUserInput = z.infer<typeof updateUserInput>;

export interface User {
  id: number;
  email: string;
  name: string;
  role: Role;
  organizationId: number | null;
  active: boolean;
  createdAt: string;
}

export const organizationInput = z.object({
  name: requiredText(160),
  contactEmails: z.array(z.string().trim().toLowerCase().email('a valid e-mail address')).max(20).default([]),
});
export type OrganizationInput = z.infer<typeof organizationInput>;
export const organizationPatch = patchOf(organizationInput);

export interface Organization {
  id: number;
  name: string;
  contactEmails: string[];
  createdAt: string;
}
