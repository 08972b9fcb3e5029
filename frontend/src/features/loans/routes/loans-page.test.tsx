import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import { json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { LoansPage } from '@/features/loans/routes/loans-page';
import { makeLoan } from '@/features/loans/testing/fixtures';

const { objects: _o, statusHistory: _h, blockers: _b, ...listed } = makeLoan();
const page = (total = 1) => json({ data: [listed], pagination: { page: 1, pageSize: 50, total } });

describe('LoansPage', () => {
  it('asks the API for exactly the filters in the URL', async () => {
    const { requests } = mockFetch({ 'GET /api/loans': () => page() });
    renderPage(<LoansPage />, { path: '/loans?direction=in&status=on_loan&open=true&q=harrow&bogus=1', me: makeMe('viewer') });
    await screen.findByText('CR-L-2026-004');
    expect(Object.fromEntries(requests[0]!.search)).toEqual({ page: '1', pageSize: '50', direction: 'in', status: 'on_loan', open: 'true', q: 'harrow' });
  });

  it('puts a filter in the URL and goes back to page 1', async () => {
    const { requests } = mockFetch({ 'GET /api/loans': () => page(120) });
    const { router } = renderPage(<LoansPage />, { path: '/loans?page=2', me: makeMe('registrar') });
    await screen.findByText('CR-L-2026-004');
    fireEvent.change(screen.getByRole('combobox', { name: 'Status' }), { target: { value: 'agreed' } });
    await waitFor(() => expect(router.state.location.search).toBe('?status=agreed'));
    await waitFor(() => expect(requests.at(-1)?.search.get('status')).toBe('agreed'));
    expect(requests.at(-1)?.search.get('page')).toBe('1');
    fireEvent.change(screen.getByRole('combobox', { name: 'Open or ended' }), { target: { value: 'true' } });
    await waitFor(() => expect(router.state.location.search).toBe('?status=agreed&open=true'));
  });

  it('links each loan to its page and offers New loan only to those who manage loans', async () => {
    mockFetch({ 'GET /api/loans': () => page() });
    renderPage(<LoansPage />, { path: '/loans', me: makeMe('conservator') });
    expect((await screen.findByRole('link', { name: 'CR-L-2026-004' })).getAttribute('href')).toBe(`/loans/${listed.id}`);
    expect(screen.queryByRole('link', { name: 'New loan' })).toBeNull();
  });
});
