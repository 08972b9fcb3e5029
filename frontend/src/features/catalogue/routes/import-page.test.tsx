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
    id: JOB_ID, fileName: 'trust-prints.csv', stepsFileName: null, status: 'validating', totalRows: 4, processedRows: 0, stepRows: 0,
    errorCount: 0, errors: [], newMakers: [], toCreate: 0, toUpdate: 0, unchanged: 0, ignoredColumns: [], mode: null,
    createdPrints: 0, updatedPrints: 0, message: null, createdAt: '2025-01-01T10:00:00.000Z', finishedAt: null, ...overrides,
  };
}

const rowsPage = (data: unknown[]) => () => json({ data, pagination: { page: 1, pageSize: 50, total: data.length } });

function chooseFile() {
  const input = screen.getByLabelText('Prints (CSV)');
  const file = new File(['accession_number,title\n2001.1.1,Pier\n'], 'trust-prints.csv', { type: 'text/csv' });
  fireEvent.change(input, { target: { files: [file] } });
}

describe('ImportPage', () => {
  it('uploads, shows progress while checking, previews new makers, then commits and links to the list', async () => {
    const states = [
      job({ status: 'validating', processedRows: 2 }),
      job({ status: 'ready', processedRows: 4, newMakers: ['Morwenna Pascoe'], toCreate: 4 }),
    ];
    let polls = 0;
    const { requests, fetchMock } = mockFetch({
      'POST /api/imports': () => json({ data: job({ status: 'validating' }) }, 202),
      [`GET /api/imports/${JOB_ID}`]: () => json({ data: states[Math.min(polls++, states.length - 1)] }),
      [`GET /api/imports/${JOB_ID}/rows`]: rowsPage([{ row: 2, accessionNumber: '2001.1.1', action: 'create', changes: [] }]),
      [`POST /api/imports/${JOB_ID}/commit`]: () => {
        states.push(job({ status: 'committing', processedRows: 1 }), job({ status: 'committed', processedRows: 4, createdPrints: 4 }));
        return json({ data: job({ status: 'committing', processedRows: 0 }) }, 202);
      },
    });
    const { router } = renderPage(<ImportPage />, { path: '/catalogue/import', me: makeMe('registrar') });

    chooseFile();
    fireEvent.click(screen.getByRole('button', { name: 'Check the files' }));
    await waitFor(() => expect(router.state.location.search).toBe(`?job=${JOB_ID}`));
    const upload = fetchMock.mock.calls.find(([, init]) => init?.method === 'POST')!;
    expect(upload[1]?.body).toBeInstanceOf(FormData);
    expect(((upload[1]?.body as FormData).get('file') as File).name).toBe('trust-prints.csv');

    const progress = await screen.findByRole('progressbar', { name: 'Checking trust-prints.csv…' });
    expect(progress).toBeTruthy();

    const ready = await screen.findByRole('region', { name: 'Ready to import' }, { timeout: 3000 });
    expect(within(ready).getByText('Morwenna Pascoe')).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Check the files' })).toBeNull();
    expect(within(ready).getByRole('radio', { name: /Create only/ })).toHaveProperty('checked', true);
    fireEvent.click(within(ready).getByRole('button', { name: 'Import 4 prints' }));

    expect(await screen.findByText('4 prints were added to the catalogue from trust-prints.csv.', {}, { timeout: 4000 })).toBeTruthy();
    expect(screen.getByRole('link', { name: 'See the prints, newest first' }).getAttribute('href')).toBe('/catalogue?sort=-updatedAt');
    const commits = requests.filter((r) => r.path === `/api/imports/${JOB_ID}/commit`);
    expect(commits.map((r) => r.body)).toEqual([{ mode: 'create_only' }]);
  }, 10_000);

  it('lists every problem of an invalid file and says nothing was written', async () => {
    mockFetch({
      [`GET /api/imports/${JOB_ID}`]: () =>
        json({
          data: job({
            status: 'invalid', processedRows: 4, errorCount: 2,
            errors: [
              { file: 'prints', row: 3, column: 'date_made', value: '1968-13', message: 'month must be 01–12' },
              { file: 'prints', row: 5, column: 'enclosure', value: 'Blue box', message: 'No enclosure with this name' },
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

  it('shows the rows that update prints with their changes, and asks for "create or update" before writing them', async () => {
    const ready = job({ status: 'ready', processedRows: 3, totalRows: 3, toCreate: 1, toUpdate: 1, unchanged: 1, ignoredColumns: ['warnings', 'id'] });
    const { requests } = mockFetch({
      [`GET /api/imports/${JOB_ID}`]: () => json({ data: ready }),
      [`GET /api/imports/${JOB_ID}/rows`]: (request) =>
        request.search.get('action') === 'update'
          ? rowsPage([{ row: 3, accessionNumber: '1987.14.3', action: 'update', changes: [{ field: 'title', label: 'Title', before: 'Pier', after: 'Pier at dusk' }] }])()
          : rowsPage([
              { row: 2, accessionNumber: '2001.1.1', action: 'create', changes: [] },
              { row: 3, accessionNumber: '1987.14.3', action: 'update', changes: [{ field: 'title', label: 'Title', before: 'Pier', after: 'Pier at dusk' }, { field: 'credit_line', label: 'Credit line', before: 'Gift', after: '' }] },
              { row: 4, accessionNumber: '1987.14.4', action: 'unchanged', changes: [] },
            ])(),
      [`POST /api/imports/${JOB_ID}/commit`]: () => json({ data: job({ status: 'committing' }) }, 202),
    });
    renderPage(<ImportPage />, { path: `/catalogue/import?job=${JOB_ID}`, me: makeMe('registrar') });
    const region = await screen.findByRole('region', { name: 'Ready to import' });
    expect(region.textContent).toContain('Read but not imported (computed, or kept by Toneledger): warnings, id.');
    const table = await within(region).findByRole('table');
    const rows = within(table).getAllByRole('row').slice(1).map((row) => within(row).getAllByRole('cell').map((c) => c.textContent));
    expect(rows).toEqual([
      ['2', '2001.1.1', 'New print', 'Created from the row'],
      ['3', '1987.14.3', 'Update', 'Title: Pier → Pier at duskCredit line: Gift → empty'],
      ['4', '1987.14.4', 'No change', 'Every field already matches'],
    ]);

    // Nothing is chosen for rows that match prints; create only refuses them.
    const go = () => within(region).getByRole('button', { name: /^(Import|Create) / });
    expect(go()).toHaveProperty('disabled', true);
    fireEvent.click(within(region).getByRole('radio', { name: /Create only/ }));
    expect(within(region).getByText('Choose “Create or update” to continue.')).toBeTruthy();
    expect(go()).toHaveProperty('disabled', true);
    fireEvent.click(within(region).getByRole('radio', { name: /Create or update/ }));
    expect(go().textContent).toBe('Create 1 print and update 1');

    fireEvent.click(within(region).getByRole('button', { name: /Updates/ }));
    await waitFor(() => expect(within(region).getAllByRole('row')).toHaveLength(2));
    expect(requests.some((r) => r.path.endsWith('/rows') && r.search.get('action') === 'update')).toBe(true);

    fireEvent.click(go());
    await waitFor(() => expect(requests.filter((r) => r.method === 'POST').map((r) => r.body)).toEqual([{ mode: 'create_or_update' }]));
  });

  it('names the file of each problem when a steps file came too', async () => {
    mockFetch({
      [`GET /api/imports/${JOB_ID}`]: () =>
        json({
          data: job({
            status: 'invalid', stepsFileName: 'trust-steps.csv', errorCount: 1,
            errors: [{ file: 'steps', row: 7, column: 'toner_class', value: null, message: 'A toning step needs its toner class' }],
          }),
        }),
    });
    renderPage(<ImportPage />, { path: `/catalogue/import?job=${JOB_ID}`, me: makeMe('registrar') });
    await screen.findByRole('alert');
    const cells = within(screen.getAllByRole('row')[1]).getAllByRole('cell').map((c) => c.textContent);
    expect(cells).toEqual(['trust-steps.csv', '7', 'toner_class', 'empty', 'A toning step needs its toner class']);
  });
});
