import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';
import { ExhibitionCreatePage, ExhibitionEditPage } from '@/features/exhibitions/routes/exhibition-form-pages';
import { EXHIBITION_ID, VENUE_ID, makeExhibition } from '@/features/exhibitions/testing/fixtures';

describe('exhibition forms', () => {
  it('records a touring show with two venues, refusing a venue that closes before it opens', async () => {
    const { requests } = mockFetch({ 'POST /api/exhibitions': () => json({ data: makeExhibition() }, 201) });
    const { router } = renderRoutes(
      [
        { path: '/exhibitions/new', element: <ExhibitionCreatePage /> },
        { path: '/exhibitions/:id', element: <p>exhibition page</p> },
      ],
      { path: '/exhibitions/new', me: makeMe('registrar') },
    );
    const form = await screen.findByRole('form', { name: 'New exhibition' });
    fireEvent.change(within(form).getByLabelText('Title'), { target: { value: 'Blue hours' } });
    const venueInputs = () => within(form).getAllByLabelText('Venue');
    fireEvent.change(venueInputs()[0]!, { target: { value: 'Print room' } });
    fireEvent.change(within(form).getAllByLabelText('Opens')[0]!, { target: { value: '2026-04-01' } });
    fireEvent.change(within(form).getAllByLabelText('Closes')[0]!, { target: { value: '2026-03-01' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Add a venue' }));
    fireEvent.change(venueInputs()[1]!, { target: { value: 'Harbour gallery' } });
    fireEvent.change(within(form).getAllByLabelText('Opens')[1]!, { target: { value: '2026-08-01' } });
    fireEvent.change(within(form).getAllByLabelText('Closes')[1]!, { target: { value: '2026-10-31' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Record the exhibition' }));
    // venueInputSchema's own message, under the first venue's closing date.
    const closes = within(form).getAllByLabelText('Closes')[0]!;
    await waitFor(() => expect(closes.getAttribute('aria-invalid')).toBe('true'));
    expect(document.getElementById(closes.getAttribute('aria-describedby')!)?.textContent).toBe('The venue closes on or after the day it opens');
    expect(requests.some((r) => r.method === 'POST')).toBe(false);

    fireEvent.change(closes, { target: { value: '2026-06-30' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Record the exhibition' }));
    await waitFor(() => expect(router.state.location.pathname).toBe(`/exhibitions/${EXHIBITION_ID}`));
    expect(requests.find((r) => r.method === 'POST')?.body).toEqual({
      title: 'Blue hours', organiser: null, summary: null,
      venues: [
        { name: 'Print room', place: null, opensOn: '2026-04-01', closesOn: '2026-06-30' },
        { name: 'Harbour gallery', place: null, opensOn: '2026-08-01', closesOn: '2026-10-31' },
      ],
    });
  });

  it('edits keeping each venue’s id, on the version it opened', async () => {
    const { requests } = mockFetch({
      [`GET /api/exhibitions/${EXHIBITION_ID}`]: () => json({ data: makeExhibition() }),
      [`PATCH /api/exhibitions/${EXHIBITION_ID}`]: () => json({ data: makeExhibition({ version: 3 }) }),
    });
    renderRoutes(
      [
        { path: '/exhibitions/:id/edit', element: <ExhibitionEditPage /> },
        { path: '/exhibitions/:id', element: <p>exhibition page</p> },
      ],
      { path: `/exhibitions/${EXHIBITION_ID}/edit`, me: makeMe('registrar') },
    );
    const form = await screen.findByRole('form', { name: 'Edit exhibition' });
    fireEvent.change(within(form).getByLabelText('Organiser'), { target: { value: 'Calder Reach with the Harbour gallery' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Save the exhibition' }));
    await waitFor(() => expect(requests.some((r) => r.method === 'PATCH')).toBe(true));
    expect(requests.find((r) => r.method === 'PATCH')?.body).toMatchObject({
      version: 2,
      organiser: 'Calder Reach with the Harbour gallery',
      venues: [{ id: VENUE_ID, name: 'Print room', place: 'Calder Reach', opensOn: '2026-04-01', closesOn: '2026-06-30' }],
    });
  });
});

describe('deleting an exhibition', () => {
  it('asks first, then shows the server’s refusal', async () => {
    const { requests } = mockFetch({
      [`GET /api/exhibitions/${EXHIBITION_ID}`]: () => json({ data: makeExhibition() }),
      [`DELETE /api/exhibitions/${EXHIBITION_ID}`]: () => errorResponse(409, 'conflict', 'The exhibition has display periods; delete them first.'),
    });
    renderRoutes([{ path: '/exhibitions/:id/edit', element: <ExhibitionEditPage /> }], { path: `/exhibitions/${EXHIBITION_ID}/edit`, me: makeMe('registrar') });
    fireEvent.click(await screen.findByRole('button', { name: 'Delete this exhibition…' }));
    expect(requests.some((r) => r.method === 'DELETE')).toBe(false);
    fireEvent.click(within(screen.getByRole('alertdialog', { name: 'Confirm deletion' })).getByRole('button', { name: 'Delete' }));
    expect(await screen.findByText('The exhibition has display periods; delete them first.')).toBeTruthy();
    expect(requests.find((r) => r.method === 'DELETE')?.search.get('version')).toBe('2');
  });
});
