import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import type { ImportJob } from '@toneledger/common/schemas/catalogue';
import { json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { ImportPage } from '@/features/catalogue/routes/import-page';

const JOB_ID = '91111111-2222-4333-8444-555555555555';

function job(overrides: Partial<ImportJob>): ImportJob {
  return {
    id: JOB_ID, fileName: 'trust-prints.csv', status: 'validating', totalRows: 4, processedRows: 0, errorCount: 0, errors: [], newMakers: [],
    createdPrints: 0, message: null, createdAt: '2025-01-01T10:00:00.000Z', finishedAt: null, ...overrides,
  };
}

function chooseFile() {
  const input = screen.getByLabelText('CSV file');
  const file = new File(['accession_number,title\n2001.1.1,Pier\n'], 'trust-prints.csv', { type: 'text/csv' });
  fireEvent.change(input, { target: { files: [file] } });
}

describe('ImportPage', () => {
  it('uploads, shows progress while checking, previews new makers, then commits and links to the list', async () => {
    const states = [
      job({ status: 'validating', processedRows: 2 }),
      job({ status: 'ready', processedRows: 4, newMakers: ['Morwenna Pascoe'] }),
    ];
    let polls = 0;
    const { requests, fetchMock } = mockFetch({
      'POST /api/imports': () => json({ data: job({ status: 'validating' }) }, 202),
      [`GET /api/imports/${JOB_ID}`]: () => json({ data: states[Math.min(polls++, states.length - 1)] }),
      [`POST /api/imports/${JOB_ID}/commit`]: () => {
        states.push(job({ status: 'committing', processedRows: 1 }), job({ status: 'committed', processedRows: 4, createdPrints: 4 }));
        return json({ data: job({ status: 'committing', processedRows: 0 }) }, 202);
      },
    });
    const { router } = renderPage(<ImportPage />, { path: '/catalogue/import', me: makeMe('registrar') });

    chooseFile();
    fireEvent.click(screen.getByRole('button', { name: 'Import' }));
    await waitFor(() => expect(router.state.location.search).toBe(`?job=${JOB_ID}`));
    const upload = fetchMock.mock.calls.find(([, init]) => init?.method === 'POST')!;
    expect(upload[1]?.body).toBeInstanceOf(FormData);
    expect(((upload[1]?.body as FormData).get('file') as File).name).toBe('trust-prints.csv');

    const progress = await screen.findByRole('progressbar', { name: 'Checking trust-prints.csv…' });
    expect(progress).toBeTruthy();

    const ready = await screen.findByRole('region', { name: 'Ready to import' }, { timeout: 3000 });
    expect(within(ready).getByText('Morwenna Pascoe')).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Import' })).toBeNull();
    fireEvent.click(within(ready).getByRole('button', { name: 'Import 4 prints' }));

    expect(await screen.findByText('4 prints were added to the catalogue from trust-prints.csv.', {}, { timeout: 4000 })).toBeTruthy();
    expect(screen.getByRole('link', { name: 'See the prints, newest first' }).getAttribute('href')).toBe('/catalogue?sort=-updatedAt');
    expect(requests.filter((r) => r.path === `/api/imports/${JOB_ID}/commit`)).toHaveLength(1);
  }, 10_000);

  it('lists every problem of an invalid file and says nothing was written', async () => {
    mockFetch({
      [`GET /api/imports/${JOB_ID}`]: () =>
        json({
          data: job({
            status: 'invalid', processedRows: 4, errorCount: 2,
            errors: [
              { row: 3, column: 'date_made', value: '1968-13', message: 'month must be 01–12' },
              { row: 5, column: 'enclosure', value: 'Blue box', message: 'No enclosure with this name' },
            ],
          }),
        }),
    });
    renderPage(<ImportPage />, { path: `/catalogue/import?job=${JOB_ID}`, me: makeMe('admin') });
    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('Nothing was written to the catalogue.');
    const rows = screen.getAllByRole('row').slice(1).map((row) => within(row).getAllByRole('cell').map((c) => c.textContent));
    expect(rows).toEqual([
      ['3', 'date_made', '1968-13', 'month must be 01–12'],
      ['5', 'enclosure', 'Blue box', 'No enclosure with this name'],
    ]);
  });
});
