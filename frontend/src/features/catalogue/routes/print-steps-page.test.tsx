import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { errorResponse, json, mockFetch, type RecordedRequest } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';
import { PrintStepsPage } from '@/features/catalogue/routes/print-steps-page';
import { PRINT_ID, RECIPE_ID, SULFIDE_RECIPE_ID, makePrint, makeStep, referenceHandlers } from '@/features/catalogue/testing/fixtures';

const fixing = makeStep({ id: '73111111-2222-4333-8444-555555555555', position: 2, type: 'fixing', agent: 'Plain hypo', dilution: null, timeSeconds: 600, temperatureC: null });
const opened = makePrint({ steps: [makeStep(), fixing] });

function renderSteps(put: (request: RecordedRequest) => Response | Promise<Response>) {
  const fetch = mockFetch({
    ...referenceHandlers(),
    [`GET /api/prints/${PRINT_ID}`]: () => json({ data: opened }),
    [`PUT /api/prints/${PRINT_ID}/steps`]: put,
  });
  const view = renderRoutes(
    [
      { path: '/catalogue/prints/:id/process', element: <PrintStepsPage /> },
      { path: '/catalogue/prints/:id', element: <p>print page</p> },
    ],
    { path: `/catalogue/prints/${PRINT_ID}/process`, me: makeMe('registrar') },
  );
  return { ...fetch, ...view };
}

const steps = () => within(screen.getByRole('list', { name: 'Steps in order' })).getAllByRole('listitem');

