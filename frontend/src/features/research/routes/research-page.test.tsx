import { afterEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { COHORT_FACTORS, COHORT_FACTOR_CODES } from '@toneledger/common/fields/cohort';
import type { Role } from '@toneledger/common/domain/roles';
import { errorResponse, json, mockFetch, type RecordedRequest } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { ResearchPage } from '@/features/research/routes/research-page';
import { IRON_BLUE_QUERY, makeResult, makeSaved, PRINT_A } from '@/features/research/testing/fixtures';
import { decodeQuery, encodeQuery } from '@/features/research/utils/query-url';

const page = (n: number) => ({ page: 1, pageSize: 100, total: n });

function setup(extra: Record<string, (r: RecordedRequest) => Response | Promise<Response>> = {}, { role = 'researcher' as Role, path = `/research?q=${encodeURIComponent(encodeQuery(IRON_BLUE_QUERY))}` } = {}) {
  const mocks = mockFetch({
    'GET /api/research/queries': () => json({ data: [], pagination: page(0) }),
    'GET /api/research/factors': () => json({ data: { paperSurface: [{ value: 'glossy', count: 41 }, { value: 'matt', count: 17 }] } }),
    'GET /api/condition-terms': () => json({ data: [{ code: 'silvering', label: 'Silvering', description: null, active: true, builtIn: true }] }),
    'GET /api/locations': () => json({ data: [], pagination: { page: 1, pageSize: 1000, total: 0 } }),
    'POST /api/research/cohort': () => json({ data: makeResult() }),
    ...extra,
  });
  const rendered = renderPage(<ResearchPage />, { me: makeMe(role), path });
  return { ...mocks, ...rendered };
}

const currentQuery = (router: { state: { location: { search: string } } }) => decodeQuery(new URLSearchParams(router.state.location.search).get('q'))?.query;
const fieldError = (control: HTMLElement) => document.getElementById(control.getAttribute('aria-describedby') ?? '')?.textContent;

afterEach(() => vi.unstubAllGlobals());

describe('ResearchPage', { timeout: 30_000 }, () => {
  it('runs the query in the URL, puts a new one there on Run, and goes back to the first with the browser', async () => {
    const { requests, router } = setup();
    const form = await screen.findByRole('form', { name: 'Cohort query' });
    await screen.findByRole('table', { name: 'Groups' });
    expect(requests.find((r) => r.path === '/api/research/cohort')!.body).toEqual(IRON_BLUE_QUERY);
    // The controls hold the query from the URL.
    const support = within(form).getByRole('group', { name: COHORT_FACTORS.support.label });
    expect((within(support).getByLabelText('Fibre-based (baryta)') as HTMLInputElement).checked).toBe(true);
    expect((within(form).getByLabelText('Group by') as HTMLSelectElement).value).toBe('alkalineAfterBath');

    // A change of origin and interval method goes into the URL, and runs.
    fireEvent.change(within(form).getByLabelText('Time counted from'), { target: { value: 'made' } });
    fireEvent.change(within(form).getByLabelText('95 % interval of the curves'), { target: { value: 'plain' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Run query' }));
    await waitFor(() => expect(currentQuery(router)).toEqual({ ...IRON_BLUE_QUERY, origin: 'made', ci: 'plain' }));
    await waitFor(() => expect(requests.filter((r) => r.path === '/api/research/cohort').at(-1)!.body).toEqual({ ...IRON_BLUE_QUERY, origin: 'made', ci: 'plain' }));

    // Back: the first query again, in the URL and on the controls.
    await router.navigate(-1);
    await waitFor(() => expect(currentQuery(router)).toEqual(IRON_BLUE_QUERY));
    await waitFor(() => expect((within(screen.getByRole('form', { name: 'Cohort query' })).getByLabelText('Time counted from') as HTMLSelectElement).value).toBe('first_exam'), { timeout: 5000 });
    expect((within(screen.getByRole('form', { name: 'Cohort query' })).getByLabelText('95 % interval of the curves') as HTMLSelectElement).value).toBe('log-log');
  });

  it('builds a control for every factor of the table, by its kind', async () => {
    setup({}, { path: '/research' });
    const form = await screen.findByRole('form', { name: 'Cohort query' });
    for (const code of COHORT_FACTOR_CODES) expect(form.querySelector(`details[data-factor="${code}"] summary`)?.textContent).toContain(COHORT_FACTORS[code].label);
    // choice: a box per code of its vocabulary, with the vocabulary's words
    const toner = within(form).getByRole('group', { name: COHORT_FACTORS.tonerClass.label });
    expect(within(toner).getAllByRole('checkbox')).toHaveLength(COHORT_FACTORS.tonerClass.choices.codes.length);
    expect(within(toner).getByLabelText('Iron blue (Prussian blue)')).toBeTruthy();
    // flag: yes, no, unknown
    const bath = within(form).getByRole('group', { name: COHORT_FACTORS.alkalineAfterBath.label });
    expect(within(bath).getAllByRole('checkbox').map((c) => c.parentElement!.textContent)).toEqual(['Yes', 'No', 'Unknown']);
    // number: a range with its unit; year: from and to
    expect(within(form).getByLabelText('Ferricyanide in the toner: lowest (g/L)')).toBeTruthy();
    expect(within(form).getByLabelText('Date made: to year')).toBeTruthy();
    // text: the collection's values with their counts
    const surface = await within(form).findByRole('group', { name: COHORT_FACTORS.paperSurface.label });
    expect(surface.textContent).toContain('glossy(41)');
    // place: the location choice
    expect(within(form).getByLabelText('Storage place (and everything inside it)')).toBeTruthy();
    // Cox factors: at most five
    const cox = within(form).getByRole('group', { name: 'Cox model factors (up to five)' });
    const boxes = within(cox).getAllByRole('checkbox');
    for (const b of boxes.slice(0, 5)) fireEvent.click(b);
    expect((boxes[5] as HTMLInputElement).disabled).toBe(true);
  });

  it('shows the figures: group sizes, quartiles, numbers at risk, medians, the log-rank test, hazard ratio and incidence; a figure opens its prints', async () => {
    const { requests } = setup({
      'POST /api/research/cohort/prints': () =>
        json({ data: [{ printId: PRINT_A, accessionNumber: '2019.1', title: 'Quay at dusk', group: 'Alkaline after-bath: no', deltaEPerYear: 0.1, densityLossPerYear: 0.004, time: 2, event: true }], pagination: { page: 1, pageSize: 50, total: 1 } }),
    });
    const groups = await screen.findByRole('table', { name: 'Groups' });
    expect(within(groups).getByRole('row', { name: /after-bath: no/ }).textContent).toBe('Alkaline after-bath: no554');
    // Type-7 quartiles of 0.1…0.5 are 0.2, 0.3, 0.4 (R's default; d3-array in the fixture).
    const fading = await screen.findByRole('table', { name: 'ΔE00 per year: figures per group' });
    expect(within(fading).getByRole('row', { name: /after-bath: no/ }).textContent).toBe('Alkaline after-bath: no50.3000.200 – 0.4000.100 – 0.500');
    // 0.05, 0.07, 0.12, 0.2: median 0.095, quartiles 0.065 and 0.14.
    expect(within(fading).getByRole('row', { name: /after-bath: yes/ }).textContent).toBe('Alkaline after-bath: yes40.0950.065 – 0.1400.050 – 0.200');
    const atRisk = await screen.findByRole('table', { name: 'Number at risk' });
    expect(within(atRisk).getByRole('row', { name: /after-bath: no/ }).textContent).toBe('Alkaline after-bath: no4321');
    const curves = screen.getByRole('table', { name: 'Curves per group' });
    expect(within(curves).getByRole('row', { name: /after-bath: no/ }).textContent).toBe('Alkaline after-bath: no4315.0 (2.0 to not reached)');
    expect(screen.getByTestId('survival-basis').textContent).toMatch(/years since the first examination.*log-log/);
    expect(screen.getByTestId('logrank-figures').textContent).toBe('χ² = 3.84, df = 1, p = 0.050');
    // The server's warning names the group by its key; the page by its label.
    expect(screen.getByText('Group Alkaline after-bath: yes has 3 events (fewer than 5): the test has little power.')).toBeTruthy();
    const hr = await screen.findByRole('table', { name: 'Hazard ratios' });
    expect(within(hr).getByRole('row', { name: /against No/ }).textContent).toBe('Alkaline after-bath: Yes (against No)0.400.08 – 1.92p = 0.252');
    expect(screen.getByTestId('cox-lr').textContent).toBe('Likelihood-ratio test: χ² = 1.41, df = 1, p = 0.235');
    expect(screen.getByText(/no sign that the hazard ratio changes over time/).textContent).toMatch(/^Alkaline after-bath: Yes \(against No\): no sign/);
    const incidence = screen.getByRole('table', { name: 'Incidence per term' });
    expect(within(incidence).getAllByRole('row')[1]!.textContent).toBe('SilveringAlkaline after-bath: no2 of 540.0 % (11.8 % – 76.9 %)');

    // The events of a curve open the prints behind them, each linking to its catalogue record.
    fireEvent.click(within(curves).getByRole('button', { name: '3' }));
    const panel = await screen.findByRole('dialog', { name: 'Prints behind the figure' });
    expect((await within(panel).findByRole('link', { name: '2019.1' })).getAttribute('href')).toBe(`/catalogue/prints/${PRINT_A}`);
    expect(requests.find((r) => r.path === '/api/research/cohort/prints')!.body).toMatchObject({ query: IRON_BLUE_QUERY, groupKey: 'alkalineAfterBath=no', which: 'events', page: 1 });
  });

  it('asks for its figures in three parts at once and shows each part when it is ready', async () => {
    let release: () => void = () => {};
    const held = new Promise<void>((resolve) => { release = resolve; });
    const { requests } = setup({
      'POST /api/research/cohort': async (r) => {
        // The survival part waits until the test lets it go.
        if (r.search.get('figures') === 'survival,incidence') await held;
        return json({ data: makeResult() });
      },
    });
    await screen.findByRole('table', { name: 'ΔE00 per year: figures per group' });
    await screen.findByRole('table', { name: 'Hazard ratios' });
    expect(screen.getByText('Working out the survival curves…')).toBeTruthy();
    expect(screen.queryByRole('table', { name: 'Number at risk' })).toBeNull();
    expect(screen.queryByRole('table', { name: 'Incidence per term' })).toBeNull();
    const asked = requests.filter((r) => r.path === '/api/research/cohort');
    expect(asked.map((r) => r.search.get('figures')).sort()).toEqual(['cox', 'fading', 'survival,incidence']);
    for (const r of asked) expect(r.body).toEqual(IRON_BLUE_QUERY);
    release();
    await screen.findByRole('table', { name: 'Number at risk' });
    expect(screen.getByRole('table', { name: 'Incidence per term' })).toBeTruthy();
    expect(screen.queryByText('Working out the survival curves…')).toBeNull();
  });

  it('asks for no Cox part when the query has no Cox factors', async () => {
    const { requests } = setup({}, { path: `/research?q=${encodeURIComponent(encodeQuery({ ...IRON_BLUE_QUERY, coxFactors: [] }))}` });
    await screen.findByRole('table', { name: 'Number at risk' });
    expect(screen.getByText('No Cox model: choose its factors in the query.')).toBeTruthy();
    expect(requests.filter((r) => r.path === '/api/research/cohort').map((r) => r.search.get('figures')).sort()).toEqual(['fading', 'survival,incidence']);
  });

  it('offers the data package to a role with research.export and downloads it; no button for a role without it', async () => {
    const createObjectURL = vi.fn(() => 'blob:package');
    vi.stubGlobal('URL', Object.assign(URL, { createObjectURL, revokeObjectURL: vi.fn() }));
    const { requests, unmount } = setup({
      'POST /api/research/cohort/export': () => new Response(new Uint8Array([0x50, 0x4b, 3, 4]), { headers: { 'content-type': 'application/zip', 'content-disposition': 'attachment; filename="cohort-2026-12-02.zip"' } }),
    });
    fireEvent.click(await screen.findByRole('button', { name: 'Export the data package' }));
    await waitFor(() => expect(createObjectURL).toHaveBeenCalledTimes(1));
    expect(requests.find((r) => r.path === '/api/research/cohort/export')!.body).toEqual(IRON_BLUE_QUERY);
    unmount();

    // The registrar lacks research.export (common/src/domain/roles.ts).
    setup({}, { role: 'registrar' });
    await screen.findByRole('table', { name: 'Groups' });
    expect(screen.getByRole('button', { name: 'Save the query' })).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Export the data package' })).toBeNull();
  });

  it('puts a refused query’s problem under its control: the server’s, and the schema’s before sending', async () => {
    const query = { ...IRON_BLUE_QUERY, filters: [...IRON_BLUE_QUERY.filters, { factor: 'acidGL' as const, min: 1, max: 900 }] };
    const { requests } = setup(
      { 'POST /api/research/cohort': () => errorResponse(400, 'validation_failed', 'Check the query.', { details: [{ path: 'filters.2.max', message: 'No toner holds more than 200 g/L of acid', code: 'custom' }] }) },
      { path: `/research?q=${encodeURIComponent(encodeQuery(query))}` },
    );
    const form = await screen.findByRole('form', { name: 'Cohort query' });
    const highest = within(form).getByLabelText('Acid in the toner: highest (g/L)');
    await waitFor(() => expect(fieldError(highest)).toBe('No toner holds more than 200 g/L of acid'));
    expect(screen.getByText('The query was refused.')).toBeTruthy();

    // Lowest above highest: the contract's own check, no request sent.
    const sent = requests.length;
    fireEvent.change(within(form).getByLabelText('Acid in the toner: lowest (g/L)'), { target: { value: '9' } });
    fireEvent.change(highest, { target: { value: '3' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Run query' }));
    await waitFor(() => expect(fieldError(highest)).toBe('The highest must not be below the lowest'));
    expect(requests.slice(sent).filter((r) => r.method === 'POST')).toHaveLength(0);
  });

  it('saves the query with a name, lists mine and shared ones, opens one into the URL; only the owner may rename or delete', async () => {
    const other = makeSaved({ id: '9d8c7b6a-5f4e-4d3c-8b2a-1f0e9d8c7b02', name: 'Selenium then iron blue', shared: true, owner: { id: '1a2b3c4d-5e6f-4a7b-8c9d-0e1f2a3b4c5d', name: 'Tomas Rydell' }, query: { ...IRON_BLUE_QUERY, groupBy: ['tonerSequence'] } });
    const { requests, router } = setup({
      'GET /api/research/queries': () => json({ data: [makeSaved(), other], pagination: page(2) }),
      'POST /api/research/queries': (r) => json({ data: makeSaved({ name: (r.body as { name: string }).name }) }, 201),
      [`PATCH /api/research/queries/${makeSaved().id}`]: (r) => json({ data: makeSaved({ ...(r.body as object), version: 2 }) }),
      [`DELETE /api/research/queries/${makeSaved().id}`]: () => new Response(null, { status: 204 }),
    });
    fireEvent.click(await screen.findByRole('button', { name: 'Save the query' }));
    const save = screen.getByRole('form', { name: 'Save the query' });
    fireEvent.change(within(save).getByLabelText('Name'), { target: { value: 'After-bath on fibre' } });
    fireEvent.click(within(save).getByLabelText('Shared: every researcher can open it'));
    fireEvent.click(within(save).getByRole('button', { name: 'Save the query' }));
    await screen.findByText('Saved as “After-bath on fibre”.');
    expect(requests.find((r) => r.method === 'POST' && r.path === '/api/research/queries')!.body).toEqual({ name: 'After-bath on fibre', description: null, shared: true, query: IRON_BLUE_QUERY });

    const theirs = await screen.findByRole('listitem', { name: 'Selenium then iron blue' });
    const mine = screen.getByRole('listitem', { name: 'Iron blue, after-bath' });
    expect(within(mine).getByRole('button', { name: 'Rename' })).toBeTruthy();
    expect(within(theirs).queryByRole('button', { name: 'Rename' })).toBeNull();
    expect(within(theirs).queryByRole('button', { name: 'Delete' })).toBeNull();
    fireEvent.click(within(theirs).getByRole('button', { name: 'Open' }));
    await waitFor(() => expect(currentQuery(router)?.groupBy).toEqual(['tonerSequence']));

    // The owner renames (with the version it opened) and deletes (after a question).
    fireEvent.click(within(mine).getByRole('button', { name: 'Rename' }));
    const rename = within(mine).getByRole('form', { name: 'Rename Iron blue, after-bath' });
    fireEvent.change(within(rename).getByLabelText('Name'), { target: { value: 'Iron blue on fibre, after-bath' } });
    fireEvent.click(within(rename).getByLabelText('Shared: every researcher can open it'));
    fireEvent.click(within(rename).getByRole('button', { name: 'Save' }));
    await waitFor(() => expect(requests.find((r) => r.method === 'PATCH')?.body).toEqual({ name: 'Iron blue on fibre, after-bath', description: 'Fibre prints only.', shared: true, version: 1 }));
    fireEvent.click(within(mine).getByRole('button', { name: 'Delete' }));
    fireEvent.click(within(mine).getByRole('button', { name: 'Delete it' }));
    await waitFor(() => expect(requests.find((r) => r.method === 'DELETE')?.search.get('version')).toBe('1'));
  });
});
