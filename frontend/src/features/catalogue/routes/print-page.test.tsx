import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';
import type { Role } from '@toneledger/common/domain/roles';
import { PrintPage } from '@/features/catalogue/routes/print-page';
import { LOCATION_ID, PRINT_ID, RECIPE_ID, makePrint, makeStep, referenceHandlers } from '@/features/catalogue/testing/fixtures';

const toned = makePrint({
  staffNotes: 'Frame glazing chipped',
  valuationAmount: 1200,
  valuationCurrency: 'GBP',
  tonerClasses: ['iron_blue'],
  enclosure: { id: '41111111-2222-4333-8444-555555555555', name: 'Buffered folder', alkalineBuffered: true, patResult: 'passed' },
  warnings: [{ code: 'prussian_blue_in_buffered_enclosure', severity: 'high', message: 'This iron-blue toned print is in an alkaline-buffered enclosure.', basis: 'Published guidance.' }],
  steps: [
    makeStep(),
    makeStep({ id: '74111111-2222-4333-8444-555555555555', position: 2, type: 'toning', agent: null, tonerClass: 'iron_blue', recipe: { id: RECIPE_ID, name: 'Iron blue toner A' }, dilution: '1+4', timeSeconds: 95, temperatureC: 21, extent: 'partial' }),
  ],
});

const image = (id: string, viewType: string, capturedOn: string | null, withdrawn = false) => ({
  id, printId: PRINT_ID, viewType, capturedOn, notes: null, fileName: `${id}.tif`, contentType: 'image/tiff', sizeBytes: 1000, width: 40, height: 30, sha256: 'a'.repeat(64),
  exif: { capturedAt: null, make: null, model: null, lens: null, exposureTime: null, fNumber: null, iso: null, focalLength: null },
  derivatives: 'ready', urls: { thumb: `/api/images/${id}/file/thumb`, screen: `/api/images/${id}/file/screen`, original: null },
  lastFixity: null, uploadedAt: '2024-01-02T10:00:00.000Z', uploadedBy: 'Ada Marsh',
  withdrawn: withdrawn ? { at: '2024-02-01T00:00:00.000Z', by: 'Ada Marsh', reason: 'Blurred', purgeAfter: '2031-02-01T00:00:00.000Z' } : null, version: 1,
});
// The 2019 recto is the latest usable one: the verso is later, and the 2022 recto was withdrawn.
const RECTOS = [
  image('a1111111-1111-4111-8111-111111111111', 'recto', '1995-05-02'),
  image('a2222222-2222-4222-8222-222222222222', 'recto', '2019-03-10'),
  image('a3333333-3333-4333-8333-333333333333', 'verso', '2023-01-01'),
  image('a4444444-4444-4444-8444-444444444444', 'recto', '2022-06-01', true),
];

function renderPrint(role: Role, print = toned, deletion: { ok: boolean; reason: string | null } = { ok: true, reason: null }) {
  const fetch = mockFetch({
    ...referenceHandlers(),
    [`GET /api/prints/${PRINT_ID}`]: () => json({ data: print }),
    [`GET /api/prints/${PRINT_ID}/movements`]: () =>
      json({ data: [{ id: '81111111-2222-4333-8444-555555555555', from: null, to: { id: LOCATION_ID, pathLabel: 'Store A › Cabinet 2' }, movedAt: '2024-01-02T10:00:00.000Z', movedBy: 'Ada Marsh', reason: 'Accessioned' }] }),
    [`GET /api/prints/${PRINT_ID}/history`]: () =>
      json({ data: [{ id: 'h1', at: '2024-06-01T10:00:00.000Z', actorName: 'Ada Marsh', action: 'print.updated', summary: 'Changed the title', changes: [{ field: 'title', before: 'Harbour', after: 'Harbour wall, low tide' }] }] }),
    [`GET /api/prints/${PRINT_ID}/timeline`]: () =>
      json({
        data: [
          { at: '2024-07-01T10:00:00.000Z', kind: 'condition', title: 'Condition report: Fair', detail: 'Routine check', actorName: 'Tamsin Quay', link: '/condition/reports/r1' },
          { at: '2024-06-01T10:00:00.000Z', kind: 'catalogue', title: 'Changed the title', detail: null, actorName: 'Ada Marsh', link: null },
        ],
      }),
    [`POST /api/prints/${PRINT_ID}/movements`]: () => json({ data: { ...print, version: print.version + 1, location: { id: LOCATION_ID, pathLabel: 'Store A › Cabinet 2' } } }),
    [`GET /api/prints/${PRINT_ID}/deletion`]: () => json({ data: deletion }),
    [`GET /api/prints/${PRINT_ID}/images`]: () => json({ data: RECTOS }),
  });
  const view = renderRoutes([{ path: '/catalogue/prints/:id', element: <PrintPage /> }], { path: `/catalogue/prints/${PRINT_ID}`, me: makeMe(role) });
  return { ...fetch, ...view };
}

