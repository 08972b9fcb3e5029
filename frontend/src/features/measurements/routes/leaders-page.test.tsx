import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';
import type { Leader } from '@/features/measurements/api/get-leaders';
import { LeadersPage } from '@/features/measurements/routes/leaders-page';
import { PRINT_ID, SPOT_ID, makeListItem } from '@/features/measurements/testing/fixtures';

const SLOW = { timeout: 4000 };

function makeLeader(overrides: Partial<Leader> = {}): Leader {
  return {
    printId: PRINT_ID, accessionNumber: '1979.3.12', title: 'Quay cranes in fog', process: 'gelatin_silver_developing_out', tonerClasses: ['iron_blue'],
    spotId: SPOT_ID, spotName: 'Sky, upper left', latestDeltaE00: 1.42, ratePerYear: 0.0592, rateCi95: [0.04, 0.08], sessions: 6,
    projectedDate: '2031-03-14T00:00:00.000Z', lastMeasuredOn: '2024-05-03', ...overrides,
  };
}

function renderLeaders(path: string, role: Parameters<typeof makeMe>[0] = 'researcher', extra: Record<string, Parameters<typeof mockFetch>[0][string]> = {}) {
  const fetch = mockFetch({
    'GET /api/measurements/leaders': () => json({ data: [makeLeader()], pagination: { page: 1, pageSize: 50, total: 120 } }),
    'GET /api/settings/measurements': () => json({ data: { noticeableDeltaE: 2 } }),
    ...extra,
  });
  const view = renderRoutes(
    [
      { path: '/measurements', element: <LeadersPage /> },
      { path: '/measurements/prints/:id', element: <p>print measurements</p> },
    ],
    { path, me: makeMe(role) },
  );
  return { ...fetch, ...view };
}

const lastLeadersRequest = (requests: { path: string; search: URLSearchParams }[]) =>
  Object.fromEntries([...requests].reverse().find((r) => r.path === '/api/measurements/leaders')!.search);

describe('spots changing most', () => {
  it('asks the API for exactly the query in the URL, and links each row to the print’s measurements', async () => {
    const { requests } = renderLeaders('/measurements?process=cyanotype&tonerClass=iron_blue&sort=change&page=2');
    const link = await screen.findByRole('link', { name: '1979.3.12' }, SLOW);
    expect(link.getAttribute('href')).toBe(`/measurements/prints/${PRINT_ID}`);
    expect(lastLeadersRequest(requests)).toEqual({ process: 'cyanotype', tonerClass: 'iron_blue', sort: 'change', page: '2', pageSize: '50' });
    const table = screen.getByRole('table', { name: 'Spots whose colour is changing most' });
    const row = within(table).getAllByRole('row')[1]!;
    expect(within(row).getAllByRole('cell').map((c) => c.textContent)).toEqual([
      '1979.3.12', 'Quay cranes in fog', 'Gelatin silver, developing-out', 'Iron blue (Prussian blue)', 'Sky, upper left', '1.42',
      '0.0695 % CI 0.04–0.08', '6', 'March 2031', '3 May 2024',
    ]);
    expect(within(table).getByRole('columnheader', { name: /Latest ΔE00/ }).getAttribute('aria-sort')).toBe('descending');
  });

  it('keeps filters and sort in the URL, going back to page 1 when they change', async () => {
    const { router, requests } = renderLeaders('/measurements?page=3');
    await screen.findByRole('link', { name: '1979.3.12' }, SLOW);
    fireEvent.change(screen.getByLabelText('Toner'), { target: { value: 'selenium' } });
    await waitFor(() => expect(router.state.location.search).toBe('?tonerClass=selenium'));
    fireEvent.click(screen.getByRole('button', { name: /Latest ΔE00/ }));
    await waitFor(() => expect(router.state.location.search).toBe('?tonerClass=selenium&sort=change'));
    await waitFor(() => expect(lastLeadersRequest(requests)).toEqual({ tonerClass: 'selenium', sort: 'change', page: '1', pageSize: '50' }));
    fireEvent.click(screen.getByRole('button', { name: 'Next page' }));
    await waitFor(() => expect(router.state.location.search).toBe('?tonerClass=selenium&sort=change&page=2'));
  });

  it('opens a print straight away when the accession number matches exactly', async () => {
    const { router, requests } = renderLeaders('/measurements', 'researcher', {
      'GET /api/prints': () =>
        json({ data: [makeListItem()], pagination: { page: 1, pageSize: 10, total: 1 } }),
    });
    fireEvent.change(await screen.findByLabelText('Accession number', {}, SLOW), { target: { value: '1979.3.12' } });
    fireEvent.click(screen.getByRole('button', { name: 'Open print' }));
    await waitFor(() => expect(router.state.location.pathname).toBe(`/measurements/prints/${PRINT_ID}`));
    expect(Object.fromEntries(requests.find((r) => r.path === '/api/prints')!.search)).toEqual({ q: '1979.3.12', pageSize: '10' });
  });

  it('lists near matches to choose from when none matches exactly', async () => {
    renderLeaders('/measurements', 'researcher', {
      'GET /api/prints': () =>
        json({ data: [makeListItem()], pagination: { page: 1, pageSize: 10, total: 1 } }),
    });
    fireEvent.change(await screen.findByLabelText('Accession number', {}, SLOW), { target: { value: '1979.3' } });
    fireEvent.click(screen.getByRole('button', { name: 'Open print' }));
    const list = await screen.findByRole('list', { name: 'Prints found' });
    expect(within(list).getByRole('link').getAttribute('href')).toBe(`/measurements/prints/${PRINT_ID}`);
  });

  it('lets an administrator change the noticeable-change threshold', async () => {
    const { requests } = renderLeaders('/measurements', 'admin', {
      'PUT /api/settings/measurements': () => json({ data: { noticeableDeltaE: 1.6 } }),
    });
    fireEvent.click(await screen.findByRole('button', { name: 'Change threshold' }, SLOW));
    fireEvent.change(screen.getByLabelText('Noticeable change (ΔE00)'), { target: { value: '1.6' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save threshold' }));
    await waitFor(() => expect(requests.find((r) => r.method === 'PUT')?.body).toEqual({ noticeableDeltaE: 1.6 }));
    expect(await screen.findByText('ΔE00 1.6')).toBeTruthy();
  });
});
