import { describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';
import { PrintMeasurementsPage } from '@/features/measurements/routes/print-measurements-page';
import {
  IMAGE_ID,
  PRINT_ID,
  SESSION1_ID,
  SPOT_ID,
  makeAnalysis,
  makeImage,
  makeMeasurements,
  makePrint,
  makeSpot,
} from '@/features/measurements/testing/fixtures';

/** Role queries over the charts' SVG are slow in jsdom; give the first look at the page room under load. */
const SLOW = { timeout: 4000 };

function handlers(extra: Record<string, Parameters<typeof mockFetch>[0][string]> = {}) {
  return {
    [`GET /api/prints/${PRINT_ID}`]: () => json({ data: makePrint() }),
    [`GET /api/prints/${PRINT_ID}/measurements`]: () => json({ data: makeMeasurements() }),
    [`GET /api/prints/${PRINT_ID}/images`]: () => json({ data: [makeImage()] }),
    ...extra,
  };
}

function renderPage(role: Parameters<typeof makeMe>[0], extra: Record<string, Parameters<typeof mockFetch>[0][string]> = {}) {
  const fetch = mockFetch(handlers(extra));
  const view = renderRoutes(
    [
      { path: '/measurements/prints/:id', element: <PrintMeasurementsPage /> },
      { path: '/measurements/prints/:id/sessions/new', element: <p>session form</p> },
    ],
    { path: `/measurements/prints/${PRINT_ID}`, me: makeMe(role) },
  );
  return { ...fetch, ...view };
}

describe('a print’s measurements', () => {
  it('shows each spot as a region with its figures in words, and a chart described for screen readers', async () => {
    renderPage('researcher');
    const card = await screen.findByRole('region', { name: 'Sky, upper left' }, SLOW);
    expect(screen.getByRole('heading', { level: 1 }).textContent).toBe('1979.3.12 Quay cranes in fog');
    expect(screen.getByText('Gelatin silver, developing-out · toned: Iron blue (Prussian blue)')).toBeTruthy();

    const chart = within(card).getByRole('img', { name: 'Colour change (ΔE00) at Sky, upper left over time' });
    const description = document.getElementById(chart.getAttribute('aria-describedby')!)!.textContent;
    expect(description).toContain('Latest ΔE00 1.42 on 3 May 2024');
    expect(description).toContain('Rate 0.06 ΔE00/year (95 % CI 0.04–0.08, n = 6 over 24.0 years)');

    expect(within(card).getByText('0.06 ΔE00/year (95 % CI 0.04–0.08, n = 6 over 24.0 years)')).toBeTruthy();
    expect(within(card).getByText('Reaches ΔE00 2.0 around March 2031 (between 2029 and 2036)')).toBeTruthy();
    expect(within(card).getByText('ΔL′ +1.20 · ΔC′ −4.10 · ΔH′ +1.30', { exact: false })).toBeTruthy();
    expect(within(card).getByText('Mainly loss of chroma')).toBeTruthy();
    // The session measured under other conditions is listed with its reason, not plotted.
    expect(within(card).getByText(/D65\/10°: not comparable without conversion/)).toBeTruthy();
    expect(within(card).getByText('Not plotted: not comparable with the baseline')).toBeTruthy();
  });

  it('gives the density rate in D per year and, apart, in % of the baseline density per year', async () => {
    // D 1.34, 1.24, 1.14 over 18 years: −0.20 / 18 = −0.0111 D/year; 14.93 % / 18 = 0.829 %/year (hand arithmetic).
    const spot = makeAnalysis({
      densityChangeRate: { ok: true, slopePerYear: -0.01111, intercept: 0, standardError: 0.0002, ci95: [-0.0125, -0.0097], n: 3, spanYears: 18, r2: 1 },
      densityLossRate: { ok: true, slopePerYear: 0.8291, intercept: 0, standardError: 0.015, ci95: [0.72, 0.93], n: 3, spanYears: 18, r2: 1 },
    });
    renderPage('researcher', { [`GET /api/prints/${PRINT_ID}/measurements`]: () => json({ data: makeMeasurements({ spots: [spot] }) }) });
    const card = await screen.findByRole('region', { name: 'Sky, upper left' }, SLOW);
    expect(within(card).getByText('Change −0.011 D/year (95 % CI −0.013 to −0.010, n = 3 over 18.0 years)')).toBeTruthy();
    expect(within(card).getByText('Loss 0.83 % of the baseline density per year (95 % CI 0.72–0.93)')).toBeTruthy();
    // The percentage is never given as D/year.
    expect(card.textContent).not.toMatch(/0\.8\d* D\/year/);
  });

  it('shows the spots on the print’s image, and the sessions with their readings', async () => {
    renderPage('researcher');
    const map = await screen.findByRole('img', { name: 'Spots on the recto: Sky, upper left' }, SLOW);
    expect(map.querySelector('text')?.textContent).toBe('Sky, upper left');
    const circle = map.querySelector('circle')!;
    expect([circle.getAttribute('cx'), circle.getAttribute('cy')]).toEqual(['400', '225']);
    const sessions = screen.getByRole('table', { name: 'Measurement sessions at this print' });
    expect(within(sessions).getByText('Handheld spectro S-1')).toBeTruthy();
    expect(within(sessions).getByText('D50/2°')).toBeTruthy();
    expect(within(sessions).getByText(/50\.00 0\.00 −82\.75/)).toBeTruthy();
  });

  it('offers no changes to a role that may only read', async () => {
    renderPage('researcher');
    await screen.findByRole('region', { name: 'Sky, upper left' }, SLOW);
    expect(screen.queryByRole('button', { name: 'New spot' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Record a session' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Choose baseline' })).toBeNull();
  });

  it('opens the session form for a conservator', async () => {
    const { router } = renderPage('conservator');
    fireEvent.click(await screen.findByRole('button', { name: 'Record a session' }, SLOW));
    await waitFor(() => expect(router.state.location.pathname).toBe(`/measurements/prints/${PRINT_ID}/sessions/new`));
  });
});

describe('choosing a baseline', () => {
  it('requires a reason before anything is sent, then sends the choice with the spot’s version', async () => {
    const { requests } = renderPage('conservator', {
      [`PUT /api/measurement-spots/${SPOT_ID}/baseline`]: () =>
        json({ data: makeSpot({ version: 2, baseline: { sessionId: SESSION1_ID, chosenBy: 'Iris Penhale', chosenAt: '2025-01-01T10:00:00.000Z', reason: 'First reading after rehousing' } }) }),
    });
    const card = await screen.findByRole('region', { name: 'Sky, upper left' }, SLOW);
    fireEvent.click(within(card).getByRole('button', { name: 'Choose baseline' }));
    fireEvent.change(within(card).getByLabelText('Baseline session'), { target: { value: SESSION1_ID } });
    fireEvent.click(within(card).getByRole('button', { name: 'Save baseline' }));

    const reason = within(card).getByLabelText('Reason');
    await waitFor(() => expect(document.getElementById(reason.getAttribute('aria-describedby')!)?.textContent).toBe('Say why this session is the baseline'));
    expect(requests.some((r) => r.method === 'PUT')).toBe(false);

    fireEvent.change(reason, { target: { value: 'First reading after rehousing' } });
    fireEvent.click(within(card).getByRole('button', { name: 'Save baseline' }));
    await waitFor(() => expect(requests.some((r) => r.method === 'PUT')).toBe(true));
    expect(requests.find((r) => r.method === 'PUT')?.body).toEqual({ sessionId: SESSION1_ID, reason: 'First reading after rehousing', version: 1 });
    expect(await within(card).findByText('Baseline saved; the figures are being worked out again.')).toBeTruthy();
  });

  it('keeps the reason and shows the server’s message at the field when it is refused', async () => {
    renderPage('conservator', {
      [`PUT /api/measurement-spots/${SPOT_ID}/baseline`]: () =>
        errorResponse(400, 'validation_failed', 'Check the form', { details: [{ path: 'sessionId', message: 'This session has no reading at this spot', code: 'custom' }] }),
    });
    const card = await screen.findByRole('region', { name: 'Sky, upper left' }, SLOW);
    fireEvent.click(within(card).getByRole('button', { name: 'Choose baseline' }));
    fireEvent.change(within(card).getByLabelText('Reason'), { target: { value: 'After treatment' } });
    fireEvent.click(within(card).getByRole('button', { name: 'Save baseline' }));
    expect(await within(card).findByText('This session has no reading at this spot')).toBeTruthy();
    expect((within(card).getByLabelText('Reason') as HTMLTextAreaElement).value).toBe('After treatment');
  });
});

describe('a new spot', () => {
  it('is placed by clicking the image, and sent with its position', async () => {
    const { requests } = renderPage('conservator', {
      [`POST /api/prints/${PRINT_ID}/measurement-spots`]: (r) => json({ data: makeSpot({ id: 'b3111111-2222-4333-8444-555555555555', name: 'Dmax, coat', purpose: 'dmax', point: (r.body as { point: { imageId: string; x: number; y: number } }).point }) }, 201),
    });
    fireEvent.click(await screen.findByRole('button', { name: 'New spot' }, SLOW));
    const form = screen.getByRole('form', { name: 'New spot' });
    fireEvent.change(within(form).getByLabelText('Spot name'), { target: { value: 'Dmax, coat' } });
    fireEvent.change(within(form).getByLabelText('Purpose'), { target: { value: 'dmax' } });

    const placement = within(form).getByTestId('spot-placement');
    vi.spyOn(placement, 'getBoundingClientRect').mockReturnValue({ left: 100, top: 50, width: 400, height: 300, right: 500, bottom: 350, x: 100, y: 50, toJSON: () => ({}) });
    fireEvent.click(placement, { clientX: 200, clientY: 200 });
    expect((within(form).getByLabelText('Across (%)') as HTMLInputElement).value).toBe('25');
    expect((within(form).getByLabelText('Down (%)') as HTMLInputElement).value).toBe('50');

    fireEvent.click(within(form).getByRole('button', { name: 'Save spot' }));
    await waitFor(() => expect(requests.some((r) => r.method === 'POST')).toBe(true));
    expect(requests.find((r) => r.method === 'POST')?.body).toEqual({ name: 'Dmax, coat', purpose: 'dmax', notes: null, point: { imageId: IMAGE_ID, x: 0.25, y: 0.5 } });
    expect(await screen.findByText('Spot “Dmax, coat” saved.')).toBeTruthy();
  });

  it('needs a name and a purpose', async () => {
    const { requests } = renderPage('conservator');
    fireEvent.click(await screen.findByRole('button', { name: 'New spot' }, SLOW));
    const form = screen.getByRole('form', { name: 'New spot' });
    fireEvent.click(within(form).getByRole('button', { name: 'Save spot' }));
    expect(await within(form).findByText('Name the spot')).toBeTruthy();
    expect(requests.some((r) => r.method === 'POST')).toBe(false);
  });
});
