import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';
import { ClimateLocationPage } from '@/features/climate/routes/climate-location-page';
import { FILE_ID, LOCATION_ID, emptySeries, makeFile, makeSummary } from '@/features/climate/testing/fixtures';

const base = {
  [`GET /api/locations/${LOCATION_ID}/climate`]: () => json({ data: makeSummary() }),
  [`GET /api/locations/${LOCATION_ID}/climate/series`]: () => json({ data: emptySeries() }),
};
const render = (role: 'conservator' | 'researcher' = 'conservator') =>
  renderRoutes([{ path: '/climate/locations/:id', element: <ClimateLocationPage /> }], { path: `/climate/locations/${LOCATION_ID}`, me: makeMe(role) });

describe('ClimateLocationPage', { timeout: 20_000 }, () => {
  it('shows the figures with the settings and sources beside them', async () => {
    mockFetch({ ...base, [`GET /api/locations/${LOCATION_ID}/climate-files`]: () => json({ data: [] }) });
    render('researcher');
    expect(await screen.findByText('1.23×')).toBeTruthy();
    const sources = screen.getByRole('complementary', { name: 'Settings and sources' });
    expect(within(sources).getByText('83.68 kJ/mol')).toBeTruthy();
    expect(within(sources).getByText(/20 °C, 50 % RH/)).toBeTruthy();
    expect(within(sources).getByText(/ISO 18920/)).toBeTruthy();
    // Researchers read; only conservators load files.
    expect(screen.queryByRole('button', { name: 'Load a logger file' })).toBeNull();
    expect(screen.getByText('No logger files loaded for this location.')).toBeTruthy();
  });

  it('maps, checks and shows the bad row named; nothing is accepted while a row is bad; then accepts with the mapping checked', async () => {
    let checks = 0;
    const { requests } = mockFetch({
      ...base,
      [`GET /api/locations/${LOCATION_ID}/climate-files`]: () => json({ data: [] }),
      [`POST /api/locations/${LOCATION_ID}/climate-files`]: () => json({ data: makeFile() }, 201),
      [`POST /api/climate-files/${FILE_ID}/check`]: (r) => {
        checks += 1;
        const mapping = (r.body as { mapping: object }).mapping;
        return checks === 1
          ? json({ data: makeFile({ status: 'checked', mapping: mapping as never, check: { goodRows: 1, badRows: 1, duplicates: 0, firstAt: '2026-01-10T00:00:00.000Z', lastAt: '2026-01-10T00:00:00.000Z', problems: [{ row: 3, column: 'RH %', message: 'RH must be between 0 and 100 %' }], preview: [{ takenAt: '2026-01-10T00:00:00.000Z', temperatureC: 17, rhPercent: 45 }] } }) })
          : json({ data: makeFile({ status: 'checked', mapping: mapping as never, check: { goodRows: 2, badRows: 0, duplicates: 1, firstAt: '2026-01-10T00:00:00.000Z', lastAt: '2026-01-10T01:00:00.000Z', problems: [], preview: [] } }) });
      },
      [`POST /api/climate-files/${FILE_ID}/accept`]: () => json({ data: makeFile({ status: 'accepted', acceptedRows: 1 }) }),
    });
    render();
    fireEvent.click(await screen.findByRole('button', { name: 'Load a logger file' }));
    const input = screen.getByLabelText(/Logger CSV/);
    fireEvent.change(input, { target: { files: [new File(['Time,Temp °C,RH %\n'], 'store-b.csv', { type: 'text/csv' })] } });

    // The mapping step: the suggestion from the header names, and the first rows.
    expect((await screen.findByLabelText<HTMLSelectElement>('Date and time column')).value).toBe('Time');
    expect(screen.getByLabelText<HTMLSelectElement>('RH column').value).toBe('RH %');
    expect(screen.getByText('104')).toBeTruthy();
    fireEvent.change(screen.getByLabelText('Time zone of the logger\'s clock'), { target: { value: 'Europe/London' } });
    fireEvent.click(screen.getByRole('button', { name: 'Check the file' }));

    const problems = await screen.findByRole('table', { name: /Rows that cannot be read/ });
    expect(within(problems).getByText('3')).toBeTruthy();
    expect(within(problems).getByText('RH must be between 0 and 100 %')).toBeTruthy();
    expect(screen.queryByRole('button', { name: /^Accept/ })).toBeNull();
    expect(requests.filter((r) => r.path.endsWith('/accept'))).toHaveLength(0);
    expect(requests.find((r) => r.path.endsWith('/check'))!.body).toEqual({
      mapping: { timestampColumn: 'Time', timeZone: 'Europe/London', dateOrder: 'auto', temperatureColumn: 'Temp °C', temperatureUnit: 'C', rhColumn: 'RH %' },
    });

    fireEvent.click(screen.getByRole('button', { name: 'Check the file' }));
    fireEvent.click(await screen.findByRole('button', { name: 'Accept 2 readings' }));
    expect(await screen.findByText(/1 new readings were written/)).toBeTruthy();
    const accept = requests.find((r) => r.path.endsWith('/accept'))!;
    expect((accept.body as { mapping: { timeZone: string } }).mapping.timeZone).toBe('Europe/London');
  });

  it('discards a file not accepted and goes back to the start', async () => {
    const { requests } = mockFetch({
      ...base,
      [`GET /api/locations/${LOCATION_ID}/climate-files`]: () => json({ data: [makeFile()] }),
      [`DELETE /api/climate-files/${FILE_ID}`]: () => new Response(null, { status: 204 }),
    });
    render();
    fireEvent.click(await screen.findByRole('button', { name: 'Continue' }));
    fireEvent.click(await screen.findByRole('button', { name: 'Discard this file' }));
    expect(await screen.findByRole('button', { name: 'Load a logger file' })).toBeTruthy();
    expect(requests.filter((r) => r.method === 'DELETE')).toHaveLength(1);
  });

  it('shows a refused upload in the error envelope’s words', async () => {
    mockFetch({
      ...base,
      [`GET /api/locations/${LOCATION_ID}/climate-files`]: () => json({ data: [] }),
      [`POST /api/locations/${LOCATION_ID}/climate-files`]: () => errorResponse(415, 'unsupported_media_type', 'The file is not UTF-8 text. Export the logger file as CSV in UTF-8.'),
    });
    render();
    fireEvent.click(await screen.findByRole('button', { name: 'Load a logger file' }));
    fireEvent.change(screen.getByLabelText(/Logger CSV/), { target: { files: [new File(['x'], 'x.csv')] } });
    await waitFor(() => expect(screen.getByText(/not UTF-8 text/)).toBeTruthy());
  });
});
