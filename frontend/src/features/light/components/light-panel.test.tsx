import { describe, expect, it } from 'vitest';
import { fireEvent, screen, within } from '@testing-library/react';
import { LIGHT_COST_ASSUMPTIONS } from '@toneledger/common/domain/light-cost';
import { LIGHT_BUDGET_SOURCE } from '@toneledger/common/domain/light-budget';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { LightPanel } from '@/features/light/components/light-panel';
import { PRINT_ID, makePrintLight } from '@/features/light/testing/fixtures';

const LIGHT = `GET /api/prints/${PRINT_ID}/light`;
const PUT = `PUT /api/prints/${PRINT_ID}/light-responsivity`;

function show(role: Parameters<typeof makeMe>[0], light = makePrintLight(), extra: Parameters<typeof mockFetch>[0] = {}) {
  const fetch = mockFetch({ [LIGHT]: () => json({ data: light }), 'GET /api/settings/measurements': () => json({ data: { noticeableDeltaE: 2 } }), ...extra });
  renderPage(<LightPanel printId={PRINT_ID} />, { path: `/catalogue/prints/${PRINT_ID}`, me: makeMe(role) });
  return fetch;
}

/** The value beside a term in the panel's figures. */
function figure(term: string): string {
  const dt = screen.getByText(term, { selector: 'dt' });
  return dt.nextElementSibling!.textContent!;
}

