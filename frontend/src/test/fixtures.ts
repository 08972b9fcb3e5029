import type { Role } from '@toneledger/common/domain/roles';
import type { Me, User } from '@toneledger/common/schemas/users';

export function makeUser(overrides: Partial<User> = {}): User {
  return {
    id: '0b7c1c8e-2f57-4b39-9d7c-3f1e5b6a7c01',
    email: 'ada.marsh@example.test',
    name: 'Ada Marsh',
    role: 'registrar',
    createdAt: '2024-03-01T09:00:00.000Z',
    lastSignInAt: '2025-01-15T14:30:00.000Z',
    deactivatedAt: null,
    lastAdmin: false,
    ...overrides,
  };
}

export function makeMe(role: Role, overrides: Partial<Me> = {}): Me {
  return {
    ...makeUser({ role, name: 'Iris Penhale', email: 'iris.penhale@example.test', id: '5d0c0f5e-8a7b-4c2d-9e1f-112233445566' }),
    permissions: [],
    sessionExpiresAt: '2099-01-01T00:00:00.000Z',
    environment: 'development',
    ...overrides,
  };
}
