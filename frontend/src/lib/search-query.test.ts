import { describe, expect, it } from 'vitest';
import { userListQuerySchema } from '@toneledger/common/schemas/users';
import { auditListQuerySchema } from '@toneledger/common/schemas/audit';
import type { UserListQuery } from '@toneledger/common/schemas/users';
import { parseSearchQuery, writeSearchQuery } from '@/lib/search-query';

describe('parseSearchQuery', () => {
  it('fills defaults from the API schema', () => {
    expect(parseSearchQuery(userListQuerySchema, new URLSearchParams())).toEqual({ page: 1, pageSize: 50, sort: 'name' });
  });

  it('coerces values and drops only the ones the schema rejects', () => {
    const query = parseSearchQuery(userListQuerySchema, new URLSearchParams('page=3&role=wizard&sort=-lastSignInAt&q=marsh'));
    expect(query).toEqual({ page: 3, pageSize: 50, sort: '-lastSignInAt', q: 'marsh' });
  });

  it('drops a malformed person id in the audit query', () => {
    const query = parseSearchQuery(auditListQuerySchema, new URLSearchParams('actorId=not-a-uuid&action=user.role_changed'));
    expect(query).toEqual({ page: 1, pageSize: 50, action: 'user.role_changed' });
  });
});

describe('writeSearchQuery', () => {
  it('leaves out defaults and empty values so URLs stay short', () => {
    const defaults = userListQuerySchema.parse({});
    const query: UserListQuery = { page: 1, pageSize: 50, sort: 'name', q: undefined, role: 'viewer' };
    const params = writeSearchQuery(query, defaults);
    expect(params.toString()).toBe('role=viewer');
  });

  it('keeps unrelated params', () => {
    const defaults = userListQuerySchema.parse({});
    const query: UserListQuery = { page: 2, pageSize: 50, sort: 'name' };
    const params = writeSearchQuery(query, defaults, new URLSearchParams('message=abc'));
    expect(params.get('message')).toBe('abc');
    expect(params.get('page')).toBe('2');
  });
});