describe('LightPanel', () => {
  it('shows the category with its source, the budget with its source, and the exposure in lux-hours with thousands separators', async () => {
    show('conservator');
    expect(await screen.findByRole('heading', { name: 'Light dose' })).toBeTruthy();
    await screen.findByText('Category', { selector: 'dt' });
    expect(figure('Category')).toBe('High (Blue Wool 1–3) — default from process and toner');
    // Budget figures and, beside them, where they come from.
    expect(figure('Budget')).toContain('at most 50 lx; 15,000 lx·h in any 12 months');
    expect(figure('Budget')).toContain(`Source: ${LIGHT_BUDGET_SOURCE}`);
    // Hand arithmetic: 30 days × 50 lx × 8 h = 12,000; 20 × 40 × 6 = 4,800; with it 16,800; 22 × 50 × 8 = 8,800.
    expect(figure('Used this year')).toBe('12,000 lx·h');
    expect(figure('Last 12 months')).toBe('12,000 lx·h');
    expect(figure('Total')).toBe('16,800 lx·h');
    expect(figure('Planned')).toBe('8,800 lx·h');
    expect(figure('Rest')).toBe('Within its budget over the last 12 months; no rest is owed.');
    expect(screen.getByText(/past its budget of 15,000 lx·h/)).toBeTruthy();
  });

  it('lists the displays with their exposure, each linked to its exhibition', async () => {
    show('registrar');
    const table = await screen.findByRole('table', { name: 'Displays' });
    const rows = within(table).getAllByRole('row').slice(1);
    expect(rows.map((r) => within(r).getAllByRole('cell').map((c) => c.textContent))).toEqual([
      ['Tidewater Rooms', '2023-05-01 – 2023-05-20', '40 lx', '6', '4,800 lx·h'],
      ['Blue Hours at Calder Reach', '2026-04-01 – 2026-04-30', '50 lx', '8', '12,000 lx·h'],
      ['Winter Rotation(planned)', '2026-12-10 – 2026-12-31', '50 lx', '8', '8,800 lx·h'],
    ]);
    expect(within(table).getByRole('link', { name: 'Winter Rotation' }).getAttribute('href')).toBe('/exhibitions/e1000000-0000-4000-8000-000000000003');
  });

  it('states the light cost with its interval, its points and the assumptions', async () => {
    show('researcher');
    expect(await screen.findByText('ΔE00 per million lux-hours: 0.80 (95 % interval 0.70–0.91, n = 5, spot B (sky))')).toBeTruthy();
    expect(screen.getByRole('img', { name: /ΔE00 against exposure in million lux-hours/ })).toBeTruthy();
    // Hand arithmetic: 8,800 lx·h = 0.0088 Mlx·h; × 0.80 = 0.00704, × 0.70 = 0.00616, × 0.912 = 0.0080256;
    // from the last measured 0.014 that makes 0.02104, far below the threshold of 2.
    expect(
      await screen.findByText(
        'The planned displays (8,800 lx·h) are expected to add ΔE00 0.007 (95 % interval 0.006–0.008); from ΔE00 0.014 measured on 2026-05-04, that makes 0.021: below the noticeable change of ΔE00 2.00.',
      ),
    ).toBeTruthy();
    for (const assumption of LIGHT_COST_ASSUMPTIONS) expect(screen.getByText(assumption)).toBeTruthy();
    expect(screen.getByText(/Dark recovery of Prussian blue/)).toBeTruthy();
  });

  it('says honestly when there is not enough data for a light cost', async () => {
    show('conservator', makePrintLight({ cost: { status: 'not_enough_data', reason: 'Only two measurement sessions; three are needed.' } }));
    expect(await screen.findByText('Only two measurement sessions; three are needed.')).toBeTruthy();
    expect(screen.getByText('Not enough data.')).toBeTruthy();
    expect(screen.queryByText(/ΔE00 per million lux-hours/)).toBeNull();
    expect(screen.queryByText('Assumptions')).toBeNull();
  });

  it('does not repeat "Not enough data" when the reason already says it', async () => {
    const reason = 'Not enough data: a light cost needs at least three measurement sessions (the baseline included); there are 0.';
    show('conservator', makePrintLight({ cost: { status: 'not_enough_data', reason } }));
    expect(await screen.findByText(reason)).toBeTruthy();
    expect(screen.queryByText('Not enough data.')).toBeNull();
    expect(screen.getAllByText(/Not enough data/)).toHaveLength(1);
  });

  it('names who set an overridden category and why', async () => {
    show(
      'researcher',
      makePrintLight({ category: 'medium', categorySource: 'override', overrideReason: 'Toning found to be gold, not iron blue, on examination', overriddenBy: { id: '7a0e1b2c-3d4e-4f50-8a6b-7c8d9e0f1a2b', name: 'Orla Venn' } }),
    );
    expect(await screen.findByText('— set by Orla Venn: Toning found to be gold, not iron blue, on examination')).toBeTruthy();
  });

  it('shows a researcher the panel without the change button', async () => {
    show('researcher');
    expect(await screen.findByText('16,800 lx·h')).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Change category' })).toBeNull();
  });

  it('shows a viewer nothing and asks the server nothing', async () => {
    const { requests } = show('viewer');
    await new Promise((resolve) => setTimeout(resolve, 20));
    expect(screen.queryByRole('heading', { name: 'Light dose' })).toBeNull();
    expect(requests).toHaveLength(0);
  });
});

