import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import type { Role } from '@toneledger/common/domain/roles';
import type { ExhibitionDetail } from '@toneledger/common/schemas/exhibitions';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';
import { ExhibitionPage } from '@/features/exhibitions/routes/exhibition-page';
import { EXHIBITION_ID, PRINT_ID, VENUE_ID, makeExhibition } from '@/features/exhibitions/testing/fixtures';

type Handlers = Parameters<typeof mockFetch>[0];

function renderExhibition(exhibition: ExhibitionDetail, role: Role, handlers: Handlers = {}) {
  const fetch = mockFetch({ [`GET /api/exhibitions/${EXHIBITION_ID}`]: () => json({ data: exhibition }), ...handlers });
  const view = renderRoutes([{ path: '/exhibitions/:id', element: <ExhibitionPage /> }], { path: `/exhibitions/${EXHIBITION_ID}`, me: makeMe(role) });
  return { ...fetch, ...view };
}

async function openNewDisplay() {
  fireEvent.click(await screen.findByRole('button', { name: 'Add a display period' }));
  return screen.getByRole('form', { name: 'New display period of 1981.7.4' });
}

describe('exhibition page: approval', () => {
  it('refuses without a reason in the form, sending nothing, then sends the reason', async () => {
    const refused = makeExhibition();
    refused.objects[0] = { ...refused.objects[0]!, approval: 'refused', approvalReason: 'Faded at the margin; rest it this year' };
    const { requests } = renderExhibition(makeExhibition(), 'conservator', {
      [`PUT /api/exhibitions/${EXHIBITION_ID}/objects/${PRINT_ID}/approval`]: () => json({ data: refused }),
    });
    fireEvent.click(await screen.findByRole('button', { name: 'Refuse…' }));
    const form = screen.getByRole('form', { name: 'Refuse 1981.7.4 for display' });
    fireEvent.click(within(form).getByRole('button', { name: 'Refuse for display' }));
    // The message is the contract's own (approvalInputSchema), under the field and in the summary.
    await waitFor(() => expect(within(form).getAllByText('Say why the print may not be shown').length).toBeGreaterThan(0));
    expect(requests.some((r) => r.method === 'PUT')).toBe(false);

    fireEvent.change(within(form).getByLabelText('Reason'), { target: { value: 'Faded at the margin; rest it this year' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Refuse for display' }));
    await waitFor(() => expect(requests.some((r) => r.method === 'PUT')).toBe(true));
    expect(requests.find((r) => r.method === 'PUT')?.body).toEqual({ decision: 'refused', reason: 'Faded at the margin; rest it this year' });
    expect(await screen.findByText('Refused for display')).toBeTruthy();
    expect(screen.getByText('Reason: Faded at the margin; rest it this year')).toBeTruthy();
  });

  it('approves with one press', async () => {
    const approved = makeExhibition();
    approved.objects[0] = { ...approved.objects[0]!, approval: 'approved' };
    const { requests } = renderExhibition(makeExhibition(), 'conservator', {
      [`PUT /api/exhibitions/${EXHIBITION_ID}/objects/${PRINT_ID}/approval`]: () => json({ data: approved }),
    });
    fireEvent.click(await screen.findByRole('button', { name: 'Approve' }));
    expect(await screen.findByText('Approved for display')).toBeTruthy();
    expect(requests.find((r) => r.method === 'PUT')?.body).toEqual({ decision: 'approved' });
  });

  it.each<Role>(['registrar', 'researcher', 'viewer'])('offers a %s no approval buttons', async (role) => {
    renderExhibition(makeExhibition(), role);
    expect(await screen.findByText('Waiting for a conservator')).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Approve' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Refuse…' })).toBeNull();
  });
});

