import { z } from 'zod';
import { ROLES } from '../domain/roles';
import { pageQuerySchema } from './envelope';

export const roleSchema = z.enum(ROLES);

export const userSchema = z.object({
  id: z.string().uuid(),
  email: z.string().nullable(),
  name: z.string(),
  role: roleSchema,
  createdAt: z.string().datetime(),
  lastSignInAt: z.string().datetime().nullable(),
  /** When the person was deactivated (kept in the record, cannot sign in); null while active. */
  deactivatedAt: z.string().datetime().nullable(),
  /** True for the one active administrator: they cannot be demoted or deactivated until someone else is an administrator. */
  lastAdmin: z.boolean(),
});
export type User = z.infer<typeof userSchema>;

export const meSchema = userSchema.extend({
  permissions: z.array(z.string()),
  sessionExpiresAt: z.string().datetime(),
  environment: z.enum(['development', 'test', 'production']),
});
export type Me = z.infer<typeof meSchema>;

export const userListQuerySchema = pageQuerySchema.extend({
  q: z.string().trim().max(200).optional(),
  role: roleSchema.optional(),
  sort: z.enum(['name', '-name', 'email', '-email', 'role', '-role', 'lastSignInAt', '-lastSignInAt']).default('name'),
});
export type UserListQuery = z.infer<typeof userListQuerySchema>;

export const userIdParamsSchema = z.object({ id: z.string().uuid({ message: 'Not a user id' }) });

export const roleChangeSchema = z.object({
  role: roleSchema,
  reason: z.string().trim().max(500).optional(),
});
export type RoleChange = z.infer<typeof roleChangeSchema>;

export const deactivationSchema = z.object({
  reason: z.string().trim().max(500).optional(),
});
export type Deactivation = z.infer<typeof deactivationSchema>;
