import { describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import type { Reminders } from '@toneledger/common/schemas/inspections';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { RemindersPage } from '@/features/reminders/routes/reminders-page';

const base: Reminders = { digestEnabled: true, digestWeekday: 1, calendarFeed: null, lastDigest: { week: '2026-W48', status: 'sent', sentAt: '2026-11-23T07:07:00.000Z' } };
const FEED = 'http://localhost:4010/api/calendar/Zq3vX0aUe7cF1lNw8pR2sT4yB6dH9kM5jG_oLiA-xYc.ics';

describe('RemindersPage', () => {
  it('shows the digest choice and saves it off, on another day, with the contract body', async () => {
    let current = base;
    const { requests } = mockFetch({
      'GET /api/me/reminders': () => json({ data: current }),
      'PUT /api/me/reminders': (r) => {
        current = { ...current, ...(r.body as object) };
        return json({ data: current });
      },
    });
    renderPage(<RemindersPage />, { path: '/inspections/reminders', me: makeMe('conservator') });
    const box = (await screen.findByLabelText('Send me the weekly e-mail')) as HTMLInputElement;
    expect(box.checked).toBe(true);
    expect((screen.getByLabelText('Day') as HTMLSelectElement).value).toBe('1');
    expect(screen.getByText(/Last week's message \(2026-W48\): sent/)).toBeTruthy();
    fireEvent.click(box);
    fireEvent.change(screen.getByLabelText('Day'), { target: { value: '5' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect(await screen.findByText('Saved.')).toBeTruthy();
    expect(requests.find((r) => r.method === 'PUT')?.body).toEqual({ digestEnabled: false, digestWeekday: 5 });
  });

  it('makes a calendar address, shows it once with a copy button, and ends it', async () => {
    let current: Reminders = { ...base, lastDigest: null };
    const writeText = vi.fn(async () => {});
    Object.assign(navigator, { clipboard: { writeText } });
    mockFetch({
      'GET /api/me/reminders': () => json({ data: current }),
      'POST /api/me/calendar-feed': () => {
        current = { ...current, calendarFeed: { createdAt: '2026-12-02T10:00:00.000Z' } };
        return json({ data: { url: FEED, createdAt: '2026-12-02T10:00:00.000Z' } }, 201);
      },
      'DELETE /api/me/calendar-feed': () => {
        current = { ...current, calendarFeed: null };
        return new Response(null, { status: 204 });
      },
    });
    renderPage(<RemindersPage />, { path: '/inspections/reminders', me: makeMe('researcher') });
    // A researcher reads the schedule but gets no digest: the page says so.
    expect(await screen.findByText(/goes to the people who plan inspections/)).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Make a calendar address' }));
    expect((await screen.findByTestId('feed-url')).textContent).toBe(FEED);
    expect(screen.getByText(/subscribe to a calendar from the internet/)).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Copy address' }));
    await waitFor(() => expect(writeText).toHaveBeenCalledWith(FEED));
    expect(await screen.findByText('Copied.')).toBeTruthy();

    fireEvent.click(await screen.findByRole('button', { name: 'End the calendar address' }));
    expect(await screen.findByRole('button', { name: 'Make a calendar address' })).toBeTruthy();
    expect(screen.queryByTestId('feed-url')).toBeNull();
  });

  it('shows a refusal from the server', async () => {
    mockFetch({
      'GET /api/me/reminders': () => json({ data: base }),
      'POST /api/me/calendar-feed': () => errorResponse(503, 'service_unavailable', 'The database is not answering.'),
    });
    renderPage(<RemindersPage />, { path: '/inspections/reminders', me: makeMe('conservator') });
    fireEvent.click(await screen.findByRole('button', { name: 'Make a calendar address' }));
    expect((await screen.findByRole('alert')).textContent).toContain('The database is not answering.');
  });
});
