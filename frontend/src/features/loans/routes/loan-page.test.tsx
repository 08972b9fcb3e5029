import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { LOAN_NEXT } from '@toneledger/common/schemas/loans';
import type { Role } from '@toneledger/common/domain/roles';
import type { LoanDetail } from '@toneledger/common/schemas/loans';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';
import { LoanPage } from '@/features/loans/routes/loan-page';
import { LOAN_ID, PRINT_B, makeLoan, withoutValues } from '@/features/loans/testing/fixtures';

type Handlers = Parameters<typeof mockFetch>[0];

function renderLoan(loan: LoanDetail, role: Role, handlers: Handlers = {}) {
  const fetch = mockFetch({ [`GET /api/loans/${LOAN_ID}`]: () => json({ data: loan }), ...handlers });
  const view = renderRoutes([{ path: '/loans/:id', element: <LoanPage /> }], { path: `/loans/${LOAN_ID}`, me: makeMe(role) });
  return { ...fetch, ...view };
}

async function objectsTable() {
  return screen.findByRole('table', { name: /Prints on loan/ });
}

describe('loan page: values', () => {
  it('shows a registrar each print’s value with its currency', async () => {
    renderLoan(makeLoan(), 'registrar');
    const table = await objectsTable();
    expect(within(table).getByRole('columnheader', { name: 'Value' })).toBeTruthy();
    // en-GB currency formatting of 4200 GBP [memory: Intl.NumberFormat en-GB style currency]
    expect(within(table).getByText('£4,200.00')).toBeTruthy();
  });

  it.each<Role>(['conservator', 'viewer'])('shows a %s no value column, even if a value were sent', async (role) => {
    // The server leaves values out for these roles; the page must not show one even when it arrives.
    renderLoan(makeLoan(), role);
    const table = await objectsTable();
    expect(within(table).queryByRole('columnheader', { name: 'Value' })).toBeNull();
    expect(screen.queryByText(/4,200/)).toBeNull();
    expect(screen.queryByText(/1,800/)).toBeNull();
  });

  it('reads a loan without values (as the server answers a viewer)', async () => {
    renderLoan(withoutValues(makeLoan()), 'viewer');
    const table = await objectsTable();
    expect(within(table).getByText('1979.3.12').closest('a')?.getAttribute('href')).toBe(`/catalogue/prints/${makeLoan().objects[0]!.printId}`);
  });
});

