import { z } from 'zod';
import { patchOf, requiredText } from './common';
import { COMMON_PASSWORDS } from './common-passwords';

export const ROLES = ['admin', 'engineer', 'operator', 'client'] as const;
export const roleSchema = z.enum(ROLES);
export type Role = z.infer<typeof roleSchema>;

/** True when every character is the previous one plus (or minus) one: 12345678, abcdefgh, 87654321. */
function straightRun(text: string): boolean {
  const codes = [...text].map((c) => c.codePointAt(0)!);
  const step = codes[1] - codes[0];
  return Math.abs(step) === 1 && codes.every((c, i) => i === 0 || c - codes[i - 1] === step);
}

/** Why a password is too easy to guess (NIST SP 800-63B style: a blocklist rather than composition rules), or null. */
export function weakPasswordReason(password: string): string | null {
  const lower = password.toLowerCase();
  if (/^(.)\1*$/su.test(password)) return 'one character repeated is too easy to guess';
  if (straightRun(lower)) return 'a straight run of characters is too easy to guess';
  // A listed word alone, or with digits and symbols stuck on the end (password1!, qwerty2024).
  if (COMMON_PASSWORDS.has(lower) || COMMON_PASSWORDS.has(lower.replace(/[^\p{L}]+$/u, ''))) return 'this password is too common; choose a longer phrase of your own';
  return null;
}

/** Password policy (target S3): 8 to 128 characters, not a common or trivially guessed one. */
export const passwordSchema = z
  .string()
  .min(8, 'at least 8 characters')
  .max(128, 'at most 128 characters')
  .superRefine((password, ctx) => {
    const reason = weakPasswordReason(password);
    if (reason) ctx.addIssue({ code: 'custom', message: reason });
  });

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
