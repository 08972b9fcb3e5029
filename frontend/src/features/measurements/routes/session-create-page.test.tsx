import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';
import { SessionCreatePage } from '@/features/measurements/routes/session-create-page';
import { PRINT_ID, SESSION3_ID, SPOT_ID, makeMeasurements, makePrint, makeSession } from '@/features/measurements/testing/fixtures';

const SLOW = { timeout: 4000 };
const PREVIEW = `POST /api/prints/${PRINT_ID}/measurement-sessions/csv-preview`;

function renderForm(extra: Record<string, Parameters<typeof mockFetch>[0][string]> = {}) {
  const fetch = mockFetch({
    [`GET /api/prints/${PRINT_ID}`]: () => json({ data: makePrint() }),
    [`GET /api/prints/${PRINT_ID}/measurements`]: () => json({ data: makeMeasurements() }),
    ...extra,
  });
  const view = renderRoutes(
    [
      { path: '/measurements/prints/:id/sessions/new', element: <SessionCreatePage /> },
      { path: '/measurements/prints/:id', element: <p>print measurements</p> },
    ],
    { path: `/measurements/prints/${PRINT_ID}/sessions/new`, me: makeMe('conservator') },
  );
  return { ...fetch, ...view };
}

async function spotGroup() {
  return screen.findByRole('group', { name: 'Sky, upper left' }, SLOW);
}

function type(container: HTMLElement, label: string, value: string, index = 0) {
  fireEvent.change(within(container).getAllByLabelText(label)[index]!, { target: { value } });
}

/** The error shown next to a field: the element its aria-describedby points at. */
function errorOf(input: HTMLElement): string | null {
  const id = input.getAttribute('aria-describedby');
  return id?.endsWith('-error') ? (document.getElementById(id)?.textContent ?? null) : null;
}

describe('recording a session: live preview', () => {
  it('shows the CIEDE2000 change against the baseline while typing (Sharma et al. 2005, Table 1, pair 1)', async () => {
    renderForm();
    const group = await spotGroup();
    expect(within(group).getByText('Type a reading to see its change against the baseline.')).toBeTruthy();
    // Baseline (50, 0, −82.7485); this reading (50, 2.6772, −79.7751): ΔE00 = 2.0425.
    type(group, 'L*', '50');
    type(group, 'a*', '2.6772');
    type(group, 'b*', '-79.7751');
    expect(within(group).getByText('ΔE00 2.04 against the baseline of 3 May 2000: at or beyond the noticeable threshold (ΔE00 2.0)')).toBeTruthy();
    expect(within(group).getByText(/Mean L\* 50\.00 · a\* 2\.68 · b\* −79\.78 · n = 1/)).toBeTruthy();
  });

  it('shows the mean and spread of several readings, and refuses a comparison under other conditions', async () => {
    renderForm();
    const group = await spotGroup();
    fireEvent.click(within(group).getByRole('button', { name: 'Add reading' }));
    type(group, 'L*', '50', 0);
    type(group, 'a*', '1', 0);
    type(group, 'b*', '-80', 0);
    type(group, 'L*', '52', 1);
    type(group, 'a*', '3', 1);
    type(group, 'b*', '-82', 1);
    expect(within(group).getByText(/Mean L\* 51\.00 · a\* 2\.00 · b\* −81\.00 · n = 2/)).toBeTruthy();
    expect(within(group).getByText(/sd 1\.41 \/ 1\.41 \/ 1\.41/)).toBeTruthy();

    fireEvent.change(screen.getByLabelText('Illuminant'), { target: { value: 'D65' } });
    expect(within(group).getByText('Baseline measured under D50/2°, this session under D65/2°: not comparable without conversion')).toBeTruthy();
    expect(within(group).queryByText(/against the baseline of/)).toBeNull();
  });
});

