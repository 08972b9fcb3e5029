import { describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { ROLE_DESCRIPTIONS, ROLE_LABELS, ROLES } from '@toneledger/common/domain/roles';
import { routes } from '@/app/router';
import { browser } from '@/lib/browser';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';

describe('signing in and out', () => {
  it('offers a visitor the sign-in button, returning to the page they asked for', async () => {
    mockFetch({ 'GET /api/me': () => errorResponse(401, 'unauthenticated', 'Sign in first.') });
    renderRoutes(routes, { path: '/admin/users?page=2' });

    const button = await screen.findByRole('button', { name: 'Sign in' });
    const form = button.closest('form');
    expect(form?.getAttribute('action')).toBe('/auth/login');
    expect(form?.getAttribute('method')).toBe('get');
    const returnTo = form?.querySelector<HTMLInputElement>('input[name="returnTo"]');
    expect(returnTo?.value).toBe('/admin/users?page=2');
    expect(screen.queryByRole('navigation', { name: 'Main' })).toBeNull();
  });

  it.each(ROLES)('shows a signed-in %s their name, role label and a sign-out button in the header', async (role) => {
    mockFetch({ 'GET /api/me': () => json({ data: makeMe(role) }) });
    renderRoutes(routes, { path: '/' });

    const header = await screen.findByRole('banner');
    expect(within(header).getByText('Iris Penhale')).toBeTruthy();
    expect(within(header).getByText(ROLE_LABELS[role])).toBeTruthy();
    expect(within(header).getByRole('button', { name: 'Sign out' })).toBeTruthy();
    expect(screen.getByRole('navigation', { name: 'Main' })).toBeTruthy();
    expect(await screen.findByRole('heading', { level: 1, name: /Iris Penhale/ })).toBeTruthy();
    // The role label appears once on the page, in the header, so locators for it are unambiguous.
    expect(screen.getAllByText(ROLE_LABELS[role])).toHaveLength(1);
    expect(screen.getByText(ROLE_DESCRIPTIONS[role])).toBeTruthy();
  });

  it('signs out on the server, then leaves for the address the server gives', async () => {
    const leave = vi.spyOn(browser, 'leaveTo').mockImplementation(() => {});
    const { requests } = mockFetch({
      'GET /api/me': () => json({ data: makeMe('viewer') }),
      'POST /auth/logout': () => json({ data: { redirectTo: 'http://idp.test/end-session?x=1' } }),
    });
    renderRoutes(routes, { path: '/' });

    fireEvent.click(await screen.findByRole('button', { name: 'Sign out' }));
    await waitFor(() => expect(leave).toHaveBeenCalledWith('http://idp.test/end-session?x=1'));
    const logout = requests.find((r) => r.path === '/auth/logout');
    expect(logout?.method).toBe('POST');
    expect(logout?.body).toEqual({});
    expect(logout?.headers['content-type']).toBe('application/json');
  });

  it('shows the signed-out page without asking the server who is signed in', async () => {
    const { requests } = mockFetch({});
    renderRoutes(routes, { path: '/signed-out' });
    expect(await screen.findByRole('heading', { name: 'You have signed out' })).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Sign in again' }).getAttribute('href')).toBe('/auth/login?returnTo=%2F');
    expect(requests).toHaveLength(0);
  });
});

describe('route guards and fallbacks', () => {
  it('shows "Not allowed" to a role without the permission, without requesting the data', async () => {
    const { requests } = mockFetch({ 'GET /api/me': () => json({ data: makeMe('researcher') }) });
    renderRoutes(routes, { path: '/admin/users' });
    expect(await screen.findByRole('heading', { name: 'Not allowed' })).toBeTruthy();
    expect(screen.getByText(/“People and roles” is not open to your role/)).toBeTruthy();
    expect(requests.map((r) => r.path)).toEqual(['/api/me']);
  });

  it('does not open the research area for a registrar', async () => {
    mockFetch({ 'GET /api/me': () => json({ data: makeMe('registrar') }) });
    renderRoutes(routes, { path: '/research' });
    // The area's screen (with its charts) is loaded before the guard shows, on a first import in the test.
    expect(await screen.findByRole('heading', { name: 'Not allowed' }, { timeout: 10_000 })).toBeTruthy();
  });

  it('treats outgoing mail as absent in production', async () => {
    mockFetch({ 'GET /api/me': () => json({ data: makeMe('admin', { environment: 'production' }) }) });
    renderRoutes(routes, { path: '/admin/mail' });
    expect(await screen.findByRole('heading', { name: 'Page not found' })).toBeTruthy();
  });

  it('shows "Page not found" for an unknown address, inside the shell', async () => {
    mockFetch({ 'GET /api/me': () => json({ data: makeMe('viewer') }) });
    renderRoutes(routes, { path: '/no/such/page' });
    expect(await screen.findByRole('heading', { name: 'Page not found' })).toBeTruthy();
    expect(screen.getByRole('navigation', { name: 'Main' })).toBeTruthy();
  });

  it('shows the message and request id when loading the session fails', async () => {
    vi.spyOn(console, 'error').mockImplementation(() => {});
    mockFetch({
      'GET /api/me': () => errorResponse(503, 'service_unavailable', 'The database is not answering.', { requestId: 'req-9f2' }),
    });
    renderRoutes(routes, { path: '/' });
    expect(await screen.findByRole('heading', { name: 'Something went wrong' })).toBeTruthy();
    expect(screen.getByText('The database is not answering.')).toBeTruthy();
    expect(screen.getByText('req-9f2')).toBeTruthy();
  });

  it('has a skip link to the main content', async () => {
    mockFetch({ 'GET /api/me': () => json({ data: makeMe('viewer') }) });
    renderRoutes(routes, { path: '/' });
    const skip = await screen.findByRole('link', { name: 'Skip to content' });
    expect(skip.getAttribute('href')).toBe('#main');
    expect(document.getElementById('main')?.tagName).toBe('MAIN');
  });
});
