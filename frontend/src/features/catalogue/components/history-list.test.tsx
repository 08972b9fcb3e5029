import { describe, expect, it } from 'vitest';
import { screen, within } from '@testing-library/react';
import type { HistoryEvent } from '@toneledger/common/schemas/catalogue';
import { json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { HistoryList } from '@/features/catalogue/components/history-list';

const printId = '0b7c1c8e-2f57-4b39-9d7c-3f1e5b6a7c01';
const history: HistoryEvent[] = [
  {
    id: '3', at: '2025-02-03T10:15:00.000Z', actorName: 'Maren Oakshott', action: 'print.steps_replaced', summary: 'Process history edited',
    changes: [{
      field: 'steps', before: [],
      after: [{ type: 'toning', tonerClass: 'iron_blue', recipe: { id: 'r', name: 'Iron blue bath' }, timeSeconds: 240 }, { type: 'final_wash', timeSeconds: 1800 }],
    }],
  },
  { id: '2', at: '2025-02-02T09:00:00.000Z', actorName: 'Maren Oakshott', action: 'print.updated', summary: 'Edited status', changes: [{ field: 'status', before: 'in_store', after: 'in_treatment' }] },
  { id: '1', at: '2025-02-01T09:00:00.000Z', actorName: 'Ivo Lindqvist', action: 'print.moved', summary: 'Moved to Annex › Box 3', changes: [{ field: 'location', before: 'Store A', after: 'Annex › Box 3' }] },
];

describe('HistoryList', () => {
  it('tells each change as a sentence, with labels, labelled codes and m:ss times, never internal codes', async () => {
    mockFetch({ [`GET /api/prints/${printId}/history`]: () => json({ data: history }) });
    renderPage(<HistoryList printId={printId} accessionNumber="1979.3.12" />, { path: '/catalogue/prints/x', me: makeMe('registrar') });
    expect(await screen.findByText('Maren Oakshott replaced the process history of print 1979.3.12.')).toBeTruthy();
    expect(screen.getByText('Maren Oakshott edited print 1979.3.12.')).toBeTruthy();
    expect(screen.getByText('Ivo Lindqvist moved print 1979.3.12 to Annex › Box 3.')).toBeTruthy();
    const status = screen.getByRole('rowheader', { name: 'Status' }).closest('tr')!;
    expect(within(status).getByText('In store')).toBeTruthy();
    expect(within(status).getByText('In treatment')).toBeTruthy();
    const steps = screen.getByRole('rowheader', { name: 'Process history' }).closest('tr')!;
    expect(steps.textContent).toContain('1. Toning, Iron blue');
    expect(steps.textContent).toContain('Iron blue bath, 4:00');
    expect(steps.textContent).toContain('2. Final wash, 30:00');
    const text = document.body.textContent!;
    expect(text).not.toMatch(/in_store|in_treatment|iron_blue|print\.updated|240 s|\bsteps\b/);
  });
});
