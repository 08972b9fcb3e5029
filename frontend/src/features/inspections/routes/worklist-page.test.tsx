import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';
import { WorklistPage } from '@/features/inspections/routes/worklist-page';
import { CONSERVATOR_ID, PRINTS, ROUND_ID, makeItem, makeRound, worklistPage } from '@/features/inspections/testing/fixtures';

const items = [0, 1, 2, 3].map((n) => makeItem(n, n === 3 ? { locationLabel: 'South store › Shelf 1', overdueDays: -20, dueOn: '2027-01-01' } : {}));
const handlers = (extra: Parameters<typeof mockFetch>[0] = {}) => ({
  'GET /api/inspections': () => json(worklistPage(items)),
  'GET /api/locations': () => json({ data: [], pagination: { page: 1, pageSize: 200, total: 0 } }),
  'GET /api/inspection-assignees': () => json({ data: [{ id: CONSERVATOR_ID, name: 'Iris Penhale' }] }),
  ...extra,
});

function renderList(role: 'conservator' | 'registrar', path = '/inspections', extra: Parameters<typeof mockFetch>[0] = {}) {
  const fetch = mockFetch(handlers(extra));
  const view = renderRoutes(
    [
      { path: '/inspections', element: <WorklistPage /> },
      { path: '/inspections/rounds/:id', element: <p>round page</p> },
    ],
    { path, me: makeMe(role) },
  );
  return { ...fetch, ...view };
}

describe('WorklistPage', () => {
  it('asks for the window, filters and sort in the URL and shows the counts of each window', async () => {
    const { requests } = renderList('registrar', `/inspections?window=overdue&risk=high&reason=light&assigneeId=none&sort=risk&bogus=1`);
    await screen.findByText('1984.7.1');
    const asked = requests.find((r) => r.path === '/api/inspections')!;
    expect(Object.fromEntries(asked.search)).toEqual({ page: '1', pageSize: '50', window: 'overdue', risk: 'high', reason: 'light', assigneeId: 'none', sort: 'risk' });
    const counts = screen.getByRole('group', { name: 'Due dates' });
    expect(within(counts).getByRole('button', { name: /3\s*Overdue/ }).getAttribute('aria-pressed')).toBe('true');
    expect(within(counts).getByRole('button', { name: /7\s*Due within 30 days/ })).toBeTruthy();
    expect(screen.getAllByText('12 days overdue')).toHaveLength(3);
    expect(screen.getByText('in 20 days')).toBeTruthy();
  });

  it('choosing a window or a filter goes to the URL and back to page 1', async () => {
    const { router, requests } = renderList('registrar', '/inspections?page=2');
    await screen.findByText('1984.7.1');
    fireEvent.click(screen.getByRole('button', { name: /Due within 30 days/ }));
    await waitFor(() => expect(router.state.location.search).toBe('?window=30'));
    fireEvent.change(screen.getByRole('combobox', { name: 'Risk' }), { target: { value: 'urgent' } });
    await waitFor(() => expect(router.state.location.search).toBe('?window=30&risk=urgent'));
    await waitFor(() => expect(requests.at(-1)?.search.get('risk')).toBe('urgent'));
  });

  it('a registrar reads the list but has no check boxes and cannot plan', async () => {
    renderList('registrar');
    await screen.findByText('1984.7.1');
    expect(screen.queryByRole('checkbox')).toBeNull();
    expect(screen.queryByRole('button', { name: /Plan these checks/ })).toBeNull();
  });

  it('a conservator chooses three prints and plans a round for them, titled by their shared place', async () => {
    const { requests, router } = renderList('conservator', '/inspections', { 'POST /api/inspection-rounds': () => json({ data: makeRound() }, 201) });
    await screen.findByText('1984.7.1');
    expect((screen.getByRole('button', { name: 'Plan these checks' }) as HTMLButtonElement).disabled).toBe(true);
    for (const n of [1, 2, 3]) fireEvent.click(screen.getByRole('checkbox', { name: `Choose 1984.7.${n}` }));
    fireEvent.click(screen.getByRole('button', { name: 'Plan these checks (3)' }));
    const form = await screen.findByRole('form', { name: 'Plan these checks' });
    expect((within(form).getByLabelText('Title') as HTMLInputElement).value).toBe('Checks in Drawer 2');
    await waitFor(() => expect((within(form).getByLabelText('Carried out by') as HTMLSelectElement).value).toBe(CONSERVATOR_ID));
    fireEvent.change(within(form).getByLabelText('Day of the round'), { target: { value: '2026-12-09' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Plan the round' }));
    await waitFor(() => expect(router.state.location.pathname).toBe(`/inspections/rounds/${ROUND_ID}`));
    const post = requests.find((r) => r.method === 'POST')!;
    expect(post.body).toEqual({ title: 'Checks in Drawer 2', plannedOn: '2026-12-09', assigneeId: CONSERVATOR_ID, printIds: PRINTS.slice(0, 3) });
    expect(post.headers['idempotency-key']).toBeTruthy();
  });

  it('refuses an empty title in the form, and shows the server\'s word on a field', async () => {
    const { requests } = renderList('conservator', '/inspections', {
      'POST /api/inspection-rounds': () =>
        errorResponse(400, 'validation_failed', 'The request has invalid fields.', {
          details: [{ path: 'assigneeId', message: 'This person cannot carry out checks; choose a conservator', code: 'not_allowed' }],
        }),
    });
    await screen.findByText('1984.7.1');
    fireEvent.click(screen.getByRole('checkbox', { name: 'Choose 1984.7.4' }));
    fireEvent.click(screen.getByRole('button', { name: 'Plan these checks (1)' }));
    const form = await screen.findByRole('form', { name: 'Plan these checks' });
    // South store alone: its deepest place is the shelf.
    expect((within(form).getByLabelText('Title') as HTMLInputElement).value).toBe('Checks in Shelf 1');
    fireEvent.change(within(form).getByLabelText('Title'), { target: { value: '  ' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Plan the round' }));
    expect((await within(form).findAllByText('Name the round')).length).toBeGreaterThan(0);
    expect(requests.some((r) => r.method === 'POST')).toBe(false);
    fireEvent.change(within(form).getByLabelText('Title'), { target: { value: 'South shelf' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Plan the round' }));
    expect((await within(form).findAllByText('This person cannot carry out checks; choose a conservator')).length).toBeGreaterThan(0);
  });
});