describe('steps editor', () => {
  it('marks hazardous recipes and shows the chosen recipe’s cautions in the step', async () => {
    renderSteps(() => json({ data: makePrint() }));
    await screen.findByRole('list', { name: 'Steps in order' });
    fireEvent.change(screen.getByLabelText('Kind of step to add'), { target: { value: 'toning' } });
    fireEvent.click(screen.getByRole('button', { name: 'Add step' }));
    const toning = steps()[2]!;
    await waitFor(() => expect(within(toning).getAllByRole('option', { name: 'Sepia redeveloper (⚠ hazardous)' })).toHaveLength(1));
    // Ferric ammonium citrate alone carries no hazard statement: no mark, no cautions.
    expect(within(toning).getAllByRole('option', { name: 'Iron blue toner A' })).toHaveLength(1);
    fireEvent.change(within(toning).getByLabelText('Recipe'), { target: { value: RECIPE_ID } });
    expect(within(toning).queryByRole('complementary', { name: /Cautions for/ })).toBeNull();

    fireEvent.change(within(toning).getByLabelText('Recipe'), { target: { value: SULFIDE_RECIPE_ID } });
    const cautions = within(toning).getByRole('complementary', { name: 'Cautions for Sepia redeveloper' });
    expect(cautions.textContent).toMatch(/hydrogen sulfide/);
    expect(cautions.textContent).toMatch(/H314/);
    expect(cautions.textContent).toContain('GHS05 Corrosion, GHS06 Skull and crossbones, GHS09 Environment');
    expect(cautions.textContent).toMatch(/safety data sheet and local rules always take precedence/);
  });

  it('adds a toning step, moves it up, removes one, and saves the whole ordered list with the version', async () => {
    const { requests, router } = renderSteps(() => json({ data: makePrint({ version: 4 }) }));
    await screen.findByRole('list', { name: 'Steps in order' });
    expect(steps().map((s) => s.getAttribute('aria-label'))).toEqual(['Step 1: Development', 'Step 2: Fixing']);
    // Stored seconds are shown as m:ss.
    expect((within(steps()[1]!).getByLabelText('Time (m:ss or seconds)') as HTMLInputElement).value).toBe('10:00');

    fireEvent.change(screen.getByLabelText('Kind of step to add'), { target: { value: 'toning' } });
    fireEvent.click(screen.getByRole('button', { name: 'Add step' }));
    const toning = steps()[2]!;
    expect(document.activeElement).toBe(within(toning).getByLabelText('Step type'));
    fireEvent.change(within(toning).getByLabelText('Toner'), { target: { value: 'iron_blue' } });
    await waitFor(() => expect(within(toning).getAllByRole('option', { name: 'Iron blue toner A' })).toHaveLength(1));
    fireEvent.change(within(toning).getByLabelText('Recipe'), { target: { value: RECIPE_ID } });
    fireEvent.change(within(toning).getByLabelText('Dilution'), { target: { value: '1+4' } });
    fireEvent.change(within(toning).getByLabelText('Time (m:ss or seconds)'), { target: { value: '1:30' } });
    fireEvent.change(within(toning).getByLabelText('Temperature (°C)'), { target: { value: '21' } });
    fireEvent.change(within(toning).getByLabelText('Extent'), { target: { value: 'partial' } });

    const up = screen.getByRole('button', { name: 'Move up: step 3 (Toning)' });
    fireEvent.click(up);
    expect(steps().map((s) => s.getAttribute('aria-label'))).toEqual(['Step 1: Development', 'Step 2: Toning', 'Step 3: Fixing']);
    // Focus stays with the moved step's button.
    expect(document.activeElement).toBe(screen.getByRole('button', { name: 'Move up: step 2 (Toning)' }));

    fireEvent.click(screen.getByRole('button', { name: 'Remove: step 1 (Development)' }));
    expect(steps().map((s) => s.getAttribute('aria-label'))).toEqual(['Step 1: Toning', 'Step 2: Fixing']);

    fireEvent.click(screen.getByRole('button', { name: 'Save process history' }));
    await waitFor(() => expect(router.state.location.pathname).toBe(`/catalogue/prints/${PRINT_ID}`));
    expect(requests.find((r) => r.method === 'PUT')?.body).toEqual({
      version: 3,
      steps: [
        { type: 'toning', tonerClass: 'iron_blue', recipeId: RECIPE_ID, agent: null, dilution: '1+4', timeSeconds: 90, temperatureC: 21, extent: 'partial', notes: null },
        { type: 'fixing', agent: 'Plain hypo', dilution: null, timeSeconds: 600, temperatureC: null, notes: null },
      ],
    });
  });

  it('sends after-bath and thiosulfate-test fields of their kind only, and never a pass or fail', async () => {
    const { requests } = renderSteps(() => json({ data: makePrint({ version: 4 }) }));
    await screen.findByRole('list', { name: 'Steps in order' });
    fireEvent.click(screen.getByRole('button', { name: 'Remove: step 2 (Fixing)' }));
    fireEvent.click(screen.getByRole('button', { name: 'Remove: step 1 (Development)' }));

    fireEvent.change(screen.getByLabelText('Kind of step to add'), { target: { value: 'after_bath' } });
    fireEvent.click(screen.getByRole('button', { name: 'Add step' }));
    const bath = steps()[0]!;
    fireEvent.change(within(bath).getByLabelText('Solution'), { target: { value: 'Borax' } });
    fireEvent.change(within(bath).getByLabelText('Concentration'), { target: { value: '5 g/L' } });
    fireEvent.change(within(bath).getByLabelText('Alkaline'), { target: { value: 'yes' } });
    fireEvent.change(within(bath).getByLabelText('Time (m:ss or seconds)'), { target: { value: '45' } });

    fireEvent.change(screen.getByLabelText('Kind of step to add'), { target: { value: 'residual_thiosulfate_test' } });
    fireEvent.click(screen.getByRole('button', { name: 'Add step' }));
    const test = steps()[1]!;
    fireEvent.change(within(test).getByLabelText('Test method'), { target: { value: 'iso18917_methylene_blue' } });
    fireEvent.change(within(test).getByLabelText('Measured value'), { target: { value: '0.007' } });
    fireEvent.change(within(test).getByLabelText('Unit'), { target: { value: 'g/m²' } });
    expect(test.textContent).toContain('does not judge it as a pass or a fail');
    expect(within(test).queryByText(/^(pass|fail)/i)).toBeNull();

    fireEvent.click(screen.getByRole('button', { name: 'Save process history' }));
    await waitFor(() => expect(requests.some((r) => r.method === 'PUT')).toBe(true));
    expect(requests.find((r) => r.method === 'PUT')?.body).toEqual({
      version: 3,
      steps: [
        { type: 'after_bath', agent: 'Borax', concentration: '5 g/L', timeSeconds: 45, temperatureC: null, alkaline: true, notes: null },
        { type: 'residual_thiosulfate_test', method: 'iso18917_methylene_blue', value: 0.007, unit: 'g/m²', notes: null },
      ],
    });
  });

  it('marks a toning step without its toner class, and maps the server’s step paths to fields', async () => {
    let calls = 0;
    const { requests } = renderSteps(() => {
      calls += 1;
      return errorResponse(400, 'validation_failed', 'Check the steps', {
        details: [{ path: 'steps.1.timeSeconds', message: 'Longer than any bath this catalogue accepts', code: 'custom' }],
      });
    });
    await screen.findByRole('list', { name: 'Steps in order' });
    fireEvent.change(screen.getByLabelText('Kind of step to add'), { target: { value: 'toning' } });
    fireEvent.click(screen.getByRole('button', { name: 'Add step' }));
    fireEvent.click(screen.getByRole('button', { name: 'Save process history' }));
    expect(await within(steps()[2]!).findByText('A toning step needs its toner class')).toBeTruthy();
    expect(requests.some((r) => r.method === 'PUT')).toBe(false);

    fireEvent.change(within(steps()[2]!).getByLabelText('Toner'), { target: { value: 'selenium' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save process history' }));
    expect(await within(steps()[1]!).findByText('Longer than any bath this catalogue accepts')).toBeTruthy();
    expect(calls).toBe(1);
  });

  it('reads the time as m:ss or seconds, says so for anything else, and clears the message once it is corrected', async () => {
    const { requests } = renderSteps(() => json({ data: makePrint({ version: 4 }) }));
    await screen.findByRole('list', { name: 'Steps in order' });
    const time = () => within(steps()[0]!).getByLabelText('Time (m:ss or seconds)');
    const hint = 'Enter a time as m:ss or seconds, e.g. 1:30 or 90';
    const errorOf = (input: HTMLElement) => document.getElementById(input.getAttribute('aria-describedby') ?? '')?.textContent;

    fireEvent.change(time(), { target: { value: 'two minutes' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save process history' }));
    await waitFor(() => expect(errorOf(time())).toBe(hint));
    expect(screen.getByRole('link', { name: `Step 1: Time (m:ss or seconds): ${hint}` })).toBeTruthy();

    fireEvent.change(time(), { target: { value: '1:75' } });
    await waitFor(() => expect(errorOf(time())).toBe(hint));
    expect(time().getAttribute('aria-invalid')).toBe('true');

    fireEvent.change(time(), { target: { value: '1:30' } });
    await waitFor(() => expect(time().getAttribute('aria-invalid')).toBeNull());
    expect(screen.queryByText(hint)).toBeNull();
    expect(requests.some((r) => r.method === 'PUT')).toBe(false);

    fireEvent.click(screen.getByRole('button', { name: 'Save process history' }));
    await waitFor(() => expect(requests.some((r) => r.method === 'PUT')).toBe(true));
    expect((requests.find((r) => r.method === 'PUT')?.body as { steps: { timeSeconds: number }[] }).steps[0]?.timeSeconds).toBe(90);
  });

  it('on a stale save shows the current steps and saves over the new version only when asked', async () => {
    const current = makePrint({ version: 7, steps: [makeStep({ type: 'washing', agent: 'Running water' })] });
    let calls = 0;
    const { requests } = renderSteps(() => {
      calls += 1;
      return calls === 1
        ? errorResponse(409, 'conflict', 'Changed', { details: { current, lastChangedBy: 'Bram Otley', lastChangedAt: '2025-02-03T09:15:00.000Z' } })
        : json({ data: { ...current, version: 8 } });
    });
    await screen.findByRole('list', { name: 'Steps in order' });
    fireEvent.click(screen.getByRole('button', { name: 'Save process history' }));
    const notice = await screen.findByRole('alert', { name: 'Changed since you opened it' });
    expect(notice.textContent).toContain('Bram Otley saved it');
    expect(within(notice).getByText('Washing — Running water')).toBeTruthy();
    expect(steps()).toHaveLength(2);
    fireEvent.click(within(notice).getByRole('button', { name: 'Re-apply my changes to the current version' }));
    fireEvent.click(screen.getByRole('button', { name: 'Save process history' }));
    await waitFor(() => expect(calls).toBe(2));
    expect((requests.filter((r) => r.method === 'PUT')[1]?.body as { version: number }).version).toBe(7);
  });
});
