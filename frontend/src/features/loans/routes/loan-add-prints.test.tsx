import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';
import { LoanPage } from '@/features/loans/routes/loan-page';
import { LOAN_ID, makeLoan } from '@/features/loans/testing/fixtures';

const FOUND_ID = '4f0e2d3c-4b5a-4968-8776-a5b4c3d2e1f3';
const found = {
  id: FOUND_ID, accessionNumber: '1990.2.8', title: 'Weir in winter', makerName: 'Wenna Trask', dateMade: '1968', dateDisplay: '1968',
  process: 'gelatin_silver_developing_out', support: 'fibre_baryta', status: 'in_store', tonerClasses: ['selenium'], paperLabel: null,
  enclosureName: null, warningCodes: [], updatedAt: '2024-06-01T10:00:00.000Z', locationLabel: 'Store A › Cabinet 2', borrowed: false,
};

function renderLoan(handlers: Parameters<typeof mockFetch>[0]) {
  const loan = makeLoan({ status: 'proposed', blockers: [] });
  const fetch = mockFetch({
    [`GET /api/loans/${LOAN_ID}`]: () => json({ data: loan }),
    'GET /api/prints': () => json({ data: [found], pagination: { page: 1, pageSize: 10, total: 1 } }),
    ...handlers,
  });
  const view = renderRoutes([{ path: '/loans/:id', element: <LoanPage /> }], { path: `/loans/${LOAN_ID}`, me: makeMe('registrar') });
  return { ...fetch, ...view };
}

async function choose() {
  fireEvent.click(await screen.findByRole('button', { name: 'Add prints' }));
  const section = screen.getByRole('region', { name: 'Add prints to the loan' });
  fireEvent.change(within(section).getByLabelText('Accession number or title'), { target: { value: '1990.2' } });
  fireEvent.click(within(section).getByRole('button', { name: 'Find' }));
  fireEvent.click(await within(section).findByRole('button', { name: 'Choose 1990.2.8' }));
  return section;
}

describe('adding prints to a loan', () => {
  it('finds a print in the catalogue and adds it with its value and currency', async () => {
    const { requests } = renderLoan({ [`PUT /api/loans/${LOAN_ID}/objects`]: () => json({ data: makeLoan({ status: 'proposed', version: 4 }) }) });
    const section = await choose();
    expect(requests.find((r) => r.path === '/api/prints')?.search.get('q')).toBe('1990.2');
    const form = within(section).getByRole('form', { name: 'Prints to add' });
    fireEvent.change(within(form).getByLabelText('Insurance value'), { target: { value: '2500' } });
    fireEvent.change(within(form).getByLabelText('Currency'), { target: { value: 'EUR' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Add to the loan' }));
    await waitFor(() => expect(requests.some((r) => r.method === 'PUT')).toBe(true));
    expect(requests.find((r) => r.method === 'PUT')?.body).toEqual({ version: 3, objects: [{ printId: FOUND_ID, insuranceValue: 2500, currency: 'EUR' }] });
  });

  it('asks for the currency of a value before sending (the contract’s rule)', async () => {
    const { requests } = renderLoan({});
    const section = await choose();
    const form = within(section).getByRole('form', { name: 'Prints to add' });
    fireEvent.change(within(form).getByLabelText('Insurance value'), { target: { value: '2500' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Add to the loan' }));
    await waitFor(() => expect(within(form).getAllByText('Give the currency of the value').length).toBeGreaterThan(0));
    expect(requests.some((r) => r.method === 'PUT')).toBe(false);
  });

  it('shows a 409 (the print is on another loan at the same time) and keeps the chosen print', async () => {
    renderLoan({ [`PUT /api/loans/${LOAN_ID}/objects`]: () => errorResponse(409, 'conflict', '1990.2.8 is on loan CR-L-2026-001 over the same dates.') });
    const section = await choose();
    const form = within(section).getByRole('form', { name: 'Prints to add' });
    fireEvent.click(within(form).getByRole('button', { name: 'Add to the loan' }));
    expect((await within(form).findByRole('alert')).textContent).toContain('1990.2.8 is on loan CR-L-2026-001 over the same dates.');
    expect(within(form).getByText('1990.2.8')).toBeTruthy();
  });
});
