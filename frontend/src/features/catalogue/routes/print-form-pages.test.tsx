import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';
import type { Role } from '@toneledger/common/domain/roles';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';
import { PrintCreatePage } from '@/features/catalogue/routes/print-create-page';
import { PrintEditPage } from '@/features/catalogue/routes/print-edit-page';
import { BUFFERED_ID, PRINT_ID, makePrint, makeStep, referenceHandlers } from '@/features/catalogue/testing/fixtures';

function renderEdit(handlers: Record<string, Parameters<typeof mockFetch>[0][string]>, role: Role = 'registrar') {
  const fetch = mockFetch({ ...referenceHandlers(), ...handlers });
  const view = renderRoutes(
    [
      { path: '/catalogue/prints/:id/edit', element: <PrintEditPage /> },
      { path: '/catalogue/prints/:id', element: <p>print page</p> },
    ],
    { path: `/catalogue/prints/${PRINT_ID}/edit`, me: makeMe(role) },
  );
  return { ...fetch, ...view };
}

function renderCreate(handlers: Record<string, Parameters<typeof mockFetch>[0][string]>, role: Role = 'registrar') {
  const fetch = mockFetch({ ...referenceHandlers(), ...handlers });
  const view = renderRoutes(
    [
      { path: '/catalogue/prints/new', element: <PrintCreatePage /> },
      { path: '/catalogue/prints/:id', element: <p>print page</p> },
    ],
    { path: '/catalogue/prints/new', me: makeMe(role) },
  );
  return { ...fetch, ...view };
}

/** The error shown next to a field: the element its aria-describedby points at. */
function fieldError(label: string): string | null {
  const input = screen.getByLabelText(label);
  const ids = (input.getAttribute('aria-describedby') ?? '').split(' ').filter((id) => id.endsWith('-error'));
  return ids.length ? document.getElementById(ids[0]!)?.textContent ?? null : null;
}

describe('print form: live previews', () => {
  it('reads the EDTF date as it is typed, and explains a mistake', async () => {
    renderCreate({});
    const date = await screen.findByLabelText('Date made');
    fireEvent.change(date, { target: { value: '1968-04~' } });
    expect(screen.getByText('Reads as: about April 1968 · 1968-04-01 to 1968-04-30')).toBeTruthy();
    fireEvent.change(date, { target: { value: '1968-13' } });
    expect(screen.getByText('1968-13: month must be 01–12')).toBeTruthy();
  });

  it('checks the accession number against the pattern from the settings, with the example', async () => {
    renderCreate({});
    expect(await screen.findByText('Pattern YYYY.N.N, for example 1987.14.3')).toBeTruthy();
    fireEvent.change(screen.getByLabelText('Accession number'), { target: { value: '87/14' } });
    expect(screen.getByText(/"87\/14" does not match the accession-number pattern YYYY\.N\.N/)).toBeTruthy();
  });

  it('warns at once when an iron-blue toned print is given an alkaline-buffered enclosure', async () => {
    const ironBlue = makePrint({
      steps: [makeStep(), makeStep({ id: '72111111-2222-4333-8444-555555555555', position: 2, type: 'toning', tonerClass: 'iron_blue', agent: null })],
      tonerClasses: ['iron_blue'],
    });
    renderEdit({ [`GET /api/prints/${PRINT_ID}`]: () => json({ data: ironBlue }) });
    const preview = await screen.findByRole('region', { name: 'Warnings preview' });
    expect(within(preview).getByText('No warnings with these choices.')).toBeTruthy();

    const enclosure = screen.getByLabelText('Enclosure');
    await waitFor(() => expect(within(enclosure).getAllByRole('option')).toHaveLength(3));
    fireEvent.change(enclosure, { target: { value: BUFFERED_ID } });
    expect(within(preview).getByText(/This iron-blue toned print is in an alkaline-buffered enclosure \("Buffered folder"\)/)).toBeTruthy();
    expect(within(preview).getByText('High')).toBeTruthy();
  });

  it('gives no iron-blue warning for the same enclosure when the print has no iron-blue toning', async () => {
    renderEdit({ [`GET /api/prints/${PRINT_ID}`]: () => json({ data: makePrint() }) });
    const enclosure = await screen.findByLabelText('Enclosure');
    await waitFor(() => expect(within(enclosure).getAllByRole('option')).toHaveLength(3));
    fireEvent.change(enclosure, { target: { value: BUFFERED_ID } });
    const preview = screen.getByRole('region', { name: 'Warnings preview' });
    expect(within(preview).getByText('No warnings with these choices.')).toBeTruthy();
  });
});

