import { describe, expect, it } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import { MemoryRouter } from 'react-router-dom';
import { ROLES, type Role } from '@toneledger/common/domain/roles';
import { MainNav } from '@/app/layout/main-nav';

function navLinks(role: Role, environment: 'development' | 'test' | 'production' = 'development') {
  render(
    <MemoryRouter>
      <MainNav me={{ role, environment }} />
    </MemoryRouter>,
  );
  const nav = screen.getByRole('navigation', { name: 'Main' });
  return within(nav)
    .queryAllByRole('link')
    .map((link) => link.textContent);
}

describe('MainNav', () => {
  // Written out by hand from the product's role table, so a change to the permissions shows up here.
  const expected: Record<Role, string[]> = {
    admin: ['Catalogue', 'Condition', 'Measurements', 'Loans', 'Exhibitions', 'Climate', 'Inspections', 'Research', 'People and roles', 'Audit trail', 'Outgoing mail', 'Weekly digests', 'Preservation package'],
    registrar: ['Catalogue', 'Condition', 'Measurements', 'Loans', 'Exhibitions', 'Climate', 'Inspections'],
    conservator: ['Catalogue', 'Condition', 'Measurements', 'Loans', 'Exhibitions', 'Climate', 'Inspections', 'Research'],
    researcher: ['Catalogue', 'Condition', 'Measurements', 'Loans', 'Exhibitions', 'Climate', 'Inspections', 'Research'],
    viewer: ['Catalogue', 'Loans', 'Exhibitions'],
  };

  it.each(ROLES)('shows a %s only the areas the role opens', (role) => {
    expect(navLinks(role)).toEqual(expected[role]);
  });

  it('groups the administration areas under their own heading, for administrators only', () => {
    navLinks('admin');
    const group = screen.getByRole('list', { name: 'Administration' });
    expect(within(group).getAllByRole('link').map((link) => link.textContent)).toEqual(['People and roles', 'Audit trail', 'Outgoing mail', 'Weekly digests', 'Preservation package']);
  });

  it('has no administration group for other roles', () => {
    navLinks('registrar');
    expect(screen.queryByText('Administration')).toBeNull();
  });

  it('hides outgoing mail in production', () => {
    expect(navLinks('admin', 'production')).not.toContain('Outgoing mail');
    expect(screen.getByRole('link', { name: 'Audit trail' })).toBeTruthy();
  });

  it('links each area to its path', () => {
    navLinks('viewer');
    expect(screen.getByRole('link', { name: 'Catalogue' }).getAttribute('href')).toBe('/catalogue');
  });
});
