import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import { json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { ExhibitionsPage } from '@/features/exhibitions/routes/exhibitions-page';
import { makeExhibition } from '@/features/exhibitions/testing/fixtures';

const { objects: _objects, ...listed } = makeExhibition();

describe('ExhibitionsPage', () => {
  it('asks the API for exactly the filter in the URL', async () => {
    const { requests } = mockFetch({ 'GET /api/exhibitions': () => json({ data: [listed], pagination: { page: 1, pageSize: 50, total: 1 } }) });
    renderPage(<ExhibitionsPage />, { path: '/exhibitions?when=past&q=river&bogus=1', me: makeMe('viewer') });
    await screen.findByText(listed.title);
    expect(Object.fromEntries(requests[0]!.search)).toEqual({ page: '1', pageSize: '50', when: 'past', q: 'river' });
    expect(screen.getByRole('button', { name: 'Past' }).getAttribute('aria-pressed')).toBe('true');
  });

  it('puts current / coming / past in the URL and back to all', async () => {
    const { requests } = mockFetch({ 'GET /api/exhibitions': () => json({ data: [listed], pagination: { page: 1, pageSize: 50, total: 1 } }) });
    const { router } = renderPage(<ExhibitionsPage />, { path: '/exhibitions?page=2', me: makeMe('registrar') });
    await screen.findByText(listed.title);
    fireEvent.click(screen.getByRole('button', { name: 'Coming' }));
    await waitFor(() => expect(router.state.location.search).toBe('?when=coming'));
    await waitFor(() => expect(requests.at(-1)?.search.get('when')).toBe('coming'));
    expect(requests.at(-1)?.search.get('page')).toBe('1');
    fireEvent.click(screen.getByRole('button', { name: 'All' }));
    await waitFor(() => expect(router.state.location.search).toBe(''));
  });

  it('offers New exhibition to a registrar only', async () => {
    mockFetch({ 'GET /api/exhibitions': () => json({ data: [], pagination: { page: 1, pageSize: 50, total: 0 } }) });
    renderPage(<ExhibitionsPage />, { path: '/exhibitions', me: makeMe('conservator') });
    await screen.findByText('No exhibition matches these filters.');
    expect(screen.queryByRole('link', { name: 'New exhibition' })).toBeNull();
  });
});