describe('loan page: reports and blockers', () => {
  it('links a signed report and offers a conservator the missing outgoing report with context and loan', async () => {
    renderLoan(makeLoan(), 'conservator');
    const table = await objectsTable();
    expect(within(table).getByRole('link', { name: /Signed/ }).getAttribute('href')).toMatch(/^\/condition\/reports\//);
    const write = within(table).getAllByRole('link', { name: 'Write the outgoing report' });
    expect(write).toHaveLength(1);
    expect(write[0]!.getAttribute('href')).toBe(`/condition/prints/${PRINT_B}/reports/new?context=outgoing_loan&loanId=${LOAN_ID}`);
    expect(screen.getByText(/1 print has no signed outgoing condition report/)).toBeTruthy();
    // Nothing has left yet: no report for the way back is asked for.
    expect(within(table).queryByRole('link', { name: 'Write the returning report' })).toBeNull();
  });

  it('offers the returning report only while the prints are at the borrower', async () => {
    renderLoan(makeLoan({ status: 'on_loan', blockers: [] }), 'conservator');
    const table = await objectsTable();
    const back = within(table).getAllByRole('link', { name: 'Write the returning report' });
    expect(back.length).toBeGreaterThan(0);
    expect(back[0]!.getAttribute('href')).toMatch(/\?context=returning_loan&loanId=/);
  });

  it('offers a registrar no report-writing link', async () => {
    renderLoan(makeLoan(), 'registrar');
    await objectsTable();
    expect(screen.queryByRole('link', { name: /Write the/ })).toBeNull();
  });
});

describe('loan page: status', () => {
  it.each(['proposed', 'approved', 'agreed', 'in_transit', 'on_loan'] as const)(
    'offers a registrar only the next states of a %s loan',
    async (status) => {
      renderLoan(makeLoan({ status }), 'registrar');
      const group = await screen.findByRole('region', { name: 'Move the loan' });
      const names = within(group).getAllByRole('button').map((b) => b.textContent);
      const expected: Record<string, string[]> = {
        proposed: ['Approve', 'Decline', 'Cancel the loan'],
        approved: ['Mark agreed', 'Decline', 'Cancel the loan'],
        agreed: ['Dispatch (in transit)', 'Cancel the loan'],
        in_transit: ['Mark on loan'],
        on_loan: ['Mark returned'],
      };
      expect(names).toEqual(expected[status]);
      expect(names).toHaveLength(LOAN_NEXT[status].length);
    },
  );

  it('offers no status button on a returned loan', async () => {
    renderLoan(makeLoan({ status: 'returned' }), 'registrar');
    await objectsTable();
    expect(screen.queryByRole('region', { name: 'Move the loan' })).toBeNull();
  });

  it.each<Role>(['conservator', 'researcher', 'viewer'])('offers a %s no status button', async (role) => {
    renderLoan(makeLoan(), role);
    await objectsTable();
    expect(screen.queryByRole('region', { name: 'Move the loan' })).toBeNull();
    expect(screen.queryByRole('button', { name: /Dispatch/ })).toBeNull();
  });

  it('sends the dated change with its note and the version', async () => {
    const moved = makeLoan({ status: 'in_transit', version: 4, blockers: [] });
    const { requests } = renderLoan(makeLoan({ blockers: [] }), 'registrar', {
      [`POST /api/loans/${LOAN_ID}/status`]: () => json({ data: moved }),
    });
    fireEvent.click(await screen.findByRole('button', { name: 'Dispatch (in transit)' }));
    const form = screen.getByRole('form', { name: /Agreed to In transit/ });
    fireEvent.change(within(form).getByLabelText('On'), { target: { value: '2026-03-02' } });
    fireEvent.change(within(form).getByLabelText('Note'), { target: { value: 'Crate 2 of 2, courier aboard' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Dispatch (in transit)' }));
    await waitFor(() => expect(requests.some((r) => r.method === 'POST')).toBe(true));
    expect(requests.find((r) => r.method === 'POST')?.body).toEqual({ to: 'in_transit', on: '2026-03-02', note: 'Crate 2 of 2, courier aboard', version: 3 });
    expect(await screen.findByRole('button', { name: 'Mark on loan' })).toBeTruthy();
  });

  it('shows a 409 in the form and keeps what was typed', async () => {
    const { requests } = renderLoan(makeLoan(), 'registrar', {
      [`POST /api/loans/${LOAN_ID}/status`]: () =>
        errorResponse(409, 'conflict', 'The loan cannot leave: 1981.7.4 has no signed outgoing condition report for this loan.'),
    });
    fireEvent.click(await screen.findByRole('button', { name: 'Dispatch (in transit)' }));
    const form = screen.getByRole('form', { name: /Agreed to In transit/ });
    fireEvent.change(within(form).getByLabelText('On'), { target: { value: '2026-03-02' } });
    fireEvent.change(within(form).getByLabelText('Note'), { target: { value: 'Courier booked' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Dispatch (in transit)' }));

    const alert = await within(form).findByRole('alert');
    expect(alert.textContent).toContain('The loan was not moved to in transit.');
    expect(alert.textContent).toContain('1981.7.4 has no signed outgoing condition report');
    expect(alert.textContent).toContain('req-test-1');
    expect((within(form).getByLabelText('On') as HTMLInputElement).value).toBe('2026-03-02');
    expect((within(form).getByLabelText('Note') as HTMLTextAreaElement).value).toBe('Courier booked');
    // The loan is fetched again, so the page shows what stands in the way now; the form stays open with its input.
    await waitFor(() => expect(requests.filter((r) => r.path === `/api/loans/${LOAN_ID}` && r.method === 'GET')).toHaveLength(2));
    expect((within(screen.getByRole('form', { name: /Agreed to In transit/ })).getByLabelText('Note') as HTMLTextAreaElement).value).toBe('Courier booked');
  });

  it('names the prints a refusal is about by accession number (the server sends their ids)', async () => {
    renderLoan(makeLoan(), 'registrar', {
      [`POST /api/loans/${LOAN_ID}/status`]: () =>
        errorResponse(409, 'conflict', '1 print has no signed outgoing condition report for this loan.', { details: { to: 'in_transit', printIds: [PRINT_B] } }),
    });
    fireEvent.click(await screen.findByRole('button', { name: 'Dispatch (in transit)' }));
    const form = screen.getByRole('form', { name: /Agreed to In transit/ });
    fireEvent.click(within(form).getByRole('button', { name: 'Dispatch (in transit)' }));
    expect((await within(form).findByText(/^Refused for/)).textContent).toBe('Refused for 1981.7.4.');
  });
});
