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

  it('shows a load failure with its request id', async () => {
    mockFetch({ 'GET /api/users': () => errorResponse(403, 'forbidden', 'Only administrators manage people.') });
    renderPage(<UsersPage />, { path: '/admin/users', me: makeMe('admin') });
    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('Only administrators manage people.');
    expect(alert.textContent).toContain('req-test-1');
  });
});