describe('exhibition page: display periods', () => {
  it('sends a display period with its weekdays and closed dates, and puts the server’s field error on its field', async () => {
    const { requests } = renderExhibition(makeExhibition(), 'conservator', {
      [`POST /api/exhibitions/${EXHIBITION_ID}/displays`]: () =>
        errorResponse(400, 'validation_failed', 'Check the highlighted fields.', {
          details: [{ path: 'closedDates.0', message: 'A closed date lies outside the display period', code: 'custom' }],
        }),
    });
    const form = await openNewDisplay();
    // The only venue's dates are offered.
    expect((within(form).getByLabelText('Starts on') as HTMLInputElement).value).toBe('2026-04-01');
    fireEvent.change(within(form).getByLabelText('Illuminance (lux)'), { target: { value: '50' } });
    fireEvent.change(within(form).getByLabelText('Hours a day'), { target: { value: '8' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Monday' }));
    fireEvent.change(within(form).getByLabelText('Closed dates'), { target: { value: '2026-07-04' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Add the display period' }));

    await waitFor(() => expect(requests.some((r) => r.method === 'POST')).toBe(true));
    expect(requests.find((r) => r.method === 'POST')?.body).toEqual({
      printId: PRINT_ID, venueId: VENUE_ID, startsOn: '2026-04-01', endsOn: '2026-06-30', lux: 50, hoursPerDay: 8,
      daysOpen: [2, 3, 4, 5, 6, 7], closedDates: ['2026-07-04'], uvMicrowattsPerLumen: null, caseOrFrame: null, mountNotes: null,
    });
    const closed = within(form).getByLabelText('Closed dates');
    await waitFor(() => expect(closed.getAttribute('aria-invalid')).toBe('true'));
    expect(document.getElementById(closed.getAttribute('aria-describedby')!)?.textContent).toBe('A closed date lies outside the display period');
    // What was typed stays.
    expect((within(form).getByLabelText('Illuminance (lux)') as HTMLInputElement).value).toBe('50');
  });

  it('shows the hours-a-day field error the server names', async () => {
    renderExhibition(makeExhibition(), 'registrar', {
      [`POST /api/exhibitions/${EXHIBITION_ID}/displays`]: () =>
        errorResponse(400, 'validation_failed', 'Check the highlighted fields.', {
          details: [{ path: 'hoursPerDay', message: 'At most 24 hours a day', code: 'too_big' }],
        }),
    });
    const form = await openNewDisplay();
    fireEvent.change(within(form).getByLabelText('Illuminance (lux)'), { target: { value: '50' } });
    fireEvent.change(within(form).getByLabelText('Hours a day'), { target: { value: '12' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Add the display period' }));
    const hours = within(form).getByLabelText('Hours a day');
    await waitFor(() => expect(hours.getAttribute('aria-invalid')).toBe('true'));
    expect(document.getElementById(hours.getAttribute('aria-describedby')!)?.textContent).toBe('At most 24 hours a day');
  });

  it('refuses 25 hours a day and an end before the start in the form, sending nothing', async () => {
    const { requests } = renderExhibition(makeExhibition(), 'conservator');
    const form = await openNewDisplay();
    fireEvent.change(within(form).getByLabelText('Illuminance (lux)'), { target: { value: '50' } });
    fireEvent.change(within(form).getByLabelText('Hours a day'), { target: { value: '25' } });
    fireEvent.change(within(form).getByLabelText('Ends on'), { target: { value: '2026-03-01' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Add the display period' }));
    // Messages from displayInputSchema (common/src/schemas/exhibitions.ts).
    await waitFor(() => expect(within(form).getAllByText('At most 24 hours a day').length).toBeGreaterThan(0));
    expect(within(form).getAllByText('The display ends on or after the day it starts').length).toBeGreaterThan(0);
    expect(requests.every((r) => r.method === 'GET')).toBe(true);
  });

  it('offers a researcher no display period controls', async () => {
    renderExhibition(makeExhibition(), 'researcher');
    expect(await screen.findByText('No display period recorded.')).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Add a display period' })).toBeNull();
  });
});
