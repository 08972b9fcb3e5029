import { describe, expect, it } from 'vitest';
import { PERMISSIONS, ROLES, can, rolesWith } from './roles';
import { AREAS, ADMIN_AREAS, areasFor } from './areas';

// The role table follows the product brief's role descriptions (common practice for the trade's
// division of duties: registrars catalogue, conservators examine, researchers read).
describe('roles and permissions', () => {
  it('admin can do everything a registrar can', () => {
    for (const p of Object.keys(PERMISSIONS) as (keyof typeof PERMISSIONS)[]) {
      if (can('registrar', p)) expect(can('admin', p), p).toBe(true);
    }
  });

  it('a researcher edits nothing', () => {
    const writes = (Object.keys(PERMISSIONS) as (keyof typeof PERMISSIONS)[]).filter((p) => /write|manage/.test(p));
    expect(writes.length).toBeGreaterThan(3);
    for (const p of writes) expect(can('researcher', p), p).toBe(false);
  });

  it('a viewer reads the catalogue but not restricted fields, condition or administration', () => {
    expect(can('viewer', 'catalogue.read')).toBe(true);
    expect(can('viewer', 'catalogue.read_restricted')).toBe(false);
    expect(can('viewer', 'condition.read')).toBe(false);
    expect(can('viewer', 'users.manage')).toBe(false);
  });

  it('valuations are read by registrars and administrators only', () => {
    expect(rolesWith('valuation.read')).toEqual(['admin', 'registrar']);
    for (const role of ['conservator', 'researcher', 'viewer'] as const) expect(can(role, 'valuation.read'), role).toBe(false);
  });

  it('only conservators write condition and measurements', () => {
    expect(rolesWith('condition.write')).toEqual(['conservator']);
    expect(rolesWith('measurements.write')).toEqual(['conservator']);
  });

  it('no role and an unknown role can do nothing', () => {
    expect(can(null, 'catalogue.read')).toBe(false);
    expect(can(undefined, 'catalogue.read')).toBe(false);
  });

  it('every permission names only known roles', () => {
    for (const roles of Object.values(PERMISSIONS)) for (const r of roles) expect(ROLES).toContain(r);
  });
});

describe('areas by role', () => {
  it('shows a viewer the catalogue, loans and exhibitions (read only)', () => {
    expect(areasFor('viewer').map((a) => a.id)).toEqual(['catalogue', 'loans', 'exhibitions']);
    expect(areasFor('viewer', ADMIN_AREAS)).toEqual([]);
  });

  it('shows administration only to admins', () => {
    for (const role of ROLES) {
      expect(areasFor(role, ADMIN_AREAS).length > 0, role).toBe(role === 'admin');
    }
  });

  it('shows research to conservators and researchers but not registrars', () => {
    expect(areasFor('researcher').map((a) => a.id)).toContain('research');
    expect(areasFor('conservator').map((a) => a.id)).toContain('research');
    expect(areasFor('registrar').map((a) => a.id)).not.toContain('research');
  });

  it('keeps unique ids and paths', () => {
    const all = [...AREAS, ...ADMIN_AREAS];
    expect(new Set(all.map((a) => a.id)).size).toBe(all.length);
    expect(new Set(all.map((a) => a.path)).size).toBe(all.length);
  });
});
