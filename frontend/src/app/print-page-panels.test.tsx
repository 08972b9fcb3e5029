import { describe, expect, it } from 'vitest';
import { screen } from '@testing-library/react';
import type { Role } from '@toneledger/common/domain/roles';
import { routes } from '@/app/router';
import { json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';
import { PRINT_ID, makePrint, referenceHandlers } from '@/features/catalogue/testing/fixtures';
import { makePrintLight } from '@/features/light/testing/fixtures';

const SLOW = { timeout: 8000 };

/** The print page as the app composes it: the catalogue's page with the light panel added. */
function openPrint(role: Role) {
  const fetch = mockFetch({
    ...referenceHandlers(),
    'GET /api/me': () => json({ data: makeMe(role) }),
    [`GET /api/prints/${PRINT_ID}`]: () => json({ data: makePrint() }),
    [`GET /api/prints/${PRINT_ID}/movements`]: () => json({ data: [] }),
    [`GET /api/prints/${PRINT_ID}/history`]: () => json({ data: [] }),
    [`GET /api/prints/${PRINT_ID}/timeline`]: () => json({ data: [] }),
    [`GET /api/prints/${PRINT_ID}/light`]: () => json({ data: makePrintLight({ printId: PRINT_ID }) }),
    'GET /api/settings/measurements': () => json({ data: { noticeableDeltaE: 2 } }),
  });
  renderRoutes(routes, { path: `/catalogue/prints/${PRINT_ID}` });
  return fetch;
}

describe('the print page with its light panel', { timeout: 30_000 }, () => {
  it('shows a conservator the light dose and the change button', async () => {
    openPrint('conservator');
    expect(await screen.findByRole('heading', { level: 2, name: 'Light dose' }, SLOW)).toBeTruthy();
    expect(await screen.findByText('16,800 lx·h', {}, SLOW)).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Change category' })).toBeTruthy();
  });

  it('shows a viewer the print without the panel, and never asks for its light dose', async () => {
    const { requests } = openPrint('viewer');
    expect(await screen.findByRole('heading', { level: 2, name: 'Timeline' }, SLOW)).toBeTruthy();
    expect(screen.queryByRole('heading', { name: 'Light dose' })).toBeNull();
    expect(requests.filter((r) => r.path.endsWith('/light'))).toHaveLength(0);
  });
});
