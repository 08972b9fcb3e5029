import { describe, expect, it } from 'vitest';
import { fireEvent, screen, within } from '@testing-library/react';
import { DEFAULT_LIGHT_SETTINGS } from '@toneledger/common/domain/light-rules';
import { LIGHT_BUDGET_SOURCE } from '@toneledger/common/domain/light-budget';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { LightSettingsPage } from '@/features/light/routes/light-settings-page';

const GET = 'GET /api/settings/light';
const PUT = 'PUT /api/settings/light';
const RECOMPUTE = 'GET /api/settings/light/recompute';
const noRecompute = () => json({ data: null });

function type(field: HTMLElement, value: string) {
  fireEvent.change(field, { target: { value } });
}

/** The control of a budget figure inside its category's group. */
function budgetField(category: RegExp, label: string) {
  return within(screen.getByRole('group', { name: category })).getByLabelText<HTMLInputElement>(label);
}

describe('LightSettingsPage', { timeout: 20_000 }, () => {
  it('shows the budgets with their source and the rules in order', async () => {
    mockFetch({ [GET]: () => json({ data: DEFAULT_LIGHT_SETTINGS }), [RECOMPUTE]: noRecompute });
    renderPage(<LightSettingsPage />, { me: makeMe('admin') });
    await screen.findByRole('group', { name: /^High/ });
    expect(budgetField(/^High/, 'Maximum illuminance (lx)').value).toBe('50');
    expect(budgetField(/^High/, 'Annual exposure (lx·h)').value).toBe('15000');
    expect(budgetField(/^Irresponsive/, 'Annual exposure (lx·h)').value).toBe('');
    expect(screen.getByLabelText<HTMLTextAreaElement>('Source of the budgets').value).toBe(LIGHT_BUDGET_SOURCE);
    const rules = screen.getAllByRole('listitem');
    expect(rules).toHaveLength(DEFAULT_LIGHT_SETTINGS.rules.length);
    // The first rule: iron-blue toning, any process, gives "high".
    expect(within(rules[0]!).getByLabelText<HTMLSelectElement>('Process').value).toBe('');
    expect(within(rules[0]!).getByLabelText<HTMLSelectElement>('Toner').value).toBe('iron_blue');
    expect(within(rules[0]!).getByLabelText<HTMLSelectElement>('Category').value).toBe('high');
  });

  it('refuses a figure that is not a number without sending it', async () => {
    const { requests } = mockFetch({ [GET]: () => json({ data: DEFAULT_LIGHT_SETTINGS }), [RECOMPUTE]: noRecompute });
    renderPage(<LightSettingsPage />, { me: makeMe('admin') });
    await screen.findByRole('group', { name: /^High/ });
    type(budgetField(/^High/, 'Annual exposure (lx·h)'), '15 000');
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect(await screen.findAllByText('Enter a number')).not.toHaveLength(0);
    expect(budgetField(/^High/, 'Annual exposure (lx·h)').getAttribute('aria-invalid')).toBe('true');
    expect(budgetField(/^High/, 'Annual exposure (lx·h)').value).toBe('15 000');
    expect(requests.filter((r) => r.method === 'PUT')).toHaveLength(0);
  });

  it('shows a refusal from the server on its field, keeps what was typed, then saves the figures as numbers and the rules in their new order', async () => {
    let puts = 0;
    const { requests } = mockFetch({
      [GET]: () => json({ data: DEFAULT_LIGHT_SETTINGS }),
      [RECOMPUTE]: noRecompute,
      [PUT]: (request) => {
        puts += 1;
        return puts === 1
          ? errorResponse(400, 'validation_failed', 'Check the settings', { details: [{ path: 'budgets.high.annualLuxHours', message: 'Higher than the medium budget', code: 'custom' }] })
          : json({ data: request.body });
      },
    });
    renderPage(<LightSettingsPage />, { me: makeMe('admin') });
    await screen.findByRole('group', { name: /^High/ });
    type(budgetField(/^High/, 'Annual exposure (lx·h)'), '12000');
    type(budgetField(/^Low/, 'Maximum illuminance (lx)'), '');
    fireEvent.click(screen.getByRole('button', { name: 'Move rule 1 down' }));
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect(await screen.findAllByText('Higher than the medium budget')).not.toHaveLength(0);
    expect(budgetField(/^High/, 'Annual exposure (lx·h)').value).toBe('12000');

    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect(await screen.findByText('Settings saved.')).toBeTruthy();
    const bodies = requests.filter((r) => r.method === 'PUT').map((r) => r.body as typeof DEFAULT_LIGHT_SETTINGS);
    expect(bodies).toHaveLength(2);
    const body = bodies[1]!;
    expect(body.budgets.high).toEqual({ maxLux: 50, annualLuxHours: 12_000 });
    expect(body.budgets.low).toEqual({ maxLux: null, annualLuxHours: DEFAULT_LIGHT_SETTINGS.budgets.low.annualLuxHours });
    const [first, second, ...rest] = DEFAULT_LIGHT_SETTINGS.rules;
    const plain = (r: (typeof DEFAULT_LIGHT_SETTINGS.rules)[number]) => ({ process: r.process ?? null, tonerClass: r.tonerClass ?? null, category: r.category });
    expect(body.rules).toEqual([second!, first!, ...rest].map(plain));
  });

  it('is read-only for people who do not manage settings', async () => {
    mockFetch({ [GET]: () => json({ data: DEFAULT_LIGHT_SETTINGS }), [RECOMPUTE]: noRecompute });
    renderPage(<LightSettingsPage />, { me: makeMe('conservator') });
    await screen.findByRole('group', { name: /^High/ });
    expect(budgetField(/^High/, 'Maximum illuminance (lx)').closest('fieldset:disabled')).not.toBeNull();
    expect(screen.queryByRole('button', { name: 'Save' })).toBeNull();
    expect(screen.getByText('Only administrators change these settings.')).toBeTruthy();
  });

  it('shows how far the recompute after a change has gone, asking again while it runs, then when it ended', async () => {
    const startedAt = '2026-03-02T09:00:00.000Z';
    const answers = [
      { status: 'running', done: 40_000, total: 200_000, startedAt, finishedAt: null },
      { status: 'running', done: 45_000, total: 200_000, startedAt, finishedAt: null },
      { status: 'done', done: 200_000, total: 200_000, startedAt, finishedAt: '2026-03-02T09:01:10.000Z' },
    ];
    const { requests } = mockFetch({ [GET]: () => json({ data: DEFAULT_LIGHT_SETTINGS }), [RECOMPUTE]: () => json({ data: answers.length > 1 ? answers.shift() : answers[0] }) });
    renderPage(<LightSettingsPage />, { me: makeMe('admin') });
    expect(await screen.findByText('Recomputing categories: 40,000 of 200,000')).toBeTruthy();
    expect(await screen.findByText('Recomputing categories: 45,000 of 200,000', undefined, { timeout: 5_000 })).toBeTruthy();
    expect(await screen.findByText(/^Categories and light warnings of 200,000 prints recomputed on /, undefined, { timeout: 5_000 })).toBeTruthy();
    const asked = requests.filter((r) => r.path === '/api/settings/light/recompute').length;
    expect(asked).toBe(3);
    // Done: no more asking.
    await new Promise((r) => setTimeout(r, 2_500));
    expect(requests.filter((r) => r.path === '/api/settings/light/recompute')).toHaveLength(asked);
  });
});
