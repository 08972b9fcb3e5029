import { afterEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, within } from '@testing-library/react';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';
import { RoundPage, sheetPrinter } from '@/features/inspections/routes/round-page';
import { PRINTS, REPORT_ID, ROUND_ID, makeRound } from '@/features/inspections/testing/fixtures';

function renderRound(role: 'conservator' | 'registrar', extra: Parameters<typeof mockFetch>[0] = {}) {
  const fetch = mockFetch({ [`GET /api/inspection-rounds/${ROUND_ID}`]: () => json({ data: makeRound() }), ...extra });
  const view = renderRoutes([{ path: '/inspections/rounds/:id', element: <RoundPage /> }], { path: `/inspections/rounds/${ROUND_ID}`, me: makeMe(role) });
  return { ...fetch, ...view };
}

afterEach(() => vi.restoreAllMocks());

describe('RoundPage', () => {
  it('lists the prints as the server orders them, with what to look at, a Check now for each open one and the report of a checked one', async () => {
    renderRound('conservator');
    await screen.findByRole('heading', { name: 'Checks in Drawer 2' });
    expect(screen.getByTestId('round-progress').textContent).toBe('1 of 2 checked');
    const rows = within(screen.getByRole('table')).getAllByRole('row').slice(1);
    expect(rows.map((r) => within(r).getByRole('link', { name: /1984\.7\./ }).textContent)).toEqual(['1984.7.1', '1984.7.2']);
    expect(within(rows[0]!).getByText('Silver mirroring, slight, at the edge (recto)')).toBeTruthy();
    expect(within(rows[0]!).getByRole('link', { name: 'Check now' }).getAttribute('href')).toBe(`/condition/prints/${PRINTS[0]}/reports/new?context=routine`);
    expect(within(rows[1]!).queryByRole('link', { name: 'Check now' })).toBeNull();
    expect(within(rows[1]!).getByRole('link', { name: /^Checked/ }).getAttribute('href')).toBe(`/condition/reports/${REPORT_ID}`);
    expect(within(rows[1]!).getByText('A general check')).toBeTruthy();
  });

  it('prints the sheet through the browser', async () => {
    const print = vi.spyOn(sheetPrinter, 'print').mockImplementation(() => {});
    renderRound('registrar');
    fireEvent.click(await screen.findByRole('button', { name: 'Print the sheet' }));
    expect(print).toHaveBeenCalledTimes(1);
  });

  it('a registrar cannot change the round nor check prints', async () => {
    renderRound('registrar');
    await screen.findByRole('heading', { name: 'Checks in Drawer 2' });
    expect(screen.queryByRole('button', { name: 'Mark done' })).toBeNull();
    expect(screen.queryByRole('link', { name: 'Check now' })).toBeNull();
  });

  it('a conservator marks it done with the version loaded; a stale version shows the server\'s refusal', async () => {
    const { requests } = renderRound('conservator', {
      [`PATCH /api/inspection-rounds/${ROUND_ID}`]: () => errorResponse(409, 'conflict', 'Someone saved this record after you opened it.'),
    });
    fireEvent.click(await screen.findByRole('button', { name: 'Mark done' }));
    await screen.findByText('The round was not changed.');
    expect(requests.find((r) => r.method === 'PATCH')?.body).toEqual({ status: 'done', version: 2 });
  });
});
