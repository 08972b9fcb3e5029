import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { makeLocation, page } from '@/features/reference/testing/fixtures';
import { LocationsPage } from '@/features/reference/routes/locations-page';

const building = makeLocation();
const room = makeLocation({
  id: 'aaaaaaaa-aaaa-4aaa-8aaa-aaaaaaaaaaaa', name: 'Cold room', kind: 'room', parentId: building.id,
  path: ['North store', 'Cold room'], pathLabel: 'North store › Cold room', depth: 1,
});
const cabinet = makeLocation({
  id: 'bbbbbbbb-bbbb-4bbb-8bbb-bbbbbbbbbbbb', name: 'Cabinet 4', kind: 'cabinet', parentId: room.id, code: 'C4',
  path: ['North store', 'Cold room', 'Cabinet 4'], pathLabel: 'North store › Cold room › Cabinet 4', depth: 2,
});
const drawer = makeLocation({
  id: 'cccccccc-cccc-4ccc-8ccc-cccccccccccc', name: 'Drawer 2', kind: 'drawer', parentId: cabinet.id, printCount: 31,
  path: ['North store', 'Cold room', 'Cabinet 4', 'Drawer 2'], pathLabel: 'North store › Cold room › Cabinet 4 › Drawer 2', depth: 3,
});
const all = [building, room, cabinet, drawer];

describe('LocationsPage', () => {
  it('shows the places as an expandable tree with kind, code and print counts', async () => {
    const { requests } = mockFetch({ 'GET /api/locations': () => json(page(all)) });
    renderPage(<LocationsPage />, { path: '/catalogue/locations', me: makeMe('researcher') });
    await screen.findByText('North store');
    expect(requests[0]?.search.get('pageSize')).toBe('1000');
    // The top two levels are open; the cabinet is closed, so its drawer is not shown.
    expect(screen.getByText('Cabinet 4')).toBeTruthy();
    expect(screen.queryByText('Drawer 2')).toBeNull();
    fireEvent.click(screen.getByRole('button', { name: 'Expand Cabinet 4' }));
    const drawerRow = screen.getByText('Drawer 2').closest('tr')!;
    expect(within(drawerRow).getAllByRole('cell').map((c) => c.textContent)).toEqual(['Drawer 2', 'Drawer', '—', '31']);
    expect(screen.getByRole('button', { name: 'Collapse Cabinet 4' }).getAttribute('aria-expanded')).toBe('true');
    // Indented by depth.
    const indent = (name: string) => (screen.getByText(name).closest('td')!.firstElementChild as HTMLElement).style.paddingLeft;
    expect([indent('North store'), indent('Cold room'), indent('Drawer 2')]).toEqual(['0rem', '1.25rem', '3.75rem']);

    fireEvent.click(screen.getByRole('button', { name: 'Collapse North store' }));
    expect(screen.queryByText('Cold room')).toBeNull();
    // Researchers cannot change places.
    expect(screen.queryByRole('button', { name: 'New place' })).toBeNull();
  });

  it('creates a place inside the chosen parent', async () => {
    const { requests } = mockFetch({
      'GET /api/locations': () => json(page(all)),
      'POST /api/locations': () =>
        json({ data: makeLocation({ id: 'dddddddd-dddd-4ddd-8ddd-dddddddddddd', name: 'Drawer 3', kind: 'drawer', parentId: cabinet.id, pathLabel: 'North store › Cold room › Cabinet 4 › Drawer 3', depth: 3 }) }, 201),
    });
    renderPage(<LocationsPage />, { path: '/catalogue/locations', me: makeMe('registrar') });
    fireEvent.click(await screen.findByRole('button', { name: 'Add a place inside Cabinet 4' }));
    const panel = screen.getByRole('dialog', { name: 'New place inside Cabinet 4' });
    expect(within(panel).getByLabelText<HTMLSelectElement>('Inside').value).toBe(cabinet.id);
    expect(within(panel).getByLabelText<HTMLSelectElement>('Kind').value).toBe('drawer');
    fireEvent.change(within(panel).getByLabelText('Name'), { target: { value: 'Drawer 3' } });
    expect(panel.textContent).toContain('Full path: North store › Cold room › Cabinet 4 › Drawer 3');
    fireEvent.click(within(panel).getByRole('button', { name: 'Save' }));

    expect(await screen.findByText('Added North store › Cold room › Cabinet 4 › Drawer 3.')).toBeTruthy();
    expect(requests.find((r) => r.method === 'POST')?.body).toEqual({ name: 'Drawer 3', kind: 'drawer', parentId: cabinet.id, code: null, notes: null });
  });

  it('moves a place by changing its parent, never into itself or its contents', async () => {
    const { requests } = mockFetch({
      'GET /api/locations': () => json(page(all)),
      [`PATCH /api/locations/${cabinet.id}`]: () => json({ data: { ...cabinet, parentId: building.id, pathLabel: 'North store › Cabinet 4', version: 2 } }),
    });
    renderPage(<LocationsPage />, { path: '/catalogue/locations', me: makeMe('registrar') });
    fireEvent.click(await screen.findByRole('button', { name: 'Edit Cabinet 4' }));
    const inside = screen.getByLabelText<HTMLSelectElement>('Inside');
    const choices = within(inside).getAllByRole('option').map((o) => o.textContent);
    expect(choices).toEqual(['Top level (not inside another place)', 'North store', 'North store › Cold room']);
    fireEvent.change(inside, { target: { value: building.id } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    await screen.findByText('Saved North store › Cabinet 4.');
    expect(requests.find((r) => r.method === 'PATCH')?.body).toEqual({ version: 1, parentId: building.id });
  });

  it('is not shown to viewers, and nothing is requested', async () => {
    const { requests } = mockFetch({});
    renderPage(<LocationsPage />, { path: '/catalogue/locations', me: makeMe('viewer') });
    expect(screen.getByText('Storage locations are not shown to your role.')).toBeTruthy();
    await waitFor(() => expect(requests).toHaveLength(0));
  });
});