describe('PrintPage', () => {
  it('offers Delete only when the print may be deleted, and says why not otherwise', async () => {
    const reason = 'This print has images, condition reports or measurements, which are kept for good. Set its status to deaccessioned instead of deleting it.';
    renderPrint('registrar', toned, { ok: false, reason });
    expect(await screen.findByText(`Cannot be deleted: ${reason}`, {}, { timeout: 5000 })).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Delete…' })).toBeNull();
  });

  it('offers Delete on a print that may be deleted', async () => {
    renderPrint('registrar');
    expect(await screen.findByRole('button', { name: 'Delete…' }, { timeout: 5000 })).toBeTruthy();
  });

  it('shows the record, its warnings region and its process timeline', async () => {
    renderPrint('registrar');
    expect(await screen.findByRole('heading', { level: 1, name: '1987.14.3' })).toBeTruthy();
    const warnings = screen.getByRole('region', { name: 'Warnings' });
    expect(within(warnings).getByText('This iron-blue toned print is in an alkaline-buffered enclosure.')).toBeTruthy();
    expect(within(warnings).getByText('High')).toBeTruthy();
    // The date as a registrar writes it, the EDTF value in the details beside it.
    expect(screen.getByText('ca. April 1968').getAttribute('title')).toBe('EDTF 1968-04~');
    expect(screen.getByText('1968-04~')).toBeTruthy();

    const timeline = screen.getByRole('region', { name: 'Process history' });
    const toning = within(timeline).getAllByRole('listitem')[1]!;
    expect(toning.textContent).toContain('Toning');
    expect(within(toning).getByRole('link', { name: 'Iron blue toner A' }).getAttribute('href')).toBe(`/catalogue/recipes/${RECIPE_ID}`);
    expect(within(toning).getByText('1:35')).toBeTruthy();
    expect(toning.textContent).toContain('Partial');
    expect(within(timeline).getByRole('complementary', { name: 'Chemical safety' }).textContent).toMatch(/safety data sheet/);
    expect(screen.getByRole('link', { name: 'Download JSON' }).getAttribute('href')).toBe(`/api/prints/${PRINT_ID}/export.json`);
  });

  it('shows the rights statement by its words beside the credit line', async () => {
    renderPrint('viewer', { ...toned, location: undefined, staffNotes: undefined, valuationAmount: undefined, valuationCurrency: undefined, creditLine: 'Calder Reach Photographic Trust. Gift of the maker', rights: 'http://rightsstatements.org/vocab/InC-RUU/1.0/' });
    const rights = (await screen.findByRole('heading', { level: 3, name: 'Rights statement' })).parentElement!;
    expect(rights.textContent).toBe('Rights statementIn copyright: rights-holder(s) unlocatable or unidentifiable');
    expect(screen.getByText('Calder Reach Photographic Trust. Gift of the maker')).toBeTruthy();
  });

  it('says "Not recorded" for a print without a rights statement', async () => {
    renderPrint('viewer', { ...toned, location: undefined, staffNotes: undefined, valuationAmount: undefined, valuationCurrency: undefined, rights: null });
    const rights = (await screen.findByRole('heading', { level: 3, name: 'Rights statement' })).parentElement!;
    expect(rights.textContent).toBe('Rights statementNot recorded');
  });

  it('hides location, movements, history, staff notes, valuation and editing from a viewer', async () => {
    const { requests } = renderPrint('viewer', { ...toned, location: undefined, staffNotes: undefined, valuationAmount: undefined, valuationCurrency: undefined });
    await screen.findByRole('heading', { level: 1, name: '1987.14.3' });
    expect(screen.queryByRole('region', { name: 'Location' })).toBeNull();
    expect(screen.queryByRole('region', { name: 'History of changes' })).toBeNull();
    expect(screen.queryByText('Staff notes')).toBeNull();
    expect(screen.queryByRole('link', { name: 'Edit' })).toBeNull();
    // The timeline is open to every reader (the server leaves out what a viewer may not see); nothing restricted is asked for.
    // Images are the viewer's to read (images.read): the latest recto is asked for beside the record.
    expect(requests.map((r) => r.path).sort()).toEqual([`/api/prints/${PRINT_ID}`, `/api/prints/${PRINT_ID}/images`, `/api/prints/${PRINT_ID}/timeline`].sort());
  });

  it('shows the timeline newest first, linking condition entries to their report', async () => {
    renderPrint('viewer', { ...toned, location: undefined, staffNotes: undefined, valuationAmount: undefined, valuationCurrency: undefined });
    const timeline = await screen.findByRole('region', { name: 'Timeline' });
    const link = await within(timeline).findByRole('link', { name: 'Condition report: Fair' });
    expect(link.getAttribute('href')).toBe('/condition/reports/r1');
    const items = within(timeline).getAllByRole('listitem');
    expect(items[0]?.textContent).toContain('Tamsin Quay');
    expect(items[1]?.textContent).toContain('Changed the title');
  });

  it('links to the condition and images of the print for every role that may see images', async () => {
    renderPrint('viewer', { ...toned, location: undefined, staffNotes: undefined, valuationAmount: undefined, valuationCurrency: undefined });
    const link = await screen.findByRole('link', { name: 'Condition and images' });
    expect(link.getAttribute('href')).toBe(`/condition/prints/${PRINT_ID}`);
  });

  it('lets a researcher read staff notes, movements and history, but not the valuation, and not move or edit', async () => {
    renderPrint('researcher');
    await screen.findByRole('heading', { level: 1, name: '1987.14.3' });
    expect(screen.getByText('Frame glazing chipped')).toBeTruthy();
    expect(screen.queryByText('£1,200.00')).toBeNull();
    expect(screen.queryByText('Valuation')).toBeNull();
    const history = screen.getByRole('region', { name: 'History of changes' });
    expect(await within(history).findByText(/^Ada Marsh edited print \S+\.$/)).toBeTruthy();
    expect(within(history).getByRole('rowheader', { name: 'Title' })).toBeTruthy();
    expect(await screen.findByText('Accessioned — Ada Marsh')).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Move' })).toBeNull();
    expect(screen.queryByRole('link', { name: 'Edit' })).toBeNull();
  });

  it('shows the valuation to registrars and administrators only', async () => {
    for (const role of ['registrar', 'admin'] as const) {
      const view = renderPrint(role);
      await screen.findByRole('heading', { level: 1, name: '1987.14.3' });
      expect(screen.getByRole('region', { name: 'Staff notes and valuation' }).textContent, role).toContain('£1,200.00');
      view.unmount();
    }
    for (const role of ['conservator', 'researcher'] as const) {
      const view = renderPrint(role);
      await screen.findByRole('heading', { level: 1, name: '1987.14.3' });
      expect(screen.getByRole('region', { name: 'Staff notes' }).textContent, role).toContain('Frame glazing chipped');
      expect(screen.queryByText('Valuation'), role).toBeNull();
      expect(screen.queryByText('£1,200.00'), role).toBeNull();
      view.unmount();
    }
  });

  it('moves the print with the version it shows', async () => {
    const { requests } = renderPrint('registrar', makePrint({ location: null }));
    await screen.findByRole('heading', { level: 1, name: '1987.14.3' });
    fireEvent.click(screen.getByRole('button', { name: 'Move' }));
    expect(await screen.findByText('Choose where the print goes')).toBeTruthy();
    const select = screen.getByLabelText('To location');
    await waitFor(() => expect(within(select).getAllByRole('option')).toHaveLength(2));
    fireEvent.change(select, { target: { value: LOCATION_ID } });
    fireEvent.change(screen.getByLabelText('Reason'), { target: { value: 'Rehoused' } });
    fireEvent.click(screen.getByRole('button', { name: 'Move' }));
    expect(await screen.findByText('Moved to Store A › Cabinet 2.')).toBeTruthy();
    expect(requests.find((r) => r.method === 'POST')?.body).toEqual({ toLocationId: LOCATION_ID, reason: 'Rehoused', version: 3 });
  });

  it('shows the latest recto, and offers a conservator to rehouse a print with an enclosure warning (a registrar too; never a viewer)', async () => {
    renderPrint('conservator');
    const figure = await screen.findByTestId('latest-recto');
    expect(figure.querySelector('img')!.getAttribute('src')).toBe('/api/images/a2222222-2222-4222-8222-222222222222/file/screen');
    expect(figure.textContent).toContain('captured 2019-03-10');
    fireEvent.click(screen.getByRole('button', { name: 'Rehouse this print…' }));
    expect(await screen.findByRole('dialog', { name: 'Rehouse in another enclosure' })).toBeTruthy();
  });

  it('offers no rehouse to a viewer', async () => {
    renderPrint('viewer', { ...toned, location: undefined, staffNotes: undefined, valuationAmount: undefined, valuationCurrency: undefined });
    await screen.findByTestId('latest-recto');
    expect(screen.queryByRole('button', { name: 'Rehouse this print…' })).toBeNull();
  });
});
