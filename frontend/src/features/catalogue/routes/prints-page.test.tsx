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
