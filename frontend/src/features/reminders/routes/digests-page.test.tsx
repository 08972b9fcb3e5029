import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import type { DigestSend } from '@toneledger/common/schemas/inspections';
import { json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { DigestsPage } from '@/features/reminders/routes/digests-page';

const failed: DigestSend = {
  id: '6f1f0c4e-6f8e-4a55-9d3b-1f2d3c4b5a60', user: { id: '0d9b3a1e-2f4c-4b6d-8e7f-9a0b1c2d3e4f', name: 'Tamsin Wrey', email: 'conservator@calder-reach.example' },
  week: '2026-W49', status: 'failed', attempts: 2, lastError: 'The mail server did not accept the message.', overdue: 3, due: 7, sentAt: null,
  createdAt: '2026-11-30T07:07:00.000Z',
};

describe('DigestsPage', () => {
  it('lists each digest with its state, attempts and error, and filters by state in the URL', async () => {
    const { requests } = mockFetch({ 'GET /api/digests': () => json({ data: [failed], pagination: { page: 1, pageSize: 50, total: 1 } }) });
    const { router } = renderPage(<DigestsPage />, { path: '/admin/digests', me: makeMe('admin') });
    expect(await screen.findByText('Tamsin Wrey')).toBeTruthy();
    expect(screen.getByText('2026-W49')).toBeTruthy();
    const row = screen.getByText('Tamsin Wrey').closest('tr')!;
    const cells = [...row.querySelectorAll('td')].map((td) => td.textContent);
    expect(cells).toEqual([
      'Tamsin Wreyconservator@calder-reach.example', '2026-W49', 'Failed, being tried again', '2', '3', '7', '—', 'The mail server did not accept the message.',
    ]);
    fireEvent.change(screen.getByLabelText('State'), { target: { value: 'failed' } });
    await waitFor(() => expect(router.state.location.search).toContain('status=failed'));
    await waitFor(() => expect(requests.at(-1)?.search.get('status')).toBe('failed'));
  });
});
