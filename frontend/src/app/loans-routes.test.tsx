import { describe, expect, it } from 'vitest';
import { screen } from '@testing-library/react';
import type { Role } from '@toneledger/common/domain/roles';
import { routes } from '@/app/router';
import { json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';

const empty = () => json({ data: [], pagination: { page: 1, pageSize: 50, total: 0 } });

function signedIn(role: Role, path: string) {
  const fetch = mockFetch({ 'GET /api/me': () => json({ data: makeMe(role) }), 'GET /api/loans': empty, 'GET /api/exhibitions': empty });
  renderRoutes(routes, { path });
  return fetch;
}

describe('loans and exhibitions areas', () => {
  it.each<[string, string]>([
    ['/loans', 'Loans'],
    ['/exhibitions', 'Exhibitions'],
  ])('opens %s to a viewer, read only', async (path, heading) => {
    signedIn('viewer', path);
    // The first lazy page of a run is compiled on demand, which can take longer than the default wait.
    expect(await screen.findByRole('heading', { level: 1, name: heading }, { timeout: 5000 })).toBeTruthy();
    expect(screen.queryByRole('link', { name: /^New / })).toBeNull();
  });

  it.each<[Role, string]>([
    ['conservator', '/loans/new'],
    ['viewer', '/exhibitions/new'],
  ])('shows a %s "Not allowed" at %s, without asking for data', async (role, path) => {
    const { requests } = signedIn(role, path);
    expect(await screen.findByRole('heading', { name: 'Not allowed' })).toBeTruthy();
    expect(requests.map((r) => r.path)).toEqual(['/api/me']);
  });

  it('offers a registrar the new-loan form', async () => {
    signedIn('registrar', '/loans/new');
    expect(await screen.findByRole('form', { name: 'New loan' })).toBeTruthy();
  });
});
