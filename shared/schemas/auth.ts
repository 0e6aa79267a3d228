// Sign-in, password and user administration payloads.
import { z } from 'zod';
import { ROLES } from '../domain';
import { email, password, requiredText } from './common';

export const loginSchema = z.strictObject({ email, password: z.string().min(1, 'is required').max(200) });
export const changePasswordSchema = z.strictObject({
  currentPassword: z.string().min(1, 'is required'),
  newPassword: password,
});

const roles = z.array(z.enum(ROLES)).min(1, 'pick at least one role').max(4);
export const createUserSchema = z.strictObject({
  email,
  name: requiredText(120),
  roles,
  password: password.optional(),
});
export const updateUserSchema = z
  .strictObject({ name: requiredText(120).optional(), roles: roles.optional(), active: z.boolean().optional() })
  .refine((v) => Object.keys(v).length > 0, 'nothing to change');
export const resetPasswordSchema = z.strictObject({ password });

export type LoginInput = z.infer<typeof loginSchema>;
export type CreateUserInput = z.infer<typeof createUserSchema>;
export type UpdateUserInput = z.infer<typeof updateUserSchema>;

/** The signed-in person: its contract is in shared/contracts/auth.ts. */
export type { SessionUser } from '../contracts/auth';
