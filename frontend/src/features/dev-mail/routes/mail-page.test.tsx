import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import type { CapturedMail } from '@toneledger/common/schemas/system';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { MailPage } from '@/features/dev-mail/routes/mail-page';

const digest: CapturedMail = {
  id: 'm-1',
  receivedAt: '2025-02-03T07:00:00.000Z',
  from: 'toneledger@localhost',
  to: ['iris.penhale@example.test'],
  subject: 'Prints due for inspection this week',
  text: 'Three prints are due for inspection.\nTL-1961-004 is overdue.',
  html: '<p>Three prints are due</p>',
};

describe('MailPage', () => {
  it('lists caught messages and shows the text of the one selected', async () => {
    const { router } = (() => {
      mockFetch({ 'GET /api/dev/mail': () => json({ data: [digest] }) });
      return renderPage(<MailPage />, { path: '/admin/mail', me: makeMe('admin') });
    })();
    fireEvent.click(await screen.findByRole('button', { name: /Prints due for inspection this week/ }));
    await waitFor(() => expect(router.state.location.search).toBe('?message=m-1'));
    expect(screen.getByRole('heading', { level: 2, name: 'Prints due for inspection this week' })).toBeTruthy();
    expect(screen.getByText(/TL-1961-004 is overdue/)).toBeTruthy();
  });

  it('sends a test message and says so', async () => {
    const { requests } = mockFetch({
      'GET /api/dev/mail': () => json({ data: [] }),
      'POST /api/dev/mail/test': () => json({ data: { messageId: '<abc@toneledger>' } }),
    });
    renderPage(<MailPage />, { path: '/admin/mail', me: makeMe('admin') });
    await screen.findByText('No messages caught yet.');
    fireEvent.change(screen.getByLabelText('To'), { target: { value: 'desk@example.test' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send a test message' }));
    expect(await screen.findByText('<abc@toneledger>')).toBeTruthy();
    expect(requests.find((r) => r.method === 'POST')?.body).toEqual({ to: 'desk@example.test' });
  });

  it('checks the address before sending, using the shared schema', async () => {
    const { requests } = mockFetch({ 'GET /api/dev/mail': () => json({ data: [] }) });
    renderPage(<MailPage />, { path: '/admin/mail', me: makeMe('admin') });
    await screen.findByText('No messages caught yet.');
    fireEvent.change(screen.getByLabelText('To'), { target: { value: 'not an address' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send a test message' }));
    expect(await screen.findByText('Enter an e-mail address')).toBeTruthy();
    expect(requests.some((r) => r.method === 'POST')).toBe(false);
  });

  it('shows a server refusal', async () => {
    mockFetch({
      'GET /api/dev/mail': () => json({ data: [] }),
      'POST /api/dev/mail/test': () => errorResponse(503, 'service_unavailable', 'The mail sink is not running.'),
    });
    renderPage(<MailPage />, { path: '/admin/mail', me: makeMe('admin') });
    await screen.findByText('No messages caught yet.');
    fireEvent.click(screen.getByRole('button', { name: 'Send a test message' }));
    expect((await screen.findByRole('alert')).textContent).toContain('The mail sink is not running.');
  });
});
