import { describe, expect, it } from 'vitest';
import { screen, within } from '@testing-library/react';
import type { Role } from '@toneledger/common/domain/roles';
import type { ReportSummary } from '@toneledger/common/schemas/condition';
import { json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';
import { ConditionIndexPage } from '@/features/condition/routes/condition-index-page';

const report = (over: Partial<ReportSummary>): ReportSummary => ({
  id: 'a1111111-2222-4333-8444-555555555555', printId: 'b1111111-2222-4333-8444-555555555555', accessionNumber: '1987.14.3', printTitle: 'Harbour wall, low tide',
  examinedOn: '2025-03-14', examinerName: 'Iris Penhale', context: 'routine', grade: null, status: 'draft', signedAt: null, updatedAt: '2025-03-14T10:00:00.000Z',
  ...over,
});
const draft = report({});
const signed = report({ id: 'a2222222-2222-4333-8444-555555555555', accessionNumber: '1979.3.12', printTitle: 'Quay cranes in fog', status: 'signed', grade: 'fair', signedAt: '2025-04-01T10:00:00.000Z' });

function renderIndex(role: Role) {
  const fetch = mockFetch({
    'GET /api/condition/work': () => json({ data: { myDrafts: role === 'conservator' ? [draft] : [], mySigned: role === 'conservator' ? [signed] : [], recent: [signed] } }),
    'GET /api/admin/fixity/alerts': () => json({ data: [] }),
  });
  renderRoutes([{ path: '/condition', element: <ConditionIndexPage /> }], { path: '/condition', me: makeMe(role) });
  return fetch;
}

describe('ConditionIndexPage', () => {
  it('opens on the conservator’s own work: drafts to finish, their reports, the latest, and fixity alerts to read', async () => {
    const { requests } = renderIndex('conservator');
    const drafts = await screen.findByRole('region', { name: /Drafts to finish/ }, { timeout: 5000 });
    expect(within(drafts).getByRole('link', { name: '1987.14.3 Harbour wall, low tide' }).getAttribute('href')).toBe(`/condition/reports/${draft.id}`);
    const mine = screen.getByRole('region', { name: /Your recent reports/ });
    expect(mine.textContent).toContain('Fair');
    expect(await screen.findByRole('region', { name: 'Fixity alerts' })).toBeTruthy();
    // Reading alerts, not running the check: that stays with administrators.
    expect(screen.queryByRole('button', { name: 'Check all images now' })).toBeNull();
    expect(requests.some((r) => r.path === '/api/admin/fixity/alerts')).toBe(true);
    // The work comes before the print search.
    const search = screen.getByRole('region', { name: 'Find a print' });
    expect(drafts.compareDocumentPosition(search) & Node.DOCUMENT_POSITION_FOLLOWING).toBeTruthy();
  });

  it('shows a researcher the latest reports only, and no fixity alerts', async () => {
    const { requests } = renderIndex('researcher');
    expect(await screen.findByRole('region', { name: /Latest signed reports/ }, { timeout: 5000 })).toBeTruthy();
    expect(screen.queryByRole('region', { name: /Drafts to finish/ })).toBeNull();
    expect(screen.queryByRole('region', { name: 'Fixity alerts' })).toBeNull();
    expect(requests.some((r) => r.path === '/api/admin/fixity/alerts')).toBe(false);
  });
});
