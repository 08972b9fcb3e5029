import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';
import { LoanCreatePage, LoanEditPage } from '@/features/loans/routes/loan-form-pages';
import { LOAN_ID, makeLoan } from '@/features/loans/testing/fixtures';

const noExhibitions = () => json({ data: [], pagination: { page: 1, pageSize: 200, total: 0 } });

function renderCreate(handlers: Parameters<typeof mockFetch>[0]) {
  const fetch = mockFetch({ 'GET /api/exhibitions': noExhibitions, ...handlers });
  const view = renderRoutes(
    [
      { path: '/loans/new', element: <LoanCreatePage /> },
      { path: '/loans/:id', element: <p>loan page</p> },
    ],
    { path: '/loans/new', me: makeMe('registrar') },
  );
  return { ...fetch, ...view };
}

describe('new loan', () => {
  it('sends the loan with its conditions as numbers and opens it', async () => {
    const { requests, router } = renderCreate({ 'POST /api/loans': () => json({ data: makeLoan({ status: 'proposed' }) }, 201) });
    const form = await screen.findByRole('form', { name: 'New loan' });
    fireEvent.change(within(form).getByLabelText('Agreement reference'), { target: { value: 'CR-L-2026-004' } });
    fireEvent.change(within(form).getByLabelText('Other institution'), { target: { value: 'Harrowgate Gallery of Photography' } });
    fireEvent.change(within(form).getByLabelText('Maximum illuminance (lux)'), { target: { value: '50' } });
    fireEvent.click(within(form).getByLabelText('No alkaline-buffered mounts or enclosures'));
    fireEvent.click(within(form).getByRole('button', { name: 'Propose the loan' }));
    await waitFor(() => expect(router.state.location.pathname).toBe(`/loans/${LOAN_ID}`));
    const body = requests.find((r) => r.method === 'POST')?.body as Record<string, unknown>;
    expect(body).toMatchObject({ direction: 'out', reference: 'CR-L-2026-004', otherInstitution: 'Harrowgate Gallery of Photography', purpose: 'exhibition' });
    expect(body.conditions).toMatchObject({ maxLux: 50, maxAnnualLuxHours: null, noAlkalineBufferedMounts: true });
  });

  it('refuses a return before the dispatch in the form, with the contract’s message', async () => {
    const { requests } = renderCreate({});
    const form = await screen.findByRole('form', { name: 'New loan' });
    fireEvent.change(within(form).getByLabelText('Agreement reference'), { target: { value: 'CR-L-2026-005' } });
    fireEvent.change(within(form).getByLabelText('Other institution'), { target: { value: 'Harrowgate Gallery of Photography' } });
    fireEvent.change(within(form).getByLabelText('Dispatch'), { target: { value: '2026-03-02' } });
    fireEvent.change(within(form).getByLabelText('Return'), { target: { value: '2026-02-01' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Propose the loan' }));
    // loanDateIssues in common/src/schemas/loans.ts: the return compares with the latest earlier date given.
    await waitFor(() => expect(within(form).getAllByText('The return date is on or after the dispatch date').length).toBeGreaterThan(0));
    expect(requests.every((r) => r.method === 'GET')).toBe(true);
  });

  it('puts the server’s field errors under their fields, nested ones too, and keeps what was typed', async () => {
    renderCreate({
      'POST /api/loans': () =>
        errorResponse(400, 'validation_failed', 'Check the highlighted fields.', {
          details: [
            { path: 'reference', message: 'The reference CR-L-2026-004 is already used by another loan', code: 'custom' },
            { path: 'conditions.rhMaxPercent', message: 'The highest RH is at least the lowest', code: 'custom' },
          ],
        }),
    });
    const form = await screen.findByRole('form', { name: 'New loan' });
    fireEvent.change(within(form).getByLabelText('Agreement reference'), { target: { value: 'CR-L-2026-004' } });
    fireEvent.change(within(form).getByLabelText('Other institution'), { target: { value: 'Harrowgate Gallery of Photography' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Propose the loan' }));
    const reference = within(form).getByLabelText('Agreement reference');
    await waitFor(() => expect(reference.getAttribute('aria-invalid')).toBe('true'));
    expect(document.getElementById(reference.getAttribute('aria-describedby')!)?.textContent).toBe('The reference CR-L-2026-004 is already used by another loan');
    const rh = within(form).getByLabelText('Highest RH (%)');
    expect(document.getElementById(rh.getAttribute('aria-describedby')!)?.textContent).toBe('The highest RH is at least the lowest');
    expect((reference as HTMLInputElement).value).toBe('CR-L-2026-004');
  });
});

describe('edit loan', () => {
  it('sends only the changed fields with the version it opened', async () => {
    const loan = makeLoan();
    const { requests, router } = (() => {
      const fetch = mockFetch({
        'GET /api/exhibitions': noExhibitions,
        [`GET /api/loans/${LOAN_ID}`]: () => json({ data: loan }),
        [`PATCH /api/loans/${LOAN_ID}`]: () => json({ data: { ...loan, courier: 'Fine-art shipper', version: 4 } }),
      });
      const view = renderRoutes(
        [
          { path: '/loans/:id/edit', element: <LoanEditPage /> },
          { path: '/loans/:id', element: <p>loan page</p> },
        ],
        { path: `/loans/${LOAN_ID}/edit`, me: makeMe('registrar') },
      );
      return { ...fetch, ...view };
    })();
    const form = await screen.findByRole('form', { name: 'Edit loan' });
    fireEvent.change(within(form).getByLabelText('Courier'), { target: { value: 'Fine-art shipper' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Save the loan' }));
    await waitFor(() => expect(router.state.location.pathname).toBe(`/loans/${LOAN_ID}`));
    expect(requests.find((r) => r.method === 'PATCH')?.body).toEqual({ version: 3, courier: 'Fine-art shipper' });
  });
});
