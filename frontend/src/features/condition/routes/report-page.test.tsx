import { describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import type { Role } from '@toneledger/common/domain/roles';
import type { ConditionReport } from '@toneledger/common/schemas/condition';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderRoutes } from '@/test/render';
import { ReportNewPage } from '@/features/condition/routes/report-new-page';
import { ReportPage, printer } from '@/features/condition/routes/report-page';
import { GRADE_DEFINITIONS, OTHER_ID, PRINT_ID, REPORT_ID, conditionHandlers, makeReport } from '@/features/condition/testing/fixtures';

type Handlers = Parameters<typeof mockFetch>[0];

function renderReport(report: ConditionReport, role: Role = 'conservator', handlers: Handlers = {}) {
  const fetch = mockFetch({ ...conditionHandlers(report), ...handlers });
  const view = renderRoutes(
    [
      { path: '/condition/reports/:id', element: <ReportPage /> },
      { path: '/condition/prints/:id', element: <p>print condition page</p> },
    ],
    { path: `/condition/reports/${report.id}`, me: makeMe(role) },
  );
  return { ...fetch, ...view };
}

describe('report editor: the author’s draft', () => {
  it('shows each grade with the written definition from the settings beside it', async () => {
    renderReport(makeReport());
    const group = await screen.findByRole('radiogroup', { name: 'Overall grade' });
    await waitFor(() => expect(within(group).getByText(GRADE_DEFINITIONS.poor)).toBeTruthy());
    const poor = within(group).getByRole('radio', { name: 'Poor' });
    expect(document.getElementById(poor.getAttribute('aria-describedby')!)?.textContent).toBe(GRADE_DEFINITIONS.poor);
    expect((within(group).getByRole('radio', { name: 'Fair' }) as HTMLInputElement).checked).toBe(true);
  });

  it('lets the author edit, save only what changed, and sign after confirming', async () => {
    const signed = makeReport({ status: 'signed', grade: 'poor', version: 4, signedAt: '2024-03-13T09:00:00.000Z' });
    const { requests } = renderReport(makeReport(), 'conservator', {
      [`PATCH /api/condition-reports/${REPORT_ID}`]: () => json({ data: makeReport({ grade: 'poor', version: 3 }) }),
      [`POST /api/condition-reports/${REPORT_ID}/sign`]: () => json({ data: signed }),
    });
    const group = await screen.findByRole('radiogroup', { name: 'Overall grade' });
    fireEvent.click(within(group).getByRole('radio', { name: 'Poor' }));
    fireEvent.click(screen.getByRole('button', { name: 'Sign report' }));
    const confirm = screen.getByRole('alertdialog', { name: 'Confirm signing' });
    expect(confirm.textContent).toContain('Signing locks the report; later corrections are addenda');
    expect(requests.some((r) => r.method !== 'GET')).toBe(false);
    fireEvent.click(within(confirm).getByRole('button', { name: 'Sign and lock' }));

    expect(await screen.findByText(/Signed on/)).toBeTruthy();
    const writes = requests.filter((r) => r.method !== 'GET');
    expect(writes.map((r) => `${r.method} ${r.path}`)).toEqual([`PATCH /api/condition-reports/${REPORT_ID}`, `POST /api/condition-reports/${REPORT_ID}/sign`]);
    expect(writes[0]?.body).toEqual({ version: 2, grade: 'poor' });
    expect(writes[1]?.body).toEqual({ version: 3 });
    expect(screen.queryByRole('button', { name: 'Save draft' })).toBeNull();
  });

  it('adds, reorders and removes observations, and puts the server’s errors on the observation’s fields', async () => {
    const { requests } = renderReport(makeReport(), 'conservator', {
      [`PATCH /api/condition-reports/${REPORT_ID}`]: () =>
        errorResponse(400, 'validation_failed', 'Check the form', { details: [{ path: 'observations.1.severity', message: 'Not a severity this system knows', code: 'custom' }] }),
    });
    fireEvent.click(await screen.findByRole('button', { name: 'Add observation' }));
    const observed = screen.getAllByLabelText('Observed');
    expect(observed).toHaveLength(2);
    fireEvent.change(observed[1]!, { target: { value: 'foxing' } });
    fireEvent.change(screen.getAllByLabelText('Severity')[1]!, { target: { value: 'severe' } });
    fireEvent.click(screen.getByRole('button', { name: 'Move observation 2 up' }));
    expect((screen.getAllByLabelText('Observed')[0] as HTMLSelectElement).value).toBe('foxing');
    fireEvent.click(screen.getByRole('button', { name: 'Move observation 1 down' }));
    fireEvent.click(screen.getByRole('button', { name: 'Save draft' }));

    await waitFor(() => expect(screen.getByText('Not a severity this system knows')).toBeTruthy());
    const severity = screen.getAllByLabelText('Severity')[1] as HTMLSelectElement;
    expect(severity.getAttribute('aria-invalid')).toBe('true');
    expect(severity.value).toBe('severe');
    expect(screen.getByRole('link', { name: 'Observation 2 · Severity: Not a severity this system knows' })).toBeTruthy();
    const patch = requests.find((r) => r.method === 'PATCH');
    expect(patch?.body).toMatchObject({
      version: 2,
      observations: [
        { termCode: 'silver_mirroring', side: 'recto', area: 'margin', extent: 'localised', severity: 'slight', notes: 'Upper margin', region: null },
        { termCode: 'foxing', side: 'recto', area: 'image', extent: 'localised', severity: 'severe', region: null },
      ],
    });
    expect(Object.keys(patch?.body as object).sort()).toEqual(['observations', 'version']);

    fireEvent.click(screen.getByRole('button', { name: 'Remove observation 1' }));
    expect(screen.getAllByLabelText('Observed')).toHaveLength(1);
  });

  it('asks for the percentage when the extent is a percentage, before sending anything', async () => {
    const { requests } = renderReport(makeReport());
    fireEvent.change(await screen.findByLabelText('Extent'), { target: { value: 'percentage' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save draft' }));
    expect(await screen.findByText('Give the percentage affected')).toBeTruthy();
    expect(requests.some((r) => r.method === 'PATCH')).toBe(false);
  });

  it('shows what changed when the draft was saved elsewhere, and re-applies the edits on the current version', async () => {
    const current = makeReport({ version: 5, summary: 'Rewritten in another window.', context: 'before_display' });
    let patches = 0;
    const { requests } = renderReport(makeReport(), 'conservator', {
      [`PATCH /api/condition-reports/${REPORT_ID}`]: () => {
        patches += 1;
        if (patches === 1) {
          return errorResponse(409, 'conflict', 'Someone saved this record after you opened it.', {
            details: { current, lastChangedBy: 'Iris Penhale', lastChangedAt: '2024-03-12T11:00:00.000Z' },
          });
        }
        return json({ data: makeReport({ version: 6, summary: 'Mine.', context: 'before_display' }) });
      },
    });
    fireEvent.change(await screen.findByRole('textbox', { name: 'Summary' }), { target: { value: 'Mine.' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save draft' }));

    const notice = await screen.findByRole('alert', { name: 'Changed since you opened it' });
    expect(notice.textContent).toContain('now version 5');
    const summaryRow = within(notice).getByRole('rowheader', { name: 'Summary' }).closest('tr')!;
    expect(summaryRow.textContent).toContain('Rewritten in another window.');
    expect(summaryRow.textContent).toContain('You changed this too: Mine.');
    const contextRow = within(notice).getByRole('rowheader', { name: 'Context' }).closest('tr')!;
    expect(contextRow.textContent).toContain('Before display');
    expect((screen.getByRole('textbox', { name: 'Summary' }) as HTMLTextAreaElement).value).toBe('Mine.');

    fireEvent.click(within(notice).getByRole('button', { name: 'Re-apply my changes to the current version' }));
    expect((screen.getByLabelText('Context') as HTMLSelectElement).value).toBe('before_display');
    fireEvent.click(screen.getByRole('button', { name: 'Save draft' }));
    await waitFor(() => expect(patches).toBe(2));
    expect(requests.filter((r) => r.method === 'PATCH')[1]?.body).toEqual({ version: 5, summary: 'Mine.' });
  });

  it('shows the missing grade on the grade when signing is refused', async () => {
    const { requests } = renderReport(makeReport({ grade: null }), 'conservator');
    fireEvent.click(await screen.findByRole('button', { name: 'Sign report' }));
    fireEvent.click(screen.getByRole('button', { name: 'Sign and lock' }));
    expect(await screen.findByText('Give an overall grade before signing')).toBeTruthy();
    expect(screen.getByRole('radiogroup', { name: 'Overall grade' }).getAttribute('aria-invalid')).toBe('true');
    expect(requests.some((r) => r.method === 'POST')).toBe(false);
  });
});

describe('report page: who sees what', () => {
  it('shows another conservator’s draft read-only, with a note and no edit or sign controls', async () => {
    renderReport(makeReport({ examinerId: OTHER_ID, examinerName: 'Bram Otley' }));
    expect(await screen.findByText(/This is a draft by Bram Otley\. Only its author can change or sign it/)).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Save draft' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Sign report' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Add addendum' })).toBeNull();
    expect(screen.getByRole('article', { name: 'Condition report' }).textContent).toContain('Draft (not signed)');
  });

  it('shows a signed report read-only with who signed it, and lets a conservator add an addendum', async () => {
    const signed = makeReport({ status: 'signed', signedAt: '2024-03-13T09:00:00.000Z', examinerId: OTHER_ID, examinerName: 'Bram Otley', context: 'outgoing_loan' });
    const withAddendum = { ...signed, addenda: [{ id: 'd1111111-2222-4333-8444-555555555555', writtenAt: '2024-04-01T10:00:00.000Z', authorName: 'Iris Penhale', text: 'The mirroring extends to the left margin.' }] };
    const { requests } = renderReport(signed, 'conservator', {
      [`POST /api/condition-reports/${REPORT_ID}/addenda`]: () => json({ data: withAddendum }, 201),
    });
    const doc = await screen.findByRole('article', { name: 'Condition report' });
    expect(doc.textContent).toMatch(/Signed on .+ by Bram Otley/);
    await waitFor(() => expect(doc.textContent).toContain(`Fair — ${GRADE_DEFINITIONS.fair}`));
    expect(screen.queryByRole('button', { name: 'Save draft' })).toBeNull();
    expect(screen.queryByRole('radiogroup', { name: 'Overall grade' })).toBeNull();
    // A loan report prints with lines for both parties.
    expect(within(doc).getByRole('group', { name: 'Lender signature' })).toBeTruthy();
    expect(within(doc).getByRole('group', { name: 'Borrower signature' })).toBeTruthy();

    fireEvent.click(screen.getByRole('button', { name: 'Add addendum' }));
    expect(await screen.findByText('Write the correction or addition')).toBeTruthy();
    fireEvent.change(screen.getByLabelText('Addendum'), { target: { value: 'The mirroring extends to the left margin.' } });
    fireEvent.click(screen.getByRole('button', { name: 'Add addendum' }));
    expect(await within(doc).findByText('The mirroring extends to the left margin.')).toBeTruthy();
    expect(requests.find((r) => r.method === 'POST')?.body).toEqual({ text: 'The mirroring extends to the left margin.' });
  });

  it('gives a researcher the signed report without the addendum form, and prints it on request', async () => {
    const print = vi.spyOn(printer, 'print').mockImplementation(() => {});
    renderReport(makeReport({ status: 'signed', signedAt: '2024-03-13T09:00:00.000Z' }), 'researcher');
    const doc = await screen.findByRole('article', { name: 'Condition report' });
    expect(within(doc).getByRole('group', { name: 'Examiner signature' }).textContent).toContain('Iris Penhale');
    expect(await within(doc).findByText('Westcombe Photographic Trust')).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Add addendum' })).toBeNull();
    fireEvent.click(screen.getByRole('button', { name: 'Print report' }));
    expect(print).toHaveBeenCalledOnce();
  });
});

describe('new report', () => {
  it('starts on today in the routine context and goes to the saved draft', async () => {
    const created = makeReport({ id: 'a2111111-2222-4333-8444-555555555555', grade: null, observations: [], version: 1 });
    const { requests, router } = (() => {
      const fetch = mockFetch({ ...conditionHandlers(), [`POST /api/prints/${PRINT_ID}/condition-reports`]: () => json({ data: created }, 201) });
      const view = renderRoutes(
        [
          { path: '/condition/prints/:id/reports/new', element: <ReportNewPage /> },
          { path: '/condition/reports/:id', element: <p>report page</p> },
        ],
        { path: `/condition/prints/${PRINT_ID}/reports/new`, me: makeMe('conservator') },
      );
      return { ...fetch, ...view };
    })();
    const examined = (await screen.findByLabelText('Examined on')) as HTMLInputElement;
    expect(examined.value).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    fireEvent.change(examined, { target: { value: '2024-03-12' } });
    fireEvent.change(screen.getByLabelText('Context'), { target: { value: 'incoming' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save draft' }));
    await waitFor(() => expect(router.state.location.pathname).toBe(`/condition/reports/${created.id}`));
    expect(requests.find((r) => r.method === 'POST')?.body).toEqual({
      examinedOn: '2024-03-12', context: 'incoming', grade: null, summary: null, recommendations: null, nextCheckOn: null, observations: [],
    });
  });

  it('says a day the calendar lacks (typed 02/31/2024) does not exist, keeps the form, and sends nothing', async () => {
    const { requests } = mockFetch({ ...conditionHandlers() });
    renderRoutes([{ path: '/condition/prints/:id/reports/new', element: <ReportNewPage /> }], {
      path: `/condition/prints/${PRINT_ID}/reports/new`, me: makeMe('conservator'),
    });
    const examined = (await screen.findByLabelText('Examined on')) as HTMLInputElement;
    // What the browser does with 02/31/2024 in a date control: the value empties and validity.badInput is set.
    Object.defineProperty(examined, 'validity', { configurable: true, get: () => ({ badInput: true, valid: false }) });
    fireEvent.change(examined, { target: { value: '' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save draft' }));
    const message = await screen.findAllByText('That day does not exist (for example 31 February): check the day and the month.');
    expect(message.length).toBeGreaterThan(0);
    expect(screen.queryByText(/YYYY-MM-DD/)).toBeNull();
    expect(requests.some((r) => r.method === 'POST')).toBe(false);
  });
});
