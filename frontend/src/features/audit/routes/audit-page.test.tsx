import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import type { AuditEvent } from '@toneledger/common/schemas/audit';
import { json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { AuditPage } from '@/features/audit/routes/audit-page';

const actorId = '5d0c0f5e-8a7b-4c2d-9e1f-112233445566';
const statusChange: AuditEvent = {
  id: 'ev-2',
  at: '2025-02-03T10:15:00.000Z',
  actorId,
  actorName: 'Iris Penhale',
  action: 'print.updated',
  entityType: 'print',
  entityId: '0b7c1c8e-2f57-4b39-9d7c-3f1e5b6a7c01',
  before: { status: 'in_store' },
  after: { status: 'in_treatment' },
  requestId: 'req-77',
  sentence: 'Iris Penhale edited print 1979.3.12.',
  actionLabel: 'Print edited',
  changes: [{ field: 'status', label: 'Status', before: 'In store', after: 'In treatment' }],
  record: { kind: 'Print', name: '1979.3.12', link: { page: 'print', id: '0b7c1c8e-2f57-4b39-9d7c-3f1e5b6a7c01' } },
};
const signIn: AuditEvent = {
  ...statusChange, id: 'ev-1', action: 'session.signed_in', entityType: 'user', entityId: actorId, before: null, after: null,
  sentence: 'Iris Penhale signed in.', actionLabel: 'Signed in', changes: [], record: { kind: 'Person', name: 'Iris Penhale', link: null },
};
const choices = {
  data: {
    people: [{ id: actorId, name: 'Iris Penhale' }, { id: '6e1d1f6f-9b8c-4d3e-8f20-223344556677', name: 'Maren Oakshott' }],
    actions: [{ code: 'print.updated', label: 'Print edited' }, { code: 'print.steps_replaced', label: 'Process history replaced' }],
    recordKinds: [{ code: 'condition_report', label: 'Condition report' }, { code: 'user', label: 'Person' }, { code: 'print', label: 'Print' }],
  },
};

describe('AuditPage', () => {
  it('shows each event as a sentence and its changes by label with readable values, never the raw snapshot', async () => {
    mockFetch({ 'GET /api/audit': () => json({ data: [statusChange, signIn], pagination: { page: 1, pageSize: 50, total: 2 } }), 'GET /api/audit/choices': () => json(choices) });
    renderPage(<AuditPage />, { path: '/admin/audit', me: makeMe('admin') });

    expect(await screen.findByText('Iris Penhale edited print 1979.3.12.')).toBeTruthy();
    expect(screen.getByText('Iris Penhale signed in.')).toBeTruthy();
    const toggles = screen.getAllByRole('button', { name: 'Show changes' });
    expect(toggles).toHaveLength(1);
    fireEvent.click(toggles[0]!);
    const table = screen.getByRole('table', { name: 'Fields changed, before and after' });
    expect(within(table).getByRole('rowheader', { name: 'Status' })).toBeTruthy();
    expect(within(table).getByText('In store')).toBeTruthy();
    expect(within(table).getByText('In treatment')).toBeTruthy();
    expect(document.body.textContent).not.toMatch(/in_store|in_treatment|print\.updated|\{"/);
  });

  it('filters by a picked person, a picked action and a range of days, through the URL and the API query; the export follows', async () => {
    const { requests } = mockFetch({
      'GET /api/audit': () => json({ data: [statusChange], pagination: { page: 1, pageSize: 50, total: 1 } }),
      'GET /api/audit/choices': () => json(choices),
    });
    const { router } = renderPage(<AuditPage />, { path: '/admin/audit?page=3', me: makeMe('admin') });
    await screen.findByRole('option', { name: 'Maren Oakshott' });

    fireEvent.change(screen.getByLabelText('Person'), { target: { value: actorId } });
    fireEvent.change(screen.getByLabelText('Action'), { target: { value: 'print.steps_replaced' } });
    fireEvent.change(screen.getByLabelText('From (day)'), { target: { value: '2025-01-01' } });
    fireEvent.change(screen.getByLabelText('To (day)'), { target: { value: '2025-01-31' } });
    fireEvent.click(screen.getByRole('button', { name: 'Filter' }));
    await waitFor(() => expect(router.state.location.search).toBe(`?actorId=${actorId}&action=print.steps_replaced&from=2025-01-01&to=2025-01-31`));
    await waitFor(() =>
      expect(Object.fromEntries(requests.filter((r) => r.path === '/api/audit').at(-1)!.search)).toEqual({
        page: '1', pageSize: '50', actorId, action: 'print.steps_replaced', from: '2025-01-01', to: '2025-01-31',
      }),
    );
    const csv = screen.getByRole('link', { name: 'Export CSV' }).getAttribute('href')!;
    expect(csv.startsWith('/api/audit/export.csv?')).toBe(true);
    expect(Object.fromEntries(new URL(csv, 'http://x').searchParams)).toEqual({ actorId, action: 'print.steps_replaced', from: '2025-01-01', to: '2025-01-31' });
  });

  it('names each record by its kind and name, links it to its page, and never shows its id; "Show changes" sits in the event, with no empty column', async () => {
    mockFetch({ 'GET /api/audit': () => json({ data: [statusChange, signIn], pagination: { page: 1, pageSize: 50, total: 2 } }), 'GET /api/audit/choices': () => json(choices) });
    renderPage(<AuditPage />, { path: '/admin/audit', me: makeMe('admin') });
    const link = await screen.findByRole('link', { name: '1979.3.12' });
    expect(link.getAttribute('href')).toBe(`/catalogue/prints/${statusChange.entityId}`);
    const table = screen.getByRole('table', { name: 'Audit events' });
    expect(within(table).getAllByRole('columnheader').map((h) => h.textContent)).toEqual(['When', 'Who', 'What happened', 'Record']);
    const [, changed, signedIn] = within(table).getAllByRole('row');
    // The toggle is in the "What happened" cell of the event with changes; the sign-in has none.
    expect(within(within(changed!).getAllByRole('cell')[2]!).getByRole('button', { name: 'Show changes' })).toBeTruthy();
    expect(within(signedIn!).queryByRole('button', { name: /changes/ })).toBeNull();
    expect(within(within(signedIn!).getAllByRole('cell')[3]!).getByText('Person')).toBeTruthy();
    expect(within(signedIn!).getAllByRole('cell')[3]!.textContent).toContain('Iris Penhale');
    const text = document.body.textContent!;
    expect(text).not.toContain(statusChange.entityId!);
    expect(text).not.toContain(actorId);
    expect(text).not.toContain('req-77');
    expect(text).not.toMatch(/condition_report|\buser\b|\bsession\b/);
  });

  it('never shows a person\'s id in place of a missing name', async () => {
    const unnamed: AuditEvent = { ...signIn, id: 'ev-3', actorName: null, sentence: 'The system signed in.', record: { kind: 'Person', name: null, link: null } };
    mockFetch({ 'GET /api/audit': () => json({ data: [unnamed], pagination: { page: 1, pageSize: 50, total: 1 } }), 'GET /api/audit/choices': () => json(choices) });
    renderPage(<AuditPage />, { path: '/admin/audit', me: makeMe('admin') });
    expect(await screen.findByRole('button', { name: "A person without a name: show only this person's events" })).toBeTruthy();
    expect(document.body.textContent).not.toContain(actorId);
  });

  it('picks the kind of record from its labels, and shows one record chosen from the table as a chip that clears', async () => {
    const { requests } = mockFetch({ 'GET /api/audit': () => json({ data: [statusChange], pagination: { page: 1, pageSize: 50, total: 1 } }), 'GET /api/audit/choices': () => json(choices) });
    const { router } = renderPage(<AuditPage />, { path: '/admin/audit', me: makeMe('admin') });
    await screen.findByRole('option', { name: 'Condition report' });
    expect(screen.queryByRole('textbox', { name: /record/i })).toBeNull();
    fireEvent.change(screen.getByLabelText('Record type'), { target: { value: 'condition_report' } });
    fireEvent.click(screen.getByRole('button', { name: 'Filter' }));
    await waitFor(() => expect(router.state.location.search).toBe('?entityType=condition_report'));

    // The page of that kind has come (the table is no longer the previous page, busy).
    await waitFor(() => expect(screen.getByRole('table', { name: 'Audit events' }).getAttribute('aria-busy')).toBeNull());
    fireEvent.click(screen.getByRole('button', { name: 'Show only the events of Print 1979.3.12' }));
    await waitFor(() => expect(router.state.location.search).toBe(`?entityType=print&entityId=${statusChange.entityId}`));
    await waitFor(() => expect(Object.fromEntries(requests.filter((r) => r.path === '/api/audit').at(-1)!.search)).toMatchObject({ entityType: 'print', entityId: statusChange.entityId }));
    expect(await screen.findByText('Only this record: Print 1979.3.12')).toBeTruthy();
    expect((screen.getByLabelText('Record type') as HTMLSelectElement).value).toBe('print');
    // The export keeps the record's id, so the file holds the same events.
    const csv = new URL(screen.getByRole('link', { name: 'Export CSV' }).getAttribute('href')!, 'http://x');
    expect(csv.searchParams.get('entityId')).toBe(statusChange.entityId);

    fireEvent.click(screen.getByRole('button', { name: 'Show every record, not only Print 1979.3.12' }));
    await waitFor(() => expect(router.state.location.search).toBe('?entityType=print'));
    expect(screen.queryByText(/Only this record:/)).toBeNull();
  });

  it('refuses a range that ends before it starts without asking the server', async () => {
    const { requests } = mockFetch({ 'GET /api/audit': () => json({ data: [], pagination: { page: 1, pageSize: 50, total: 0 } }), 'GET /api/audit/choices': () => json(choices) });
    renderPage(<AuditPage />, { path: '/admin/audit', me: makeMe('admin') });
    await screen.findByText('No events match these filters.');
    const before = requests.filter((r) => r.path === '/api/audit').length;
    fireEvent.change(screen.getByLabelText('From (day)'), { target: { value: '2025-02-01' } });
    fireEvent.change(screen.getByLabelText('To (day)'), { target: { value: '2025-01-01' } });
    fireEvent.click(screen.getByRole('button', { name: 'Filter' }));
    expect(await screen.findByText('The last day comes on or after the first')).toBeTruthy();
    expect(requests.filter((r) => r.path === '/api/audit')).toHaveLength(before);
  });
});