describe('recording a session: saving', () => {
  it('starts from today and the latest session’s conditions, sends the readings, and goes back to the print', async () => {
    const { requests, router } = renderForm({
      [`POST /api/prints/${PRINT_ID}/measurement-sessions`]: () => json({ data: makeSession({ id: SESSION3_ID }) }, 201),
    });
    const group = await spotGroup();
    expect((screen.getByLabelText('Measured on') as HTMLInputElement).value).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    expect((screen.getByLabelText('Instrument') as HTMLInputElement).value).toBe('Handheld spectro S-1');
    expect((screen.getByLabelText('Geometry') as HTMLSelectElement).value).toBe('45/0');
    fireEvent.change(screen.getByLabelText('Measured on'), { target: { value: '2025-02-01' } });
    type(group, 'L*', '51.2');
    type(group, 'a*', '1.9');
    type(group, 'b*', '-78.2');
    type(group, 'Density', '1.1');
    fireEvent.click(screen.getByRole('button', { name: 'Save session' }));

    await waitFor(() => expect(router.state.location.pathname).toBe(`/measurements/prints/${PRINT_ID}`));
    expect(requests.find((r) => r.method === 'POST')?.body).toEqual({
      measuredOn: '2025-02-01', instrument: 'Handheld spectro S-1', serial: 'SN 4471', illuminant: 'D50', observer: '2', geometry: '45/0',
      condition: 'M0', aperture: '4 mm', backing: 'White card', notes: null,
      readings: [{ spotId: SPOT_ID, readings: [{ L: 51.2, a: 1.9, b: -78.2 }], density: 1.1, densityType: null, reflectance: null }],
    });
  });

  it('puts the server’s errors next to the field and the reading they belong to, and keeps everything typed', async () => {
    const { requests } = renderForm({
      [`POST /api/prints/${PRINT_ID}/measurement-sessions`]: () =>
        errorResponse(400, 'validation_failed', 'Check the form', {
          details: [
            { path: 'measuredOn', message: 'A session cannot be dated after today', code: 'custom' },
            { path: 'readings.0.readings.1.L', message: 'Far from the other readings at this spot: check L*', code: 'custom' },
          ],
        }),
    });
    const group = await spotGroup();
    fireEvent.click(within(group).getByRole('button', { name: 'Add reading' }));
    fireEvent.click(within(group).getByRole('button', { name: 'Add reading' }));
    // The middle row is left empty: server paths count only the rows sent.
    type(group, 'L*', '50', 0);
    type(group, 'a*', '1', 0);
    type(group, 'b*', '-80', 0);
    type(group, 'L*', '95', 2);
    type(group, 'a*', '1', 2);
    type(group, 'b*', '-80', 2);
    fireEvent.change(screen.getByLabelText('Measured on'), { target: { value: '2099-01-01' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save session' }));

    await waitFor(() => expect(errorOf(screen.getByLabelText('Measured on'))).toBe('A session cannot be dated after today'));
    const ls = within(group).getAllByLabelText('L*');
    expect(errorOf(ls[2]!)).toBe('Far from the other readings at this spot: check L*');
    expect(errorOf(ls[0]!)).toBeNull();
    expect(screen.getByText('Sky, upper left, reading 3, L*: Far from the other readings at this spot: check L*')).toBeTruthy();
    expect((ls[2] as HTMLInputElement).value).toBe('95');
    expect((screen.getByLabelText('Measured on') as HTMLInputElement).value).toBe('2099-01-01');
    expect(requests.filter((r) => r.method === 'POST')).toHaveLength(1);
  });

  it('checks with the shared schema before sending anything', async () => {
    const { requests } = renderForm();
    const group = await spotGroup();
    type(group, 'L*', '150');
    type(group, 'a*', '0');
    type(group, 'b*', '0');
    fireEvent.click(screen.getByRole('button', { name: 'Save session' }));
    await waitFor(() => expect(errorOf(within(group).getByLabelText('L*'))).toBe('L* is between 0 and 100'));
    expect(requests.some((r) => r.method === 'POST')).toBe(false);
  });
});

describe('recording a session: from a CSV file', () => {
  const COLUMNS = ['Sample', 'Spot name', 'L*', 'a*', 'b*', 'Dens'];

  function lastForm(fetchMock: { mock: { calls: unknown[][] } }): FormData {
    const init = fetchMock.mock.calls.at(-1)![1] as RequestInit;
    return init.body as FormData;
  }

  async function upload() {
    const input = await screen.findByLabelText('CSV file from the instrument', {}, SLOW);
    fireEvent.change(input, { target: { files: [new File(['Spot name,L*,a*,b*\n'], 'session.csv', { type: 'text/csv' })] } });
    return screen.findByLabelText('Spot column');
  }

  it('guesses the columns from their headers and sends the chosen mapping with the file', async () => {
    const { fetchMock } = renderForm({
      [PREVIEW]: () =>
        json({ data: { columns: COLUMNS, rowCount: 6, sample: [{ Sample: '1', 'Spot name': 'Sky, upper left', 'L*': '51.2', 'a*': '1.9', 'b*': '-78.2', Dens: '1.10' }], readings: null, errors: [] } }),
    });
    await upload();
    expect(lastForm(fetchMock).get('mapping')).toBeNull();
    expect((screen.getByLabelText('Spot column') as HTMLSelectElement).value).toBe('Spot name');
    expect((screen.getByLabelText('L* column') as HTMLSelectElement).value).toBe('L*');
    expect((screen.getByLabelText('a* column') as HTMLSelectElement).value).toBe('a*');
    expect((screen.getByLabelText('b* column') as HTMLSelectElement).value).toBe('b*');
    expect((screen.getByLabelText('Density column') as HTMLSelectElement).value).toBe('Dens');
    expect((screen.getByLabelText('Reflectance column') as HTMLSelectElement).value).toBe('');
    expect(within(screen.getByLabelText('Spot column')).getAllByRole('option').map((o) => o.textContent)).toEqual(['Choose…', ...COLUMNS]);

    fireEvent.change(screen.getByLabelText('Density column'), { target: { value: '' } });
    fireEvent.click(screen.getByRole('button', { name: 'Check the readings' }));
    await waitFor(() => expect(fetchMock.mock.calls).toHaveLength(4));
    const form = lastForm(fetchMock);
    expect(JSON.parse(form.get('mapping') as string)).toEqual({ spot: 'Spot name', L: 'L*', a: 'a*', b: 'b*' });
    expect((form.get('file') as File).name).toBe('session.csv');
  });

  it('asks for the required columns before checking', async () => {
    const { fetchMock } = renderForm({ [PREVIEW]: () => json({ data: { columns: ['x', 'y'], rowCount: 1, sample: [], readings: null, errors: [] } }) });
    await upload();
    const calls = fetchMock.mock.calls.length;
    fireEvent.click(screen.getByRole('button', { name: 'Check the readings' }));
    expect(errorOf(screen.getByLabelText('Spot column'))).toBe('Choose the column with the spot name');
    expect(errorOf(screen.getByLabelText('L* column'))).toBe('Choose the L* column');
    expect(fetchMock.mock.calls).toHaveLength(calls);
  });

  it('shows every bad row by row and column, and offers nothing to use', async () => {
    let call = 0;
    renderForm({
      [PREVIEW]: () => {
        call += 1;
        return json({
          data: {
            columns: COLUMNS, rowCount: 6, sample: [],
            readings: call === 1 ? null : [],
            errors: call === 1 ? [] : [
              { row: 4, column: 'a*', value: 'x', message: 'a* must be a number' },
              { row: 6, column: 'Spot name', value: 'Corner', message: 'No spot of this print is called “Corner”' },
            ],
          },
        });
      },
    });
    await upload();
    fireEvent.click(screen.getByRole('button', { name: 'Check the readings' }));
    const table = await screen.findByRole('table', { name: 'Problems in the file, by row and column' });
    const rows = within(table).getAllByRole('row').slice(1).map((r) => within(r).getAllByRole('cell').map((c) => c.textContent));
    expect(rows).toEqual([
      ['4', 'a*', 'x', 'a* must be a number'],
      ['6', 'Spot name', 'Corner', 'No spot of this print is called “Corner”'],
    ]);
    expect(screen.getByText('2 problems in the file. Nothing was used.')).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Use these readings' })).toBeNull();
  });

  it('fills the form with clean readings, which are then saved as usual', async () => {
    let call = 0;
    const { requests } = renderForm({
      [PREVIEW]: () => {
        call += 1;
        return json({
          data: {
            columns: COLUMNS, rowCount: 2, sample: [],
            readings: call === 1 ? null : [{ spotId: SPOT_ID, readings: [{ L: 51.2, a: 1.9, b: -78.2 }, { L: 51.4, a: 2.1, b: -78 }], density: 1.1, densityType: 'visual', reflectance: null }],
            errors: [],
          },
        });
      },
      [`POST /api/prints/${PRINT_ID}/measurement-sessions`]: () => json({ data: makeSession({ id: SESSION3_ID }) }, 201),
    });
    await upload();
    fireEvent.click(screen.getByRole('button', { name: 'Check the readings' }));
    fireEvent.click(await screen.findByRole('button', { name: 'Use these readings' }));

    const group = await spotGroup();
    expect(within(group).getAllByLabelText('L*').map((i) => (i as HTMLInputElement).value)).toEqual(['51.2', '51.4']);
    expect(within(group).getAllByLabelText('b*').map((i) => (i as HTMLInputElement).value)).toEqual(['-78.2', '-78']);
    expect((within(group).getByLabelText('Density') as HTMLInputElement).value).toBe('1.1');
    expect(requests.some((r) => r.method === 'POST' && r.path.endsWith('/measurement-sessions'))).toBe(false);

    fireEvent.click(screen.getByRole('button', { name: 'Save session' }));
    await waitFor(() => expect(requests.some((r) => r.path === `/api/prints/${PRINT_ID}/measurement-sessions`)).toBe(true));
    const body = requests.find((r) => r.path === `/api/prints/${PRINT_ID}/measurement-sessions`)!.body as { readings: unknown };
    expect(body.readings).toEqual([
      { spotId: SPOT_ID, readings: [{ L: 51.2, a: 1.9, b: -78.2 }, { L: 51.4, a: 2.1, b: -78 }], density: 1.1, densityType: 'visual', reflectance: null },
    ]);
  });
});