describe('print form: errors', () => {
  it('checks with the shared schema before sending anything', async () => {
    const { requests } = renderCreate({});
    fireEvent.change(await screen.findByLabelText('Image width (mm)'), { target: { value: 'wide' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect(await screen.findByText(/Not saved: 3 fields need attention/)).toBeTruthy();
    expect(fieldError('Title')).toMatch(/Enter a title/);
    expect(fieldError('Image width (mm)')).toBe('Enter a number of millimetres');
    expect(requests.some((r) => r.method === 'POST')).toBe(false);
  });

  it('puts the server’s field errors next to their fields and keeps what was typed', async () => {
    const { requests } = renderCreate({
      'POST /api/prints': () =>
        errorResponse(400, 'validation_failed', 'Check the form', {
          details: [
            { path: 'dateMade', message: 'Dates after today are not allowed', code: 'custom' },
            { path: 'title', message: 'This title is reserved', code: 'custom' },
          ],
        }),
    });
    fireEvent.change(await screen.findByLabelText('Accession number'), { target: { value: '2001.4.1' } });
    fireEvent.change(screen.getByLabelText('Title'), { target: { value: 'Pier at dusk' } });
    fireEvent.change(screen.getByLabelText('Date made'), { target: { value: '2099' } });
    fireEvent.change(screen.getByLabelText('Process'), { target: { value: 'cyanotype' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));

    await waitFor(() => expect(fieldError('Date made')).toBe('Dates after today are not allowed'));
    expect(fieldError('Title')).toBe('This title is reserved');
    expect((screen.getByLabelText('Title') as HTMLInputElement).value).toBe('Pier at dusk');
    expect((screen.getByLabelText('Date made') as HTMLInputElement).value).toBe('2099');
    expect((screen.getByLabelText('Process') as HTMLSelectElement).value).toBe('cyanotype');
    const post = requests.find((r) => r.method === 'POST');
    expect(post?.body).toMatchObject({ accessionNumber: '2001.4.1', title: 'Pier at dusk', dateMade: '2099', process: 'cyanotype', status: 'in_store' });
  });

  it('shows a taken accession number (409) at the accession number field', async () => {
    renderCreate({
      'POST /api/prints': () =>
        errorResponse(409, 'conflict', 'Accession number in use', { details: [{ path: 'accessionNumber', message: '2001.4.1 is already used by another print' }] }),
    });
    fireEvent.change(await screen.findByLabelText('Accession number'), { target: { value: '2001.4.1' } });
    fireEvent.change(screen.getByLabelText('Title'), { target: { value: 'Pier at dusk' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    await waitFor(() => expect(fieldError('Accession number')).toBe('2001.4.1 is already used by another print'));
  });
});

describe('print form: editing on top of someone else’s save', () => {
  it('sends only the changed fields with the version it opened', async () => {
    const { requests, router } = renderEdit({
      [`GET /api/prints/${PRINT_ID}`]: () => json({ data: makePrint() }),
      [`PATCH /api/prints/${PRINT_ID}`]: () => json({ data: makePrint({ title: 'Harbour wall', version: 4 }) }),
    });
    fireEvent.change(await screen.findByLabelText('Title'), { target: { value: 'Harbour wall' } });
    fireEvent.change(screen.getByLabelText('Sheet width (mm)'), { target: { value: '' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    await waitFor(() => expect(router.state.location.pathname).toBe(`/catalogue/prints/${PRINT_ID}`));
    expect(requests.find((r) => r.method === 'PATCH')?.body).toEqual({ version: 3, title: 'Harbour wall', sheetWidthMm: null });
  });

  it('shows what changed since the form opened, keeps the typed values, and re-applies them on the current version', async () => {
    const opened = makePrint();
    const current = makePrint({ version: 5, title: 'Harbour wall at low tide', status: 'on_display', provenance: 'Bought from the maker, 1987' });
    let patches = 0;
    const { requests } = renderEdit({
      [`GET /api/prints/${PRINT_ID}`]: () => json({ data: opened }),
      [`PATCH /api/prints/${PRINT_ID}`]: () => {
        patches += 1;
        if (patches === 1) {
          return errorResponse(409, 'conflict', 'Changed by someone else', {
            details: { current, lastChangedBy: 'Bram Otley', lastChangedAt: '2025-02-03T09:15:00.000Z' },
          });
        }
        return json({ data: { ...current, version: 6 } });
      },
    });

    fireEvent.change(await screen.findByLabelText('Title'), { target: { value: 'Harbour wall, spring tide' } });
    fireEvent.change(screen.getByLabelText('Date made'), { target: { value: '1968-05' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));

    const notice = await screen.findByRole('alert', { name: 'Changed since you opened it' });
    expect(notice.textContent).toContain('Bram Otley saved it');
    expect(notice.textContent).toContain('now version 5');
    const rows = within(notice).getAllByRole('row').slice(1).map((row) => within(row).getAllByRole('rowheader', { hidden: true })[0]?.textContent);
    expect(rows).toEqual(['Title', 'Date made', 'Status', 'Provenance']);
    const titleRow = within(notice).getByRole('rowheader', { name: 'Title' }).closest('tr')!;
    expect(titleRow.textContent).toContain('Harbour wall, low tide');
    expect(titleRow.textContent).toContain('Harbour wall at low tide');
    expect(titleRow.textContent).toContain('You changed this too: Harbour wall, spring tide');
    const statusRow = within(notice).getByRole('rowheader', { name: 'Status' }).closest('tr')!;
    expect(statusRow.textContent).toContain('In store');
    expect(statusRow.textContent).toContain('On display');
    expect(statusRow.textContent).toContain('Not changed by you');

    // Nothing typed is lost while the notice is shown.
    expect((screen.getByLabelText('Title') as HTMLInputElement).value).toBe('Harbour wall, spring tide');
    expect((screen.getByLabelText('Date made') as HTMLInputElement).value).toBe('1968-05');

    fireEvent.click(within(notice).getByRole('button', { name: 'Re-apply my changes to the current version' }));
    expect(screen.queryByRole('alert', { name: 'Changed since you opened it' })).toBeNull();
    expect(screen.getByRole('status').textContent).toContain('Your edits are now on top of version 5. You and Bram Otley both changed: Title');
    // The heading names the version the form now edits.
    expect(await screen.findByText(/· version 5\./)).toBeTruthy();
    expect(screen.queryByText(/· version 3\./)).toBeNull();
    expect((screen.getByLabelText('Title') as HTMLInputElement).value).toBe('Harbour wall, spring tide');
    expect((screen.getByLabelText('Status') as HTMLSelectElement).value).toBe('on_display');
    expect((screen.getByLabelText('Provenance') as HTMLTextAreaElement).value).toBe('Bought from the maker, 1987');

    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    await waitFor(() => expect(patches).toBe(2));
    const second = requests.filter((r) => r.method === 'PATCH')[1];
    // Their status and provenance are not sent back; only this person's own edits, on version 5.
    expect(second?.body).toEqual({ version: 5, title: 'Harbour wall, spring tide', dateMade: '1968-05' });
  });

  it('can discard the edits and load the current version instead', async () => {
    const current = makePrint({ version: 5, title: 'Harbour wall at low tide' });
    renderEdit({
      [`GET /api/prints/${PRINT_ID}`]: () => json({ data: makePrint() }),
      [`PATCH /api/prints/${PRINT_ID}`]: () =>
        errorResponse(409, 'conflict', 'Changed', { details: { current, lastChangedBy: null, lastChangedAt: null } }),
    });
    fireEvent.change(await screen.findByLabelText('Title'), { target: { value: 'Mine' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    const notice = await screen.findByRole('alert', { name: 'Changed since you opened it' });
    expect(notice.textContent).toContain('Someone saved it');
    fireEvent.click(within(notice).getByRole('button', { name: /Discard my changes/ }));
    expect((screen.getByLabelText('Title') as HTMLInputElement).value).toBe('Harbour wall at low tide');
    expect(await screen.findByText(/Harbour wall at low tide · version 5\./)).toBeTruthy();
  });
});

describe('print form: valuation', () => {
  it('offers the valuation currency as a list of ISO 4217 codes with their names', async () => {
    const { requests } = renderCreate({ 'POST /api/prints': () => json({ data: makePrint() }, 201) });
    const currency = (await screen.findByLabelText('Valuation currency')) as HTMLSelectElement;
    expect(currency.tagName).toBe('SELECT');
    const options = within(currency).getAllByRole('option').map((o) => o.textContent);
    expect(options[0]).toBe('Not recorded');
    expect(options).toContain('GBP · Pound Sterling');
    expect(options).toContain('EUR · Euro');
    expect(options.some((o) => o?.startsWith('XXX'))).toBe(false);
    fireEvent.change(screen.getByLabelText('Accession number'), { target: { value: '2001.4.1' } });
    fireEvent.change(screen.getByLabelText('Title'), { target: { value: 'Pier at dusk' } });
    fireEvent.change(screen.getByLabelText('Valuation amount'), { target: { value: '1200' } });
    fireEvent.change(currency, { target: { value: 'EUR' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    await waitFor(() => expect(requests.some((r) => r.method === 'POST')).toBe(true));
    expect(requests.find((r) => r.method === 'POST')?.body).toMatchObject({ valuationAmount: 1200, valuationCurrency: 'EUR' });
  });

  it('a role that may not read valuations has no valuation controls, and saving never sends them', async () => {
    const { valuationAmount: _a, valuationCurrency: _c, ...unvalued } = makePrint();
    const edit = renderEdit(
      {
        [`GET /api/prints/${PRINT_ID}`]: () => json({ data: unvalued }),
        [`PATCH /api/prints/${PRINT_ID}`]: () => json({ data: { ...unvalued, title: 'Harbour wall', version: 4 } }),
      },
      'conservator',
    );
    fireEvent.change(await screen.findByLabelText('Title'), { target: { value: 'Harbour wall' } });
    expect(screen.queryByLabelText('Valuation amount')).toBeNull();
    expect(screen.queryByLabelText('Valuation currency')).toBeNull();
    expect(screen.getByLabelText('Staff notes')).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    await waitFor(() => expect(edit.requests.some((r) => r.method === 'PATCH')).toBe(true));
    expect(edit.requests.find((r) => r.method === 'PATCH')?.body).toEqual({ version: 3, title: 'Harbour wall' });
    edit.unmount();

    const create = renderCreate({ 'POST /api/prints': () => json({ data: unvalued }, 201) }, 'conservator');
    fireEvent.change(await screen.findByLabelText('Accession number'), { target: { value: '2001.4.1' } });
    fireEvent.change(screen.getByLabelText('Title'), { target: { value: 'Pier at dusk' } });
    expect(screen.queryByLabelText('Valuation amount')).toBeNull();
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    await waitFor(() => expect(create.requests.some((r) => r.method === 'POST')).toBe(true));
    const body = create.requests.find((r) => r.method === 'POST')?.body as Record<string, unknown>;
    expect(body).toMatchObject({ accessionNumber: '2001.4.1', title: 'Pier at dusk' });
    expect(body).not.toHaveProperty('valuationAmount');
    expect(body).not.toHaveProperty('valuationCurrency');
  });
});

describe('print form: rights statement', () => {
  it('offers the licences and statements by plain labels in three groups, and sends the chosen URI', async () => {
    const { requests } = renderCreate({ 'POST /api/prints': () => json({ data: makePrint() }, 201) });
    const rights = (await screen.findByLabelText('Rights statement')) as HTMLSelectElement;
    expect(rights.tagName).toBe('SELECT');
    expect([...rights.querySelectorAll('optgroup')].map((g) => g.label)).toEqual(['Creative Commons licences', 'Public domain', 'RightsStatements.org statements']);
    const options = within(rights).getAllByRole('option');
    expect(options[0]!.textContent).toBe('Not recorded');
    // 6 CC 4.0 licences + CC0 + Public Domain Mark + the 12 RightsStatements.org statements, and "Not recorded".
    expect(options).toHaveLength(21);
    expect(options.map((o) => o.textContent)).toContain('In copyright: rights-holder(s) unlocatable or unidentifiable');
    fireEvent.change(screen.getByLabelText('Accession number'), { target: { value: '2001.4.2' } });
    fireEvent.change(screen.getByLabelText('Title'), { target: { value: 'Pier lamps' } });
    fireEvent.change(rights, { target: { value: 'http://rightsstatements.org/vocab/InC-RUU/1.0/' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    await waitFor(() => expect(requests.some((r) => r.method === 'POST')).toBe(true));
    expect(requests.find((r) => r.method === 'POST')?.body).toMatchObject({ rights: 'http://rightsstatements.org/vocab/InC-RUU/1.0/' });
  });

  it('keeps a saved licence that is not among the choices, by its name, and does not send it unchanged', async () => {
    const saved = 'http://creativecommons.org/licenses/by-sa/3.0/de/';
    const { requests, router } = renderEdit({
      [`GET /api/prints/${PRINT_ID}`]: () => json({ data: makePrint({ rights: saved }) }),
      [`PATCH /api/prints/${PRINT_ID}`]: () => json({ data: makePrint({ rights: saved, title: 'Pier lamps', version: 4 }) }),
    });
    const rights = (await screen.findByLabelText('Rights statement')) as HTMLSelectElement;
    await waitFor(() => expect(rights.value).toBe(saved));
    expect(rights.selectedOptions[0]!.textContent).toBe('Creative Commons Attribution-ShareAlike 3.0 (de) (CC BY-SA 3.0)');
    fireEvent.change(screen.getByLabelText('Title'), { target: { value: 'Pier lamps' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    await waitFor(() => expect(router.state.location.pathname).toBe(`/catalogue/prints/${PRINT_ID}`));
    expect(requests.find((r) => r.method === 'PATCH')?.body).toEqual({ version: 3, title: 'Pier lamps' });
  });
});
