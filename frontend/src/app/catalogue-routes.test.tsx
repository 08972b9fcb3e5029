import { describe, expect, it } from 'vitest';
import { screen, within } from '@testing-library/react';
import type { Role } from '@toneledger/common/domain/roles';
import { routes } from '@/app/router';
import { json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';
import { referenceHandlers } from '@/features/catalogue/testing/fixtures';

function signedIn(role: Role, path: string) {
  const fetch = mockFetch({
    ...referenceHandlers(),
    'GET /api/me': () => json({ data: makeMe(role) }),
    'GET /api/prints': () => json({ data: [], pagination: { page: 1, pageSize: 50, total: 0 } }),
  });
  renderRoutes(routes, { path });
  return fetch;
}

async function sections() {
  const nav = await screen.findByRole('navigation', { name: 'Catalogue' });
  return within(nav).getAllByRole('link').map((link) => link.textContent);
}

describe('catalogue area', () => {
  it('opens the print list with the sub-navigation a registrar may use', async () => {
    signedIn('registrar', '/catalogue');
    expect(await screen.findByRole('heading', { level: 1, name: 'Prints' })).toBeTruthy();
    expect(await sections()).toEqual(['Prints', 'Import', 'Entries and acquisitions', 'Makers', 'Papers', 'Bath recipes', 'Locations', 'Enclosures', 'Data dictionary', 'Light budgets']);
  });

  it('shows an administrator the settings as well', async () => {
    signedIn('admin', '/catalogue');
    expect(await sections()).toEqual(['Prints', 'Import', 'Entries and acquisitions', 'Makers', 'Papers', 'Bath recipes', 'Locations', 'Enclosures', 'Data dictionary', 'Light budgets', 'Settings']);
  });

  it('gives a viewer neither Import nor Locations', async () => {
    signedIn('viewer', '/catalogue');
    expect(await sections()).toEqual(['Prints', 'Makers', 'Papers', 'Bath recipes', 'Enclosures', 'Data dictionary']);
  });

  it('opens the data dictionary to a viewer, without asking the server for anything', async () => {
    const { requests } = signedIn('viewer', '/catalogue/fields');
    expect(await screen.findByRole('heading', { level: 1, name: 'Data dictionary' })).toBeTruthy();
    expect(requests.map((r) => r.path)).toEqual(['/api/me']);
  });

  it.each([
    ['viewer', '/catalogue/import'],
    ['researcher', '/catalogue/prints/new'],
    ['viewer', '/catalogue/locations'],
    ['registrar', '/catalogue/settings'],
    ['viewer', '/catalogue/light-budgets'],
    ['viewer', '/catalogue/light-settings'],
  ] as const)('refuses a %s at %s without asking for its data', async (role, path) => {
    const { requests } = signedIn(role, path);
    expect(await screen.findByRole('heading', { name: 'Not allowed' })).toBeTruthy();
    expect(requests.map((r) => r.path)).toEqual(['/api/me']);
  });

  it('shows "Page not found" for an unknown catalogue address', async () => {
    signedIn('viewer', '/catalogue/nothing-here');
    expect(await screen.findByRole('heading', { name: 'Page not found' })).toBeTruthy();
  });
});
