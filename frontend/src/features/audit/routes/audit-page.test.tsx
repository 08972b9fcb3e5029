import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import type { AuditEvent } from '@toneledger/common/schemas/audit';
import { json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { AuditPage } from '@/features/audit/routes/audit-page';
import { changedFields } from '@/features/audit/components/change-view';

const actorId = '5d0c0f5e-8a7b-4c2d-9e1f-112233445566';
const roleChange: AuditEvent = {
  id: 'ev-2',
  at: '2025-02-03T10:15:00.000Z',
  actorId,
  actorName: 'Iris Penhale',
  action: 'user.role_changed',
  entityType: 'user',
  entityId: '0b7c1c8e-2f57-4b39-9d7c-3f1e5b6a7c01',
  before: { role: 'registrar', name: 'Ada Marsh' },
  after: { role: 'conservator', name: 'Ada Marsh' },
  requestId: 'req-77',
};
const signIn: AuditEvent = { ...roleChange, id: 'ev-1', action: 'session.signed_in', entityType: 'session', entityId: null, before: null, after: null };

describe('changedFields', () => {
  it('names the top-level fields that differ', () => {
    expect(changedFields({ role: 'a', name: 'x', n: [1] }, { role: 'b', name: 'x', n: [1, 2] })).toEqual(['n', 'role']);
    expect(changedFields(null, { role: 'b' })).toEqual(['role']);
    expect(changedFields(null, null)).toEqual([]);
  });
});

describe('AuditPage', () => {
  it('opens a change to show its before and after, and only for events that have them', async () => {
    mockFetch({ 'GET /api/audit': () => json({ data: [roleChange, signIn], pagination: { page: 1, pageSize: 50, total: 2 } }) });
    renderPage(<AuditPage />, { path: '/admin/audit', me: makeMe('admin') });

    const toggles = await screen.findAllByRole('button', { name: 'Show changes' });
    expect(toggles).toHaveLength(1);
    fireEvent.click(toggles[0]!);
    expect(screen.getByRole('button', { name: 'Hide changes' }).getAttribute('aria-expanded')).toBe('true');
    expect(screen.getByRole('heading', { name: 'Before' })).toBeTruthy();
    expect(screen.getByText(/"role": "registrar"/)).toBeTruthy();
    expect(screen.getByText(/"role": "conservator"/)).toBeTruthy();
    expect(screen.getByText('Changed:').textContent).toContain('role');
  });

  it('filters by action and record through the URL and the API query', async () => {
    const { requests } = mockFetch({ 'GET /api/audit': () => json({ data: [roleChange], pagination: { page: 1, pageSize: 50, total: 1 } }) });
    const { router } = renderPage(<AuditPage />, { path: '/admin/audit?page=3', me: makeMe('admin') });
    await screen.findByText('user.role_changed', { selector: 'button' });

    fireEvent.change(screen.getByLabelText('Action'), { target: { value: 'user.role_changed' } });
    fireEvent.change(screen.getByLabelText('Record type'), { target: { value: 'user' } });
    fireEvent.click(screen.getByRole('button', { name: 'Filter' }));
    await waitFor(() => expect(router.state.location.search).toBe('?action=user.role_changed&entityType=user'));
    await waitFor(() => expect(Object.fromEntries(requests.at(-1)!.search)).toEqual({ page: '1', pageSize: '50', action: 'user.role_changed', entityType: 'user' }));

    fireEvent.click(screen.getByRole('button', { name: /show only this person's events/ }));
    await waitFor(() => expect(requests.at(-1)?.search.get('actorId')).toBe(actorId));
  });

  it('refuses a malformed person id before asking the server', async () => {
    const { requests } = mockFetch({ 'GET /api/audit': () => json({ data: [], pagination: { page: 1, pageSize: 50, total: 0 } }) });
    renderPage(<AuditPage />, { path: '/admin/audit', me: makeMe('admin') });
    await screen.findByText('No events match these filters.');
    fireEvent.change(screen.getByLabelText('Person id'), { target: { value: 'iris' } });
    fireEvent.click(screen.getByRole('button', { name: 'Filter' }));
    expect(await screen.findByText(/A person id looks like/)).toBeTruthy();
    expect(requests).toHaveLength(1);
  });
});
