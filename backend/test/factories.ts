import { randomUUID } from 'node:crypto';
import type { Role } from '@toneledger/common/domain/roles';
import { User } from '../src/models';

/** A user provisioned straight in the database, unique per call. */
export async function createUser(overrides: Partial<{ role: Role; name: string; email: string | null }> = {}): Promise<User> {
  const tag = randomUUID().slice(0, 8);
  return User.create({
    issuer: 'https://idp.test.invalid',
    subject: `factory-${tag}`,
    email: overrides.email === undefined ? `person-${tag}@test.example` : overrides.email,
    name: overrides.name ?? `Test Person ${tag}`,
    role: overrides.role ?? 'viewer',
    lastSignInAt: null,
  });
}
