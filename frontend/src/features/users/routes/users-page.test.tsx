import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { json, errorResponse, mockFetch } from '@/test/fetch-mock';
import { makeMe, makeUser } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { UsersPage } from '@/features/users/routes/users-page';

const ada = makeUser();
const onlyAdmin = makeUser({ id: '9a9a9a9a-1111-4222-8333-444455556666', name: 'Bram Otley', email: 'bram@example.test', role: 'admin' });

function page(data = [ada, onlyAdmin], total = data.length, pageSize = 50) {
  return json({ data, pagination: { page: 1, pageSize, total } });
}

describe('UsersPage', () => {
  it('asks the API for exactly the query in the URL', async () => {
    const { requests } = mockFetch({ 'GET /api/users': () => page() });
    renderPage(<UsersPage />, { path: '/admin/users?page=2&role=viewer&sort=-lastSignInAt&q=otley&bogus=1', me: makeMe('admin') });
    await screen.findByText('Ada Marsh');
    expect(Object.fromEntries(requests[0]!.search)).toEqual({ page: '2', pageSize: '50', role: 'viewer', sort: '-lastSignInAt', q: 'otley' });
  });

  it('sorts on the server when a column header is pressed, and toggles direction', async () => {
    const { requests } = mockFetch({ 'GET /api/users': () => page() });
    const { router } = renderPage(<UsersPage />, { path: '/admin/users', me: makeMe('admin') });
    await screen.findByText('Ada Marsh');

    fireEvent.click(screen.getByRole('button', { name: /E-mail/ }));
    await waitFor(() => expect(router.state.location.search).toBe('?sort=email'));
    await waitFor(() => expect(requests.at(-1)?.search.get('sort')).toBe('email'));
    expect(screen.getByRole('columnheader', { name: /E-mail/ }).getAttribute('aria-sort')).toBe('ascending');

    fireEvent.click(screen.getByRole('button', { name: /E-mail/ }));
    await waitFor(() => expect(requests.at(-1)?.search.get('sort')).toBe('-email'));
  });

  it('pages through the results and goes back to page 1 when a filter changes', async () => {
    const { requests } = mockFetch({ 'GET /api/users': () => page([ada, onlyAdmin], 120) });
    const { router } = renderPage(<UsersPage />, { path: '/admin/users', me: makeMe('admin') });
    await screen.findByText('1–50 of 120');

    fireEvent.click(screen.getByRole('button', { name: 'Next page' }));
    await waitFor(() => expect(requests.at(-1)?.search.get('page')).toBe('2'));

    fireEvent.change(screen.getByRole('combobox', { name: 'Role' }), { target: { value: 'conservator' } });
    await waitFor(() => expect(router.state.location.search).toBe('?role=conservator'));
    expect(requests.at(-1)?.search.get('page')).toBe('1');
  });

  it('changes a role only after confirmation, sending the reason', async () => {
    const { requests } = mockFetch({
      'GET /api/users': () => page(),
      [`PATCH /api/users/${ada.id}/role`]: () => json({ data: { ...ada, role: 'conservator' } }),
    });
    renderPage(<UsersPage />, { path: '/admin/users', me: makeMe('admin') });

    fireEvent.change(await screen.findByRole('combobox', { name: 'Role of Ada Marsh' }), { target: { value: 'conservator' } });
    expect(requests.some((r) => r.method === 'PATCH')).toBe(false);
    const confirm = screen.getByRole('group', { name: 'Confirm role change for Ada Marsh' });
    expect(confirm.textContent).toContain('from Registrar to Conservator');
    fireEvent.change(within(confirm).getByLabelText(/Reason/), { target: { value: 'Joined the conservation studio' } });
    fireEvent.click(within(confirm).getByRole('button', { name: 'Change role' }));

    expect(await screen.findByText('Role changed to Conservator.')).toBeTruthy();
    const patch = requests.find((r) => r.method === 'PATCH');
    expect(patch?.body).toEqual({ role: 'conservator', reason: 'Joined the conservation studio' });
    // The list is fetched again after the change.
    await waitFor(() => expect(requests.filter((r) => r.path === '/api/users')).toHaveLength(2));
  });

  it('cancelling the confirmation sends nothing and restores the role', async () => {
    const { requests } = mockFetch({ 'GET /api/users': () => page() });
    renderPage(<UsersPage />, { path: '/admin/users', me: makeMe('admin') });
    const select = await screen.findByRole('combobox', { name: 'Role of Ada Marsh' });
    fireEvent.change(select, { target: { value: 'viewer' } });
    fireEvent.click(screen.getByRole('button', { name: 'Cancel' }));
    expect((select as HTMLSelectElement).value).toBe('registrar');
    expect(screen.queryByRole('group', { name: /Confirm role change/ })).toBeNull();
    expect(requests.every((r) => r.method === 'GET')).toBe(true);
  });

  it('shows the server\'s refusal to remove the last administrator inline, and keeps the old role', async () => {
    mockFetch({
      'GET /api/users': () => page(),
      [`PATCH /api/users/${onlyAdmin.id}/role`]: () =>
        errorResponse(409, 'conflict', 'Bram Otley is the last administrator; make someone else an administrator first.'),
    });
    renderPage(<UsersPage />, { path: '/admin/users', me: makeMe('admin') });

    const select = (await screen.findByRole('combobox', { name: 'Role of Bram Otley' })) as HTMLSelectElement;
    fireEvent.change(select, { target: { value: 'viewer' } });
    fireEvent.click(screen.getByRole('button', { name: 'Change role' }));

    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('Bram Otley is the last administrator; make someone else an administrator first.');
    expect(select.value).toBe('admin');
    // The message sits in Bram's row, not Ada's.
    const row = select.closest('tr')!;
    expect(within(row).getByRole('alert')).toBe(alert);
  });

  it('shows the last-admin guard before any demotion is offered: no role choice, no deactivation', async () => {
    const sole = { ...onlyAdmin, lastAdmin: true };
    mockFetch({ 'GET /api/users': () => page([ada, sole]) });
    renderPage(<UsersPage />, { path: '/admin/users', me: makeMe('admin') });
    await screen.findByRole('combobox', { name: 'Role of Ada Marsh' });
    expect(screen.queryByRole('combobox', { name: 'Role of Bram Otley' })).toBeNull();
    const row = screen.getByText('Bram Otley').closest('tr')!;
    expect(within(row).getByText(/The only administrator: make someone else an administrator before changing this role/)).toBeTruthy();
    expect(within(row).queryByRole('button', { name: 'Deactivate Bram Otley' })).toBeNull();
    expect(within(row).getByText('The only administrator: make someone else an administrator first.')).toBeTruthy();
  });

  it('deactivates a person after confirming, with a reason, and reactivates a deactivated one', async () => {
    const gone = makeUser({ id: '7c7c7c7c-1111-4222-8333-444455556666', name: 'Wenna Pascoe', email: 'wenna@example.test', role: 'viewer', deactivatedAt: '2026-11-30T10:00:00.000Z' });
    const { requests } = mockFetch({
      'GET /api/users': () => page([ada, onlyAdmin, gone]),
      [`POST /api/users/${ada.id}/deactivate`]: () => json({ data: { ...ada, deactivatedAt: '2026-12-02T10:00:00.000Z' } }),
      [`POST /api/users/${gone.id}/reactivate`]: () => json({ data: { ...gone, deactivatedAt: null } }),
    });
    renderPage(<UsersPage />, { path: '/admin/users', me: makeMe('admin') });
    fireEvent.click(await screen.findByRole('button', { name: 'Deactivate Ada Marsh' }));
    const confirm = screen.getByRole('group', { name: 'Confirm deactivation of Ada Marsh' });
    expect(confirm.textContent).toMatch(/stay in the record, cannot sign in, and any session of theirs ends now/);
    fireEvent.change(within(confirm).getByLabelText(/Reason/), { target: { value: 'Left the institution' } });
    fireEvent.click(within(confirm).getByRole('button', { name: 'Deactivate' }));
    await waitFor(() => expect(requests.find((r) => r.method === 'POST' && r.path.endsWith('/deactivate'))?.body).toEqual({ reason: 'Left the institution' }));

    const goneRow = screen.getByText('Wenna Pascoe').closest('tr')!;
    expect(within(goneRow).getByText(/^Deactivated/)).toBeTruthy();
    fireEvent.click(within(goneRow).getByRole('button', { name: 'Reactivate Wenna Pascoe' }));
    await waitFor(() => expect(requests.some((r) => r.method === 'POST' && r.path === `/api/users/${gone.id}/reactivate`)).toBe(true));
  });

  it('offers no deactivation of oneself', async () => {
    const me = makeMe('admin');
    mockFetch({ 'GET /api/users': () => page([ada, { ...onlyAdmin, id: me.id, name: me.name }]) });
    renderPage(<UsersPage />, { path: '/admin/users', me });
    await screen.findByRole('button', { name: 'Deactivate Ada Marsh' });
    expect(screen.queryByRole('button', { name: `Deactivate ${me.name}` })).toBeNull();
    expect(screen.getByText('You cannot deactivate yourself.')).toBeTruthy();
  });

  it('shows a load failure with its request id', async () => {
    mockFetch({ 'GET /api/users': () => errorResponse(403, 'forbidden', 'Only administrators manage people.') });
    renderPage(<UsersPage />, { path: '/admin/users', me: makeMe('admin') });
    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('Only administrators manage people.');
    expect(alert.textContent).toContain('req-test-1');
  });
});
