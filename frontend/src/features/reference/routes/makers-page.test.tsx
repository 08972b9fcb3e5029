import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { makeMaker, page } from '@/features/reference/testing/fixtures';
import { MakersPage } from '@/features/reference/routes/makers-page';

const wren = makeMaker();

describe('MakersPage', () => {
  it('searches on the server with q, keeping it in the URL', async () => {
    const { requests } = mockFetch({ 'GET /api/makers': () => json(page([wren])) });
    const { router } = renderPage(<MakersPage />, { path: '/catalogue/makers', me: makeMe('viewer') });
    const row = (await screen.findByText('Wren Halloway')).closest('tr')!;
    expect(within(row).getAllByRole('cell').map((c) => c.textContent)).toEqual(['Wren Halloway', '1931–2004', '', '12']);
    expect(screen.queryByRole('button', { name: 'New maker' })).toBeNull();

    fireEvent.change(screen.getByRole('searchbox', { name: 'Name' }), { target: { value: 'hallo' } });
    fireEvent.click(screen.getByRole('button', { name: 'Search' }));
    await waitFor(() => expect(router.state.location.search).toBe('?q=hallo'));
    await waitFor(() => expect(requests.at(-1)?.search.get('q')).toBe('hallo'));
    expect(requests.at(-1)?.search.get('page')).toBe('1');
  });

  it('shows a duplicate name on the Name field and keeps what was typed', async () => {
    const { requests } = mockFetch({
      'GET /api/makers': () => json(page([wren])),
      'POST /api/makers': () =>
        errorResponse(409, 'conflict', 'A maker with this name exists.', {
          details: [{ path: 'name', message: 'A maker with this name exists.', code: 'unique' }],
        }),
    });
    renderPage(<MakersPage />, { path: '/catalogue/makers', me: makeMe('registrar') });
    const opener = await screen.findByRole('button', { name: 'New maker' });
    // As from the keyboard: the button has focus when it is pressed.
    opener.focus();
    fireEvent.click(opener);
    const panel = screen.getByRole('dialog', { name: 'New maker' });
    expect(document.activeElement).toBe(within(panel).getByRole('heading', { name: 'New maker' }));

    fireEvent.change(within(panel).getByLabelText('Name'), { target: { value: 'Wren Halloway' } });
    fireEvent.change(within(panel).getByLabelText('Life dates'), { target: { value: 'active 1950s' } });
    fireEvent.click(within(panel).getByRole('button', { name: 'Save' }));

    const name = within(panel).getByLabelText<HTMLInputElement>('Name');
    await waitFor(() => expect(name.getAttribute('aria-invalid')).toBe('true'));
    expect(within(panel).getAllByText('A maker with this name exists.').length).toBeGreaterThan(0);
    expect(name.value).toBe('Wren Halloway');
    expect(within(panel).getByLabelText<HTMLInputElement>('Life dates').value).toBe('active 1950s');
    expect(requests.find((r) => r.method === 'POST')?.body).toEqual({ name: 'Wren Halloway', lifeDates: 'active 1950s', notes: null });

    // Escape closes the panel and gives focus back to the button that opened it.
    fireEvent.keyDown(name, { key: 'Escape' });
    expect(screen.queryByRole('dialog')).toBeNull();
    expect(document.activeElement).toBe(opener);
  });

  it('does not send an edit that changes nothing', async () => {
    const { requests } = mockFetch({ 'GET /api/makers': () => json(page([wren])) });
    renderPage(<MakersPage />, { path: '/catalogue/makers', me: makeMe('admin') });
    fireEvent.click(await screen.findByRole('button', { name: 'Edit Wren Halloway' }));
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect((await screen.findByRole('status')).textContent).toBe('Nothing to save: no field has changed.');
    expect(requests.every((r) => r.method === 'GET')).toBe(true);
  });
});
