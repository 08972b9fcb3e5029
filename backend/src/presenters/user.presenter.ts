import type { Me, User as UserDto } from '@toneledger/common/schemas/users';
import { PERMISSIONS, can, type Permission } from '@toneledger/common/domain/roles';
import type { User } from '../models';

/** A user row: the model, or the columns read with the session on each request. */
type UserRow = Pick<User, 'id' | 'email' | 'name' | 'role' | 'createdAt' | 'lastSignInAt'> & { deactivatedAt?: Date | null };

/** `lastAdmin`: whether this person is the one active administrator (the list and the changes work it out). */
export function presentUser(user: UserRow, lastAdmin = false): UserDto {
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    role: user.role,
    createdAt: user.createdAt.toISOString(),
    lastSignInAt: user.lastSignInAt ? user.lastSignInAt.toISOString() : null,
    deactivatedAt: user.deactivatedAt ? user.deactivatedAt.toISOString() : null,
    lastAdmin,
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
