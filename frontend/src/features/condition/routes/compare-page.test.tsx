import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import type { Role } from '@toneledger/common/domain/roles';
import { json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';
import { ComparePage } from '@/features/condition/routes/compare-page';
import { IMAGE_NEW, IMAGE_OLD, PRINT_ID, conditionHandlers } from '@/features/condition/testing/fixtures';

function renderCompare(role: Role, saved: unknown = null, path = `/condition/prints/${PRINT_ID}/compare?a=${IMAGE_OLD}&b=${IMAGE_NEW}`) {
  const fetch = mockFetch({
    ...conditionHandlers(),
    'GET /api/image-alignments': () => json({ data: saved }),
    'PUT /api/image-alignments': (r) => json({ data: { ...(r.body as object), id: 'e1111111-2222-4333-8444-555555555555', savedBy: 'Iris Penhale', savedAt: '2024-05-01T10:00:00.000Z' } }),
  });
  const view = renderRoutes([{ path: '/condition/prints/:id/compare', element: <ComparePage /> }], { path, me: makeMe(role) });
  return { ...fetch, ...view };
}

describe('ComparePage', () => {
  it('warns when the earlier image was made after the later one, and swaps them on request', async () => {
    const { router } = renderCompare('viewer', null, `/condition/prints/${PRINT_ID}/compare?a=${IMAGE_NEW}&b=${IMAGE_OLD}`);
    const warning = await screen.findByRole('alert');
    expect(warning.textContent).toMatch(/earlier image \(2024-03-11\) was made after the later one \(1995-05-02\)/);
    fireEvent.click(screen.getByRole('button', { name: 'Swap them' }));
    await waitFor(() => expect(router.state.location.search).toBe(`?a=${IMAGE_OLD}&b=${IMAGE_NEW}`));
    await waitFor(() => expect(screen.queryByRole('alert')).toBeNull());
  });

  it('shows the two images side by side with their dates', async () => {
    renderCompare('viewer');
    expect(await screen.findByRole('img', { name: 'Earlier: Recto · 2 May 1995' })).toBeTruthy();
    expect(screen.getByRole('img', { name: 'Later: Recto · 11 Mar 2024' })).toBeTruthy();
  });

  it('opens on the earliest and latest recto when the address names none', async () => {
    renderCompare('viewer', null, `/condition/prints/${PRINT_ID}/compare`);
    expect(((await screen.findByLabelText('Earlier image')) as HTMLSelectElement).value).toBe(IMAGE_OLD);
    expect((screen.getByLabelText('Later image') as HTMLSelectElement).value).toBe(IMAGE_NEW);
  });

  it('reveals the later image with the slider, and saves the alignment set with nudges, keys and fields', async () => {
    const { requests } = renderCompare('conservator');
    fireEvent.click(await screen.findByLabelText('Overlay'));
    const reveal = (await screen.findByLabelText('Reveal')) as HTMLInputElement;
    expect(reveal.value).toBe('50');
    fireEvent.change(reveal, { target: { value: '70' } });
    expect(screen.getByTestId('overlay-clip').style.clipPath).toBe('inset(0 30% 0 0)');

    fireEvent.click(screen.getByRole('button', { name: 'Nudge right' }));
    fireEvent.click(screen.getByRole('button', { name: 'Nudge right' }));
    const overlay = screen.getByRole('group', { name: /arrow keys move the later image/ });
    fireEvent.keyDown(overlay, { key: 'ArrowDown', shiftKey: true });
    fireEvent.keyDown(overlay, { key: 'ArrowUp' });
    fireEvent.change(screen.getByLabelText('Scale'), { target: { value: '1.02' } });
    expect(screen.getByTestId('overlay-transform').style.transform).toBe('translate(0.2%, 0.9%) rotate(0deg) scale(1.02)');

    fireEvent.click(screen.getByRole('button', { name: 'Save alignment' }));
    expect(await screen.findByText(/Alignment saved/)).toBeTruthy();
    expect(requests.find((r) => r.method === 'PUT')?.body).toEqual({
      baseImageId: IMAGE_OLD, otherImageId: IMAGE_NEW, offsetX: 0.002, offsetY: 0.009, scale: 1.02, rotationDeg: 0,
    });
  });

  it('starts from the saved alignment, asked for this pair', async () => {
    const { requests } = renderCompare('researcher', {
      id: 'e1111111-2222-4333-8444-555555555555', baseImageId: IMAGE_OLD, otherImageId: IMAGE_NEW, offsetX: -0.05, offsetY: 0.01, scale: 0.98, rotationDeg: 1.5,
      savedBy: 'Bram Otley', savedAt: '2024-05-01T10:00:00.000Z',
    });
    fireEvent.click(await screen.findByLabelText('Overlay'));
    await waitFor(() => expect((screen.getByLabelText('Offset x (% of width)') as HTMLInputElement).value).toBe('-5'));
    expect(screen.getByTestId('overlay-transform').style.transform).toBe('translate(-5%, 1%) rotate(1.5deg) scale(0.98)');
    const get = requests.find((r) => r.path === '/api/image-alignments');
    expect(get?.search.get('baseImageId')).toBe(IMAGE_OLD);
    expect(get?.search.get('otherImageId')).toBe(IMAGE_NEW);
    // A researcher may line the images up but not save.
    expect(screen.queryByRole('button', { name: 'Save alignment' })).toBeNull();
  });
});
