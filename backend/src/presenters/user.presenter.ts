import type { Me, User as UserDto } from '@toneledger/common/schemas/users';
import { PERMISSIONS, can, type Permission } from '@toneledger/common/domain/roles';
import type { User } from '../models';

/** A user row: the model, or the columns read with the session on each request. */
type UserRow = Pick<User, 'id' | 'email' | 'name' | 'role' | 'createdAt' | 'lastSignInAt'>;

export function presentUser(user: UserRow): UserDto {
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    role: user.role,
    createdAt: user.createdAt.toISOString(),
    lastSignInAt: user.lastSignInAt ? user.lastSignInAt.toISOString() : null,
  };
}

export function presentMe(user: UserRow, sessionExpiresAt: Date, environment: Me['environment']): Me {
  return {
    ...presentUser(user),
    permissions: (Object.keys(PERMISSIONS) as Permission[]).filter((p) => can(user.role, p)),
    sessionExpiresAt: sessionExpiresAt.toISOString(),
    environment,
  };
}
