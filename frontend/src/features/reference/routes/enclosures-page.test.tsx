import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { makeEnclosure, page } from '@/features/reference/testing/fixtures';
import { EnclosuresPage } from '@/features/reference/routes/enclosures-page';

const folder = makeEnclosure();
const box = makeEnclosure({ id: '66666666-6666-4666-8666-666666666666', name: 'Buffered box', alkalineBuffered: true, patResult: 'not_tested', printCount: 3 });

function type(field: HTMLElement, value: string) {
  fireEvent.change(field, { target: { value } });
}

describe('EnclosuresPage', () => {
  it('lists enclosure types with print counts, and marks buffered ones as unsuitable for iron-blue prints', async () => {
    mockFetch({ 'GET /api/enclosures': () => json(page([folder, box])) });
    renderPage(<EnclosuresPage />, { path: '/catalogue/enclosures', me: makeMe('researcher') });
    const row = (await screen.findByText('Buffered box')).closest('tr')!;
    expect(row.textContent).toContain('Not for cyanotypes or iron-blue toned prints');
    expect(within(row).getAllByRole('cell').at(-1)?.textContent).toBe('3');
    expect(screen.getByText('Four-flap folder').closest('tr')!.textContent).not.toContain('Not for cyanotypes');
    // Researchers read only.
    expect(screen.queryByRole('button', { name: 'New enclosure type' })).toBeNull();
    expect(screen.queryByRole('button', { name: /^Edit/ })).toBeNull();
  });

  it('sends alkalineBuffered null for "unknown", explains the choices, and warns when buffered is chosen', async () => {
    const { requests } = mockFetch({
      'GET /api/enclosures': () => json(page([folder])),
      'POST /api/enclosures': (request) => json({ data: { ...makeEnclosure(), ...(request.body as object), id: '77777777-7777-4777-8777-777777777777', version: 1 } }, 201),
    });
    renderPage(<EnclosuresPage />, { path: '/catalogue/enclosures', me: makeMe('registrar') });
    fireEvent.click(await screen.findByRole('button', { name: 'New enclosure type' }));
    const panel = screen.getByRole('dialog', { name: 'New enclosure type' });

    type(within(panel).getByLabelText('Name'), 'Polyester sleeve');
    const buffered = within(panel).getByLabelText('Alkaline-buffered');
    expect(buffered.getAttribute('aria-describedby')).toBeTruthy();
    expect(within(panel).getByText(/alkaline reserve/)).toBeTruthy();
    expect(within(panel).getByText(/Photographic Activity Test \(ISO 18916\).*ISO 18902 asks enclosure materials for photographs to pass it/)).toBeTruthy();

    type(buffered, 'yes');
    expect(within(panel).getByText(/Buffered enclosures are unsuitable for cyanotypes and iron-blue toned prints/)).toBeTruthy();
    type(buffered, 'unknown');
    expect(within(panel).queryByText(/Buffered enclosures are unsuitable/)).toBeNull();
    type(within(panel).getByLabelText('Photographic Activity Test'), 'passed');
    fireEvent.click(within(panel).getByRole('button', { name: 'Save' }));

    expect(await screen.findByText('Added enclosure type “Polyester sleeve”.')).toBeTruthy();
    const post = requests.find((r) => r.method === 'POST');
    expect(post?.body).toEqual({ name: 'Polyester sleeve', material: null, alkalineBuffered: null, patResult: 'passed', notes: null });
    // The list is fetched again after the save.
    await waitFor(() => expect(requests.filter((r) => r.method === 'GET')).toHaveLength(2));
  });

  it('sends true and false for yes and no', async () => {
    const { requests } = mockFetch({
      'GET /api/enclosures': () => json(page([folder])),
      [`PATCH /api/enclosures/${folder.id}`]: () => json({ data: { ...folder, alkalineBuffered: true, version: 4 } }),
    });
    renderPage(<EnclosuresPage />, { path: '/catalogue/enclosures', me: makeMe('admin') });
    fireEvent.click(await screen.findByRole('button', { name: 'Edit Four-flap folder' }));
    expect(screen.getByLabelText<HTMLSelectElement>('Alkaline-buffered').value).toBe('no');
    type(screen.getByLabelText('Alkaline-buffered'), 'yes');
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    await screen.findByText('Saved enclosure type “Four-flap folder”.');
    expect(requests.find((r) => r.method === 'PATCH')?.body).toEqual({ version: 3, alkalineBuffered: true });
  });

  it('on a stale edit shows what changed since, and re-applies the user’s change on the new version', async () => {
    const theirs = { ...folder, material: 'Lignin-free board', version: 4 };
    let patches = 0;
    const { requests } = mockFetch({
      'GET /api/enclosures': () => json(page([folder])),
      [`PATCH /api/enclosures/${folder.id}`]: (request) => {
        patches += 1;
        if (patches === 1) {
          return errorResponse(409, 'conflict', 'Someone saved this record after you opened it.', {
            details: { current: theirs, lastChangedBy: 'Tomas Reyes', lastChangedAt: '2025-02-03T10:15:00.000Z' },
          });
        }
        return json({ data: { ...theirs, ...(request.body as object), version: 5 } });
      },
    });
    renderPage(<EnclosuresPage />, { path: '/catalogue/enclosures', me: makeMe('registrar') });
    fireEvent.click(await screen.findByRole('button', { name: 'Edit Four-flap folder' }));
    type(screen.getByLabelText('Name'), 'Four-flap folder, unbuffered');
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));

    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('Tomas Reyes saved it');
    const material = within(alert).getByRole('row', { name: /^Material/ });
    expect(within(material).getAllByRole('cell').map((c) => c.textContent)).toEqual(['Cotton rag paper', 'Lignin-free board', 'Not changed by you; the current value will be kept']);
    const name = within(alert).getByRole('row', { name: /^Name/ });
    expect(within(name).getAllByRole('cell').map((c) => c.textContent)).toEqual(['Four-flap folder', 'unchanged', 'Four-flap folder, unbuffered']);
    // The typed value is still there.
    expect(screen.getByLabelText<HTMLInputElement>('Name').value).toBe('Four-flap folder, unbuffered');

    fireEvent.click(within(alert).getByRole('button', { name: 'Re-apply my changes to the current version' }));
    expect(screen.getByLabelText<HTMLInputElement>('Material').value).toBe('Lignin-free board');
    expect(screen.getByLabelText<HTMLInputElement>('Name').value).toBe('Four-flap folder, unbuffered');
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));

    await screen.findByText('Saved enclosure type “Four-flap folder, unbuffered”.');
    const bodies = requests.filter((r) => r.method === 'PATCH').map((r) => r.body);
    expect(bodies).toEqual([
      { version: 3, name: 'Four-flap folder, unbuffered' },
      { version: 4, name: 'Four-flap folder, unbuffered' },
    ]);
  });
});
