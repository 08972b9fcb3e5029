import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import type { ConditionReport } from '@toneledger/common/schemas/condition';
import { json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';
import { ReportNewPage } from '@/features/condition/routes/report-new-page';
import { ReportPage } from '@/features/condition/routes/report-page';
import { PRINT_ID, conditionHandlers, makeReport } from '@/features/condition/testing/fixtures';

const LOAN_ID = '7a1e0c52-4f1b-4c9e-8d2a-1b2c3d4e5f60';

const loan: NonNullable<ConditionReport['loan']> = {
  id: LOAN_ID, reference: 'CR-L-2026-004', direction: 'out', otherInstitution: 'Harrowgate Gallery of Photography', venue: 'Harrowgate, east room',
  lender: 'Calder Reach', borrower: 'Harrowgate Gallery of Photography',
  dispatchOn: '2026-03-02', opensOn: '2026-03-10', closesOn: '2026-06-14', returnOn: '2026-06-22',
  conditions: {
    maxLux: 50, maxAnnualLuxHours: 12000, temperatureMinC: 18, temperatureMaxC: 22, rhMinPercent: 40, rhMaxPercent: 50,
    noAlkalineBufferedMounts: true, other: null,
  },
};

describe('the printed loan condition report', () => {
  it('fills lender, borrower, venue, dates and the conditions from the report’s loan', async () => {
    const report = makeReport({ status: 'signed', signedAt: '2026-02-20T09:00:00.000Z', context: 'outgoing_loan', loan });
    mockFetch(conditionHandlers(report));
    renderRoutes([{ path: '/condition/reports/:id', element: <ReportPage /> }], { path: `/condition/reports/${report.id}`, me: makeMe('registrar') });
    const doc = await screen.findByRole('article', { name: 'Condition report' });
    expect(within(doc).getByRole('group', { name: 'Lender signature' }).textContent).toContain('Name: Calder Reach');
    expect(within(doc).getByRole('group', { name: 'Borrower signature' }).textContent).toContain('Name: Harrowgate Gallery of Photography');
    const block = within(doc).getByRole('region', { name: 'Loan' });
    expect(within(block).getByRole('link', { name: 'CR-L-2026-004' }).getAttribute('href')).toBe(`/loans/${LOAN_ID}`);
    expect(block.textContent).toContain('Harrowgate, east room');
    expect(block.textContent).toContain('Dispatch 2 Mar 2026');
    expect(block.textContent).toContain('return 22 Jun 2026');
    expect(within(block).getByText('Illuminance at most 50 lux')).toBeTruthy();
    expect(within(block).getByText('At most 12,000 lux-hours a year')).toBeTruthy();
    expect(within(block).getByText('Temperature 18–22 °C')).toBeTruthy();
    expect(within(block).getByText('Relative humidity 40–50 % RH')).toBeTruthy();
    expect(within(block).getByText('No alkaline-buffered mounts or enclosures')).toBeTruthy();
  });

  it('leaves the names empty on a loan-context report made for no recorded loan', async () => {
    const report = makeReport({ status: 'signed', signedAt: '2026-02-20T09:00:00.000Z', context: 'outgoing_loan', loan: null });
    mockFetch(conditionHandlers(report));
    renderRoutes([{ path: '/condition/reports/:id', element: <ReportPage /> }], { path: `/condition/reports/${report.id}`, me: makeMe('registrar') });
    const doc = await screen.findByRole('article', { name: 'Condition report' });
    expect(within(doc).getByRole('group', { name: 'Lender signature' }).textContent).toBe('LenderName: Signature:Date:');
    expect(within(doc).queryByRole('region', { name: 'Loan' })).toBeNull();
  });
});

describe('a new report opened from a loan', () => {
  it('starts in the loan’s context and sends the loan with the report', async () => {
    const created = makeReport({ id: 'a2111111-2222-4333-8444-555555555555', grade: null, observations: [], version: 1, loan });
    const { requests } = mockFetch({ ...conditionHandlers(), [`POST /api/prints/${PRINT_ID}/condition-reports`]: () => json({ data: created }, 201) });
    const { router } = renderRoutes(
      [
        { path: '/condition/prints/:id/reports/new', element: <ReportNewPage /> },
        { path: '/condition/reports/:id', element: <p>report page</p> },
      ],
      { path: `/condition/prints/${PRINT_ID}/reports/new?context=outgoing_loan&loanId=${LOAN_ID}`, me: makeMe('conservator') },
    );
    const context = (await screen.findByLabelText('Context')) as HTMLSelectElement;
    expect(context.value).toBe('outgoing_loan');
    expect(screen.getByRole('link', { name: 'a loan' }).getAttribute('href')).toBe(`/loans/${LOAN_ID}`);
    fireEvent.change(screen.getByLabelText('Examined on'), { target: { value: '2026-02-20' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save draft' }));
    await waitFor(() => expect(router.state.location.pathname).toBe(`/condition/reports/${created.id}`));
    expect(requests.find((r) => r.method === 'POST')?.body).toMatchObject({ examinedOn: '2026-02-20', context: 'outgoing_loan', loanId: LOAN_ID });
  });

  it('ignores a context or loan id that is not one', async () => {
    const { requests } = mockFetch({ ...conditionHandlers(), [`POST /api/prints/${PRINT_ID}/condition-reports`]: () => json({ data: makeReport() }, 201) });
    renderRoutes([{ path: '/condition/prints/:id/reports/new', element: <ReportNewPage /> }, { path: '/condition/reports/:id', element: <p>report page</p> }], {
      path: `/condition/prints/${PRINT_ID}/reports/new?context=party&loanId=nope`,
      me: makeMe('conservator'),
    });
    const context = (await screen.findByLabelText('Context')) as HTMLSelectElement;
    expect(context.value).toBe('routine');
    fireEvent.click(screen.getByRole('button', { name: 'Save draft' }));
    await waitFor(() => expect(requests.some((r) => r.method === 'POST')).toBe(true));
    expect(requests.find((r) => r.method === 'POST')?.body).not.toHaveProperty('loanId');
  });
});
