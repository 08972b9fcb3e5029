import { describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';
import { LoanPage, printer } from '@/features/loans/routes/loan-page';
import { LOAN_ID, makeLoan } from '@/features/loans/testing/fixtures';

describe('a loan in', () => {
  it('records a borrowed print under the lender’s number and puts it on the loan', async () => {
    const loan = makeLoan({ direction: 'in', status: 'approved', blockers: [], objects: [], objectCount: 0, otherInstitution: 'Fenwick Hall Collection' });
    const { requests } = mockFetch({
      [`GET /api/loans/${LOAN_ID}`]: () => json({ data: loan }),
      [`POST /api/loans/${LOAN_ID}/borrowed-prints`]: () => json({ error: { code: 'internal_error', message: 'stop here', status: 500, requestId: 'r' } }, 500),
    });
    renderRoutes([{ path: '/loans/:id', element: <LoanPage /> }], { path: `/loans/${LOAN_ID}`, me: makeMe('registrar') });
    fireEvent.click(await screen.findByRole('button', { name: 'Record a borrowed print' }));
    const form = screen.getByRole('form', { name: 'Record a borrowed print' });
    fireEvent.click(within(form).getByRole('button', { name: 'Record and add to the loan' }));
    // Nothing is sent until the print has a process (printInputSchema).
    await waitFor(() => expect(within(form).getAllByText('Choose one of the listed values').length).toBeGreaterThan(0));
    expect(requests.some((r) => r.method === 'POST')).toBe(false);

    fireEvent.change(within(form).getByLabelText("Lender's number"), { target: { value: 'FH 77/12' } });
    fireEvent.change(within(form).getByLabelText('Title'), { target: { value: 'Cyanotype of sea holly' } });
    fireEvent.change(within(form).getByLabelText('Process'), { target: { value: 'cyanotype' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Record and add to the loan' }));
    await waitFor(() => expect(requests.some((r) => r.method === 'POST')).toBe(true));
    expect(requests.find((r) => r.method === 'POST')?.body).toMatchObject({
      version: 3,
      print: { accessionNumber: 'FH 77/12', title: 'Cyanotype of sea holly', process: 'cyanotype' },
    });
    // A failure keeps what was typed.
    expect(await within(form).findByText('stop here')).toBeTruthy();
    expect((within(form).getByLabelText('Title') as HTMLInputElement).value).toBe('Cyanotype of sea holly');
  });

  it('offers no borrowed-print form on a loan out, and prints the page on request', async () => {
    const print = vi.spyOn(printer, 'print').mockImplementation(() => {});
    mockFetch({ [`GET /api/loans/${LOAN_ID}`]: () => json({ data: makeLoan({ status: 'proposed' }) }) });
    renderRoutes([{ path: '/loans/:id', element: <LoanPage /> }], { path: `/loans/${LOAN_ID}`, me: makeMe('registrar') });
    expect(await screen.findByRole('button', { name: 'Add prints' })).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Record a borrowed print' })).toBeNull();
    expect(screen.getByRole('link', { name: 'Checklist (CSV)' }).getAttribute('href')).toBe(`/api/loans/${LOAN_ID}/checklist.csv`);
    fireEvent.click(screen.getByRole('button', { name: 'Print' }));
    expect(print).toHaveBeenCalledOnce();
  });
});
