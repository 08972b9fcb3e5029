import { describe, expect, it } from 'vitest';
import { fireEvent, screen, within } from '@testing-library/react';
import type { PrintSchedule } from '@toneledger/common/schemas/inspections';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { PrintSchedulePanel } from '@/features/inspections/components/print-schedule-panel';

const PRINT_ID = 'c1000000-0000-4000-8000-000000000001';
const GET = `GET /api/prints/${PRINT_ID}/inspection`;
const PUT = `PUT /api/prints/${PRINT_ID}/inspection-override`;

/** An iron-blue print in a buffered enclosure with a loan coming: the factors as the server sends them, largest first. */
function makeSchedule(over: Partial<PrintSchedule> = {}): PrintSchedule {
  return {
    printId: PRINT_ID, dueOn: '2027-03-09', computedDueOn: '2027-03-09', intervalMonths: 39, risk: 'moderate',
    factors: [
      { code: 'loan', text: 'loan to Hollin Gallery on 2027-04', months: null, dueBy: '2027-03-09' },
      { code: 'vulnerable_process', text: 'iron-blue print: iron blue fades in light and under alkali', months: -12, dueBy: null },
      { code: 'enclosure', text: 'iron-blue print in a buffered enclosure (Buffered folder)', months: -9, dueBy: null },
    ],
    explanation: 'due 2027-03: loan to Hollin Gallery on 2027-04, …',
    lastCheckedOn: '2026-01-15', override: null, computedAt: '2026-12-02T10:00:00.000Z',
    rounds: [{ id: 'a1000000-0000-4000-8000-000000000001', title: 'East store, drawer 4', plannedOn: '2027-01-20' }],
    version: 3, ...over,
  };
}

function show(role: Parameters<typeof makeMe>[0], extra: Parameters<typeof mockFetch>[0] = {}) {
  const fetch = mockFetch({ [GET]: () => json({ data: makeSchedule() }), 'GET /api/inspections/recompute': () => json({ data: null }), ...extra });
  renderPage(<PrintSchedulePanel printId={PRINT_ID} />, { path: `/catalogue/prints/${PRINT_ID}`, me: makeMe(role) });
  return fetch;
}

describe('PrintSchedulePanel', () => {
  it('shows the date, the risk, the reasons largest first with how each moved the date, and the rounds', async () => {
    show('researcher');
    const list = await screen.findByRole('list', { name: 'Reasons, largest first' });
    expect(within(list).getAllByRole('listitem').map((li) => li.textContent)).toEqual([
      'loan to Hollin Gallery on 2027-04 (check by 9 Mar 2027)',
      'iron-blue print: iron blue fades in light and under alkali (12 months sooner)',
      'iron-blue print in a buffered enclosure (Buffered folder) (9 months sooner)',
    ]);
    expect(screen.getByText('Risk', { selector: 'dt' }).nextElementSibling!.textContent).toBe('Moderate — a check every 39 months');
    expect(screen.getByRole('link', { name: 'East store, drawer 4' }).getAttribute('href')).toBe('/inspections/rounds/a1000000-0000-4000-8000-000000000001');
    // A researcher reads and changes nothing.
    expect(screen.queryByRole('button', { name: 'Set the date' })).toBeNull();
  });

  it('says a deaccessioned print is no longer inspected, with the day it left, instead of an error', async () => {
    show('conservator', {
      [GET]: () => errorResponse(409, 'conflict', 'This print was deaccessioned on 2024-06-14; its record is read-only.', { details: { printId: PRINT_ID, deaccessioned: '2024-06-14' } }),
    });
    expect(await screen.findByText('No further inspections: the print was deaccessioned on 14 Jun 2024.')).toBeTruthy();
    expect(screen.queryByRole('alert')).toBeNull();
  });

  it('shows a viewer nothing and asks the server nothing', async () => {
    const { requests } = show('viewer');
    await new Promise((resolve) => setTimeout(resolve, 20));
    expect(screen.queryByRole('heading', { name: 'Next inspection' })).toBeNull();
    expect(requests).toHaveLength(0);
  });
});

describe('Set the date', { timeout: 20_000 }, () => {
  it('asks for a reason with a date of its own, sends nothing until given, then saves', async () => {
    const { requests } = show('conservator', {
      [PUT]: (request) => {
        const body = request.body as { dueOn: string; reason: string; version: number };
        return json({ data: makeSchedule({ dueOn: body.dueOn, override: { dueOn: body.dueOn, reason: body.reason, by: { id: '5d0c0f5e-8a7b-4c2d-9e1f-112233445566', name: 'Iris Penhale' }, at: '2026-12-02T11:00:00.000Z' }, version: 4 }) });
      },
    });
    fireEvent.click(await screen.findByRole('button', { name: 'Set the date' }));
    fireEvent.change(screen.getByLabelText('Inspect by'), { target: { value: '2027-01-20' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save date' }));
    expect(await screen.findAllByText('Say why this print needs a different date')).not.toHaveLength(0);
    expect(requests.filter((r) => r.method === 'PUT')).toHaveLength(0);

    fireEvent.change(screen.getByLabelText('Reason'), { target: { value: 'Mount lifting at one corner' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save date' }));
    expect(await screen.findByText('Date saved.')).toBeTruthy();
    expect(requests.find((r) => r.method === 'PUT')?.body).toEqual({ dueOn: '2027-01-20', reason: 'Mount lifting at one corner', version: 3 });
    expect(screen.getByText(/Set by Iris Penhale: Mount lifting at one corner/)).toBeTruthy();
  });
});
