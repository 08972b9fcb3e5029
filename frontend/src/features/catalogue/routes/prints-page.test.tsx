import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { printListQuerySchema } from '@toneledger/common/schemas/catalogue';
import { json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { parseSearchQuery, writeSearchQuery } from '@/lib/search-query';
import { printsCsvHref } from '@/features/catalogue/api/exports';
import { PrintsPage } from '@/features/catalogue/routes/prints-page';
import { LOCATION_ID, MAKER_ID, makeListItem, referenceHandlers } from '@/features/catalogue/testing/fixtures';

function listHandlers(total = 1) {
  return {
    ...referenceHandlers(),
    'GET /api/prints': () => json({ data: [makeListItem()], pagination: { page: 1, pageSize: 50, total } }),
  };
}

const lastListRequest = (requests: { path: string; search: URLSearchParams }[]) =>
  Object.fromEntries([...requests].reverse().find((r) => r.path === '/api/prints')!.search);

describe('print list query ↔ URL', () => {
  it('reads every filter from the URL through the API schema, dropping only what it rejects', () => {
    const query = parseSearchQuery(
      printListQuerySchema,
      new URLSearchParams(`q=harbour&process=cyanotype&tonerClass=iron_blue&hasWarnings=true&madeFrom=1950&madeTo=1975&sort=-dateMade&page=2&makerId=${MAKER_ID}&status=lost&support=glass`),
    );
    expect(query).toEqual({
      page: 2, pageSize: 50, q: 'harbour', process: 'cyanotype', tonerClass: 'iron_blue', hasWarnings: 'true', madeFrom: 1950, madeTo: 1975,
      sort: '-dateMade', makerId: MAKER_ID, holding: 'collection',
    });
  });

  it('writes the query back without defaults', () => {
    const defaults = printListQuerySchema.parse({});
    const query = printListQuerySchema.parse({ status: 'on_loan', madeFrom: '1960' });
    expect(writeSearchQuery(query, defaults).toString()).toBe('status=on_loan&madeFrom=1960');
  });

  it('builds the CSV export address from the filters and sort, without paging', () => {
    const query = printListQuerySchema.parse({ page: '3', pageSize: '100', tonerClass: 'gold', sort: '-title' });
    expect(printsCsvHref(query)).toBe('/api/prints/export.csv?sort=-title&tonerClass=gold&holding=collection');
  });
});

describe('PrintsPage', () => {
  it('asks the API for exactly the query in the URL', async () => {
    const { requests } = mockFetch(listHandlers());
    renderPage(<PrintsPage />, {
      path: `/catalogue?q=harbour&tonerClass=iron_blue&hasWarnings=true&sort=-dateMade&page=2&locationId=${LOCATION_ID}&bogus=1`,
      me: makeMe('registrar'),
    });
    await screen.findByText('1987.14.3');
    expect(lastListRequest(requests)).toEqual({
      page: '2', pageSize: '50', q: 'harbour', tonerClass: 'iron_blue', hasWarnings: 'true', sort: '-dateMade', locationId: LOCATION_ID, holding: 'collection',
    });
    expect(screen.getByRole('link', { name: 'Export CSV' }).getAttribute('href')).toBe(
      `/api/prints/export.csv?q=harbour&sort=-dateMade&tonerClass=iron_blue&locationId=${LOCATION_ID}&hasWarnings=true&holding=collection`,
    );
    expect(screen.getByRole('link', { name: 'Export steps CSV' }).getAttribute('href')).toBe(
      `/api/prints/export-steps.csv?q=harbour&sort=-dateMade&tonerClass=iron_blue&locationId=${LOCATION_ID}&hasWarnings=true&holding=collection`,
    );
  });

  it('writes searches, filters and sorting to the URL, going back to page 1', async () => {
    const { requests } = mockFetch(listHandlers(300));
    const { router } = renderPage(<PrintsPage />, { path: '/catalogue?page=3', me: makeMe('registrar') });
    await screen.findByText('1987.14.3');

    fireEvent.change(screen.getByRole('searchbox', { name: 'Search the catalogue' }), { target: { value: '  harbour wall ' } });
    fireEvent.click(screen.getByRole('button', { name: 'Search' }));
    await waitFor(() => expect(router.state.location.search).toBe('?q=harbour+wall'));

    fireEvent.change(screen.getByRole('combobox', { name: 'Process' }), { target: { value: 'cyanotype' } });
    await waitFor(() => expect(router.state.location.search).toBe('?q=harbour+wall&process=cyanotype'));

    fireEvent.click(screen.getByRole('button', { name: /Date made/ }));
    await waitFor(() => expect(lastListRequest(requests)).toMatchObject({ q: 'harbour wall', process: 'cyanotype', sort: 'dateMade', page: '1' }));
    expect(screen.getByRole('columnheader', { name: /Date made/ }).getAttribute('aria-sort')).toBe('ascending');
  });

  it('shows borrowed prints only when asked, and back to the collection on "The collection"', async () => {
    const { requests } = mockFetch(listHandlers());
    const { router } = renderPage(<PrintsPage />, { path: '/catalogue', me: makeMe('registrar') });
    await screen.findByText('1987.14.3');
    expect(lastListRequest(requests)).toMatchObject({ holding: 'collection' });

    fireEvent.change(screen.getByRole('combobox', { name: 'Holding' }), { target: { value: 'borrowed' } });
    await waitFor(() => expect(router.state.location.search).toBe('?holding=borrowed'));
    await waitFor(() => expect(lastListRequest(requests)).toMatchObject({ holding: 'borrowed' }));

    fireEvent.change(screen.getByRole('combobox', { name: 'Holding' }), { target: { value: '' } });
    await waitFor(() => expect(router.state.location.search).toBe(''));
    // The same query as the first page: the list shown is the collection's again (from the query cache).
    expect((screen.getByRole('combobox', { name: 'Holding' }) as HTMLSelectElement).value).toBe('');
    expect(parseSearchQuery(printListQuerySchema, new URLSearchParams(router.state.location.search)).holding).toBe('collection');
  });

  it('refuses a year outside the allowed range without changing the URL', async () => {
    mockFetch(listHandlers());
    const { router } = renderPage(<PrintsPage />, { path: '/catalogue', me: makeMe('registrar') });
    await screen.findByText('1987.14.3');
    fireEvent.change(screen.getByLabelText('Made from (year)'), { target: { value: '1700' } });
    fireEvent.click(screen.getByRole('button', { name: 'Search' }));
    expect(await screen.findByText('A year from 1800 to 2200')).toBeTruthy();
    expect(router.state.location.search).toBe('');
  });

  it('labels the warnings of each row for screen readers', async () => {
    mockFetch(listHandlers());
    renderPage(<PrintsPage />, { path: '/catalogue', me: makeMe('viewer') });
    const row = (await screen.findByText('1987.14.3')).closest('tr')!;
    expect(within(row).getByRole('img', { name: '1 warning: Iron blue in an alkaline-buffered enclosure' })).toBeTruthy();
  });

  it('gives a viewer no location filter or column, no New print, and never sends a location filter', async () => {
    const { requests } = mockFetch(listHandlers());
    renderPage(<PrintsPage />, { path: `/catalogue?locationId=${LOCATION_ID}`, me: makeMe('viewer') });
    await screen.findByText('1987.14.3');
    expect(lastListRequest(requests).locationId).toBeUndefined();
    expect(screen.queryByRole('combobox', { name: /Location/ })).toBeNull();
    expect(screen.queryByRole('columnheader', { name: 'Location' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'New print' })).toBeNull();
    expect(requests.some((r) => r.path === '/api/locations')).toBe(false);
  });

  it('offers New print to a registrar and remembers hidden columns', async () => {
    mockFetch(listHandlers());
    localStorage.removeItem('toneledger.catalogue.prints.columns');
    const first = renderPage(<PrintsPage />, { path: '/catalogue', me: makeMe('registrar') });
    await screen.findByText('1987.14.3');
    expect(screen.getByRole('button', { name: 'New print' })).toBeTruthy();
    expect(screen.getByRole('columnheader', { name: /Maker/ })).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Columns' }));
    fireEvent.click(screen.getByRole('checkbox', { name: 'Maker' }));
    expect(screen.queryByRole('columnheader', { name: /Maker/ })).toBeNull();
    first.unmount();

    renderPage(<PrintsPage />, { path: '/catalogue', me: makeMe('registrar') });
    await screen.findByText('1987.14.3');
    expect(screen.queryByRole('columnheader', { name: /Maker/ })).toBeNull();
    localStorage.removeItem('toneledger.catalogue.prints.columns');
  });
});

describe('PrintsPage selection', () => {
  const ids = ['11111111-1111-4111-8111-000000000001', '11111111-1111-4111-8111-000000000002', '11111111-1111-4111-8111-000000000003', '11111111-1111-4111-8111-000000000004'];
  const rows = ids.map((id, i) => makeListItem({ id, accessionNumber: `1987.14.${i + 1}`, title: `Quay ${i + 1}` }));
  function setup(total = 4) {
    return mockFetch({
      ...referenceHandlers(),
      'GET /api/prints': () => json({ data: rows, pagination: { page: 1, pageSize: 50, total } }),
      'GET /api/saved-searches': () => json({ data: [] }),
      'POST /api/prints-bulk/export.csv': () => new Response('accession_number\n', { headers: { 'content-type': 'text/csv', 'content-disposition': 'attachment; filename="prints-selection.csv"' } }),
    });
  }

  it('shift-click ticks a range of rows, and the export sends exactly those ids', async () => {
    URL.createObjectURL = () => 'blob:x';
    URL.revokeObjectURL = () => {};
    const { requests } = setup();
    renderPage(<PrintsPage />, { path: '/catalogue/prints', me: makeMe('registrar') });
    const first = await screen.findByRole('checkbox', { name: 'Select 1987.14.1' });
    fireEvent.click(first);
    fireEvent.click(screen.getByRole('checkbox', { name: 'Select 1987.14.3' }), { shiftKey: true });
    expect(await screen.findByText('3 selected.')).toBeTruthy();
    for (const n of [1, 2, 3]) expect((screen.getByRole('checkbox', { name: `Select 1987.14.${n}` }) as HTMLInputElement).checked).toBe(true);
    expect((screen.getByRole('checkbox', { name: 'Select 1987.14.4' }) as HTMLInputElement).checked).toBe(false);
    fireEvent.click(within(screen.getByRole('region', { name: 'Selected prints' })).getByRole('button', { name: 'Export CSV' }));
    await waitFor(() => expect(requests.find((r) => r.path === '/api/prints-bulk/export.csv')).toBeTruthy());
    expect(requests.find((r) => r.path === '/api/prints-bulk/export.csv')!.body).toEqual({ selection: { kind: 'ids', ids: ids.slice(0, 3) } });
  });

  it('"select all N matching" makes the selection the search, sent as filters, not ids', async () => {
    URL.createObjectURL = () => 'blob:x';
    URL.revokeObjectURL = () => {};
    const { requests } = setup(48_210);
    renderPage(<PrintsPage />, { path: '/catalogue/prints?tonerClass=iron_blue&page=2', me: makeMe('registrar') });
    fireEvent.click(await screen.findByRole('checkbox', { name: 'Select every print on this page' }));
    fireEvent.click(await screen.findByRole('button', { name: 'Select all 48,210 matching' }));
    expect(await screen.findByText('All 48,210 prints matching this search are selected.')).toBeTruthy();
    fireEvent.click(within(screen.getByRole('region', { name: 'Selected prints' })).getByRole('button', { name: 'Export CSV' }));
    await waitFor(() => expect(requests.find((r) => r.path === '/api/prints-bulk/export.csv')).toBeTruthy());
    expect(requests.find((r) => r.path === '/api/prints-bulk/export.csv')!.body).toEqual({ selection: { kind: 'query', query: { tonerClass: 'iron_blue', holding: 'collection' } } });
  });

  it('offers only the actions the role may take: a conservator moves and rehouses, but does not change status', async () => {
    setup();
    renderPage(<PrintsPage />, { path: '/catalogue/prints', me: makeMe('conservator') });
    fireEvent.click(await screen.findByRole('checkbox', { name: 'Select 1987.14.2' }));
    const bar = await screen.findByRole('region', { name: 'Selected prints' });
    expect(within(bar).getByRole('button', { name: 'Move…' })).toBeTruthy();
    expect(within(bar).getByRole('button', { name: 'Rehouse…' })).toBeTruthy();
    expect(within(bar).queryByRole('button', { name: 'Change status…' })).toBeNull();
    expect(within(bar).getByRole('button', { name: 'Add to round…' })).toBeTruthy();
    expect(within(bar).queryByRole('button', { name: 'Add to exhibition…' })).toBeNull();
  });
});
