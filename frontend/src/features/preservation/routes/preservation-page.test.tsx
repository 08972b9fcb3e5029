import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import type { BagJob } from '@toneledger/common/schemas/preservation';
import { json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { PreservationPage } from '@/features/preservation/routes/preservation-page';

const base: BagJob = {
  id: '1f0e7a52-3c1e-4f39-9a51-2f0d7b6c1e01', kind: 'export', scope: 'collection', selection: null, withImages: true, status: 'done', stage: null,
  done: 312, total: 312, sizeBytes: 52_428_800, payloadOxum: '52000000.700', fileCount: 700, problems: [], error: null,
  createdByName: 'Bram Otley', createdAt: '2026-12-02T10:00:00.000Z', startedAt: '2026-12-02T10:00:01.000Z', finishedAt: '2026-12-02T10:01:00.000Z', downloadable: true,
};
const failedImport: BagJob = {
  ...base, id: '2f0e7a52-3c1e-4f39-9a51-2f0d7b6c1e02', kind: 'import', status: 'failed', downloadable: false, sizeBytes: 1000, fileCount: null,
  error: 'The bag did not pass its check (1 problem); nothing was written.',
  problems: [{ path: 'data/prints/1987.12.json', message: 'Checksum mismatch: manifest-sha256.txt says aa, the file\'s sha256 is bb' }],
};

describe('PreservationPage', () => {
  it('lists exports and imports: a finished bag to download, a refused import with the file it names', async () => {
    mockFetch({
      'GET /api/preservation/jobs': () => json({ data: [base, failedImport] }),
      'GET /api/prints': () => json({ data: [], pagination: { page: 1, pageSize: 1, total: 4 } }),
    });
    renderPage(<PreservationPage />, { path: '/admin/preservation', me: makeMe('admin') });
    const rows = await screen.findAllByRole('row');
    const done = rows.find((r) => within(r).queryByText('The whole collection'))!;
    expect(within(done).getByRole('link', { name: 'Download' }).getAttribute('href')).toBe(`/api/preservation/jobs/${base.id}/bag.tar`);
    expect(within(done).getByText('50.0 MB')).toBeTruthy();
    const refused = rows.find((r) => within(r).queryByText('Import of a bag'))!;
    expect(within(refused).queryByRole('link')).toBeNull();
    expect(within(refused).getByText('data/prints/1987.12.json')).toBeTruthy();
    // The catalogue holds prints: bringing a bag in is not offered.
    await screen.findByText(/already holds prints/);
    expect((screen.getByRole('button', { name: 'Upload and bring in' }) as HTMLButtonElement).disabled).toBe(true);
  });

  it('starts an export of the whole collection with the choice about images', async () => {
    const { requests } = mockFetch({
      'GET /api/preservation/jobs': () => json({ data: [] }),
      'GET /api/prints': () => json({ data: [], pagination: { page: 1, pageSize: 1, total: 0 } }),
      'POST /api/preservation/exports': () => json({ data: { ...base, status: 'queued', downloadable: false } }, 202),
    });
    renderPage(<PreservationPage />, { path: '/admin/preservation', me: makeMe('admin') });
    await screen.findByText(/No bag has been written/);
    fireEvent.click(screen.getByLabelText(/Include the image files/));
    fireEvent.click(screen.getByRole('button', { name: 'Start the export' }));
    await waitFor(() => expect(requests.some((r) => r.method === 'POST')).toBe(true));
    const post = requests.find((r) => r.method === 'POST')!;
    expect(post.body).toEqual({ scope: 'collection', withImages: false });
    await screen.findByText(/Started: follow it/);
  });
});
