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
