import { describe, expect, it } from 'vitest';
import { screen, within } from '@testing-library/react';
import { json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { ClimateRoomsPage } from '@/features/climate/routes/climate-rooms-page';
import { makeRoom } from '@/features/climate/testing/fixtures';

describe('ClimateRoomsPage', { timeout: 20_000 }, () => {
  it('puts each room’s permanence, means, time outside and excursions side by side, for the period in the URL', async () => {
    const { requests } = mockFetch({
      'GET /api/climate/rooms': () => json({ data: [makeRoom(), makeRoom({ locationId: '7f1d2c1e-0b3a-4c55-9a7e-2d1f0c9b8a02', locationLabel: 'Harbour Building › Store C', permanence: 0.812, outsideEither: 0.2449, excursions: 5 })] }),
      'GET /api/locations': () => json({ data: [], pagination: { page: 1, pageSize: 1000, total: 0 } }),
    });
    renderPage(<ClimateRoomsPage />, { me: makeMe('researcher'), path: '/climate?from=2025-01-01&to=2025-12-31' });
    const rowB = (await screen.findByRole('link', { name: 'Harbour Building › Store B' })).closest('tr')!;
    expect(within(rowB).getByText('1.91×')).toBeTruthy();
    expect(within(rowB).getByText('16.2 °C')).toBeTruthy();
    expect(within(rowB).getByText('44.1 %')).toBeTruthy();
    expect(within(rowB).getByText('3.1 %')).toBeTruthy();
    const rowC = screen.getByRole('link', { name: 'Harbour Building › Store C' }).closest('tr')!;
    expect(within(rowC).getByText('0.81×')).toBeTruthy();
    expect(within(rowC).getByText('24.5 %')).toBeTruthy();
    const asked = requests.find((r) => r.path === '/api/climate/rooms')!;
    expect([asked.search.get('from'), asked.search.get('to')]).toEqual(['2025-01-01', '2025-12-31']);
  });
});
