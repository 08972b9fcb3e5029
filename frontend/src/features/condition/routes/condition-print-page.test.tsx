import { afterEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import type { Role } from '@toneledger/common/domain/roles';
import { FakeXhr } from '@/test/fake-xhr';
import { json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';
import { ConditionPrintPage } from '@/features/condition/routes/condition-print-page';
import { IMAGE_NEW, IMAGE_OLD, PRINT_ID, conditionHandlers, makeImage, makeReport } from '@/features/condition/testing/fixtures';

afterEach(() => {
  FakeXhr.sent = [];
});

function renderPage(role: Role) {
  const fetch = mockFetch({
    ...conditionHandlers(),
    [`GET /api/prints/${PRINT_ID}/condition-reports`]: () =>
      json({ data: [makeReport({ status: 'signed', grade: 'poor', examinerName: 'Bram Otley', addenda: [{ id: 'd1111111-2222-4333-8444-555555555555', writtenAt: '2024-04-01T10:00:00.000Z', authorName: 'Iris Penhale', text: 'x' }] })] }),
  });
  const view = renderRoutes([{ path: '/condition/prints/:id', element: <ConditionPrintPage /> }], { path: `/condition/prints/${PRINT_ID}`, me: makeMe(role) });
  return { ...fetch, ...view };
}

const envelope = (status: number, code: string, message: string) => ({ status, body: { error: { code, message, status, requestId: `req-${status}` } } });

describe('ConditionPrintPage', () => {
  it('shows the print, its reports and images, with the controls of a conservator', async () => {
    renderPage('conservator');
    expect(await screen.findByRole('heading', { level: 1, name: '1987.14.3' })).toBeTruthy();
    expect(screen.getByRole('heading', { level: 1 }).parentElement?.textContent).toMatch(/Iron blue \(Prussian blue\) · 1 warning/);
    const reports = screen.getByRole('region', { name: 'Condition reports' });
    const row = (await within(reports).findByText('Bram Otley')).closest('tr')!;
    expect(row.textContent).toContain('Poor');
    expect(row.textContent).toContain('Signed');
    expect(row.textContent).toContain('Routine check');
    expect(within(reports).getByRole('button', { name: 'New condition report' })).toBeTruthy();

    const images = screen.getByRole('region', { name: 'Images' });
    fireEvent.click(await within(images).findByRole('button', { name: /Verso/ }));
    expect(within(images).getByText('Camera Co Model 5')).toBeTruthy();
    expect(within(images).getByText('1/125 s · f/8 · ISO 100 · 50 mm')).toBeTruthy();
    expect(within(images).getByRole('button', { name: 'Edit details' })).toBeTruthy();

    // Compare defaults to the earliest and the latest recto.
    const compare = screen.getByRole('region', { name: 'Compare' });
    expect(within(compare).getByRole('link', { name: 'Compare these images' }).getAttribute('href')).toBe(
      `/condition/prints/${PRINT_ID}/compare?a=${IMAGE_OLD}&b=${IMAGE_NEW}`,
    );
  });

  it('shows a viewer the images only: no reports, no upload, no editing', async () => {
    const { requests } = renderPage('viewer');
    await screen.findByRole('heading', { level: 1, name: '1987.14.3' });
    expect(screen.queryByRole('region', { name: 'Condition reports' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Upload' })).toBeNull();
    fireEvent.click(await screen.findByRole('button', { name: /Verso/ }));
    expect(screen.queryByRole('button', { name: 'Edit details' })).toBeNull();
    expect(requests.some((r) => r.path.endsWith('/condition-reports'))).toBe(false);
  });

  it('uploads files one after another, each with its own view type, and says per file what failed', async () => {
    vi.stubGlobal('XMLHttpRequest', FakeXhr);
    FakeXhr.answer = (xhr) => {
      const file = xhr.body?.get('file') as File;
      if (file.name === 'notes.txt') return envelope(415, 'unsupported_media_type', 'The file is not an image (its content was checked).');
      if (file.name === 'huge.tif') return envelope(413, 'payload_too_large', 'The file is larger than 300 MB.');
      return { status: 201, body: { data: makeImage({ id: 'b9111111-2222-4333-8444-555555555555', derivatives: 'pending', urls: { thumb: null, screen: null, original: null } }) } };
    };
    renderPage('conservator');
    const images = await screen.findByRole('region', { name: 'Images' });
    const files = [new File(['a'], 'verso-2024.jpg', { type: 'image/jpeg' }), new File(['b'], 'notes.txt', { type: 'text/plain' }), new File(['c'], 'huge.tif', { type: 'image/tiff' })];
    fireEvent.change(within(images).getByLabelText('Choose images'), { target: { files } });
    const list = within(images).getByRole('list', { name: 'Files to upload' });
    const first = within(list).getByRole('listitem', { name: 'verso-2024.jpg' });
    fireEvent.change(within(first).getByLabelText('View type'), { target: { value: 'verso' } });
    fireEvent.change(within(first).getByLabelText('Captured on'), { target: { value: '2024-02-01' } });
    fireEvent.click(within(images).getByRole('button', { name: 'Upload' }));

    await waitFor(() => expect(FakeXhr.sent).toHaveLength(3));
    const notes = within(list).getByRole('listitem', { name: 'notes.txt' });
    const huge = within(list).getByRole('listitem', { name: 'huge.tif' });
    expect((await within(notes).findByRole('alert')).textContent).toContain('Not an image this system accepts');
    expect((await within(huge).findByRole('alert')).textContent).toContain('The file is larger than 300 MB.');
    expect(within(huge).getByRole('alert').textContent).toContain('req-413');
    await waitFor(() => expect(within(first).getByText('Uploaded')).toBeTruthy());
    expect(within(first).queryByRole('alert')).toBeNull();

    const sent = FakeXhr.sent[0]!;
    expect(sent.method).toBe('POST');
    expect(sent.url).toBe(`/api/prints/${PRINT_ID}/images`);
    expect(sent.body?.get('viewType')).toBe('verso');
    expect(sent.body?.get('capturedOn')).toBe('2024-02-01');
    expect(FakeXhr.sent[1]?.body?.get('viewType')).toBe('recto');
    expect(FakeXhr.sent[1]?.body?.get('capturedOn')).toBeNull();
    // The failed files keep their place and choices, and can be sent again.
    expect(within(images).getByRole('button', { name: 'Upload' }).hasAttribute('disabled')).toBe(false);
  });
});