describe('Change category', { timeout: 20_000 }, () => {
  async function open(extra: Parameters<typeof mockFetch>[0]) {
    const fetch = show('conservator', makePrintLight(), extra);
    fireEvent.click(await screen.findByRole('button', { name: 'Change category' }));
    return fetch;
  }

  it('requires a reason when overriding, as the schema does, without sending anything', async () => {
    const { requests } = await open({});
    fireEvent.change(screen.getByLabelText('Category'), { target: { value: 'medium' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save category' }));
    expect(await screen.findAllByText('Say why this print differs from its default')).not.toHaveLength(0);
    expect(screen.getByLabelText('Reason').getAttribute('aria-invalid')).toBe('true');
    expect(requests.filter((r) => r.method === 'PUT')).toHaveLength(0);
  });

  it('shows a server refusal on its field and keeps what was typed, then saves', async () => {
    let puts = 0;
    const { requests } = await open({
      [PUT]: (request) => {
        puts += 1;
        if (puts === 1) return errorResponse(400, 'validation_failed', 'Check the category', { details: [{ path: 'reason', message: 'Name the examination this rests on', code: 'custom' }] });
        const body = request.body as { category: 'medium'; reason: string };
        return json({ data: makePrintLight({ category: body.category, categorySource: 'override', overrideReason: body.reason, overriddenBy: { id: '5d0c0f5e-8a7b-4c2d-9e1f-112233445566', name: 'Iris Penhale' }, version: 4 }) });
      },
    });
    fireEvent.change(screen.getByLabelText('Category'), { target: { value: 'medium' } });
    fireEvent.change(screen.getByLabelText('Reason'), { target: { value: 'Gold toned' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save category' }));
    expect(await screen.findAllByText('Name the examination this rests on')).not.toHaveLength(0);
    expect(screen.getByLabelText<HTMLTextAreaElement>('Reason').value).toBe('Gold toned');

    fireEvent.change(screen.getByLabelText('Reason'), { target: { value: 'Gold toned, spot test of 2026-11-20' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save category' }));
    expect(await screen.findByText('Category saved.')).toBeTruthy();
    expect(figure('Category')).toBe('Medium (Blue Wool 4–6) — set by Iris Penhale: Gold toned, spot test of 2026-11-20');
    expect(requests.filter((r) => r.method === 'PUT').map((r) => r.body)).toEqual([
      { category: 'medium', reason: 'Gold toned', version: 3 },
      { category: 'medium', reason: 'Gold toned, spot test of 2026-11-20', version: 3 },
    ]);
  });

  it('sends "Use the default" as no category, with no reason needed', async () => {
    const overridden = makePrintLight({ category: 'medium', categorySource: 'override', overrideReason: 'Gold toned', overriddenBy: { id: '7a0e1b2c-3d4e-4f50-8a6b-7c8d9e0f1a2b', name: 'Orla Venn' } });
    const { requests } = mockFetch({
      [LIGHT]: () => json({ data: overridden }),
      [PUT]: () => json({ data: makePrintLight({ version: 4 }) }),
      'GET /api/settings/measurements': () => json({ data: { noticeableDeltaE: 2 } }),
    });
    renderPage(<LightPanel printId={PRINT_ID} />, { me: makeMe('conservator') });
    fireEvent.click(await screen.findByRole('button', { name: 'Change category' }));
    fireEvent.change(screen.getByLabelText('Category'), { target: { value: '' } });
    fireEvent.change(screen.getByLabelText('Reason'), { target: { value: '' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save category' }));
    expect(await screen.findByText('Category saved.')).toBeTruthy();
    expect(requests.filter((r) => r.method === 'PUT').map((r) => r.body)).toEqual([{ category: null, reason: null, version: 3 }]);
  });

  it('shows a stale save with the values saved since, and loses nothing typed', async () => {
    const current = makePrintLight({ category: 'low', categorySource: 'override', overrideReason: 'Selenium toned throughout', overriddenBy: { id: '7a0e1b2c-3d4e-4f50-8a6b-7c8d9e0f1a2b', name: 'Orla Venn' }, version: 4 });
    await open({
      [PUT]: () => errorResponse(409, 'conflict', 'Changed since you opened it', { details: { current, lastChangedBy: 'Orla Venn', lastChangedAt: '2026-12-02T09:14:00.000Z' } }),
    });
    fireEvent.change(screen.getByLabelText('Category'), { target: { value: 'medium' } });
    fireEvent.change(screen.getByLabelText('Reason'), { target: { value: 'Gold toned' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save category' }));
    const review = await screen.findByRole('alert', { name: 'Changed since you opened it' });
    expect(review.textContent).toContain('Orla Venn');
    expect(within(review).getByText('Selenium toned throughout')).toBeTruthy();
    expect(within(review).getByText('Low (Blue Wool 7 and above)')).toBeTruthy();
    expect(screen.getByLabelText<HTMLTextAreaElement>('Reason').value).toBe('Gold toned');
    expect(screen.getByLabelText<HTMLSelectElement>('Category').value).toBe('medium');
  });
});
