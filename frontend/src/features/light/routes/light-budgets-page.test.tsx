import { describe, expect, it } from 'vitest';
import { screen, within } from '@testing-library/react';
import { json, mockFetch } from '@/test/fetch-mock';
import { makeMe } from '@/test/fixtures';
import { renderPage } from '@/test/render';
import { LightBudgetsPage } from '@/features/light/routes/light-budgets-page';

const item = {
  printId: '3f2d9a40-6c1b-4e8f-9a7d-5b0c2e1f4a11',
  accessionNumber: '1987.14.3',
  printTitle: 'Quay at low water, iron-blue toned',
  category: 'high' as const,
  annualLuxHours: 15_000,
  usedThisYear: 12_000,
  planned: 8_800,
  warnings: [{ code: 'planned_exceeds_budget', message: 'The planned displays would take it to 20,800 lx·h in 12 months, past its budget of 15,000 lx·h.' }],
};

describe('LightBudgetsPage', () => {
  it('lists the prints whose planned displays would exceed their budget, each linked to its page', async () => {
    mockFetch({ 'GET /api/light/over-budget': () => json({ data: [item] }) });
    renderPage(<LightBudgetsPage />, { me: makeMe('conservator') });
    const table = await screen.findByRole('table', { name: 'Prints over their light budget' });
    const cells = within(within(table).getAllByRole('row')[1]!).getAllByRole('cell').map((c) => c.textContent);
    expect(cells).toEqual([
      '1987.14.3Quay at low water, iron-blue toned',
      'High (Blue Wool 1–3)',
      '15,000 lx·h',
      '12,000 lx·h',
      '8,800 lx·h',
      item.warnings[0]!.message,
    ]);
    expect(within(table).getByRole('link', { name: '1987.14.3' }).getAttribute('href')).toBe(`/catalogue/prints/${item.printId}`);
  });

  it('says so when no print is over its budget', async () => {
    mockFetch({ 'GET /api/light/over-budget': () => json({ data: [] }) });
    renderPage(<LightBudgetsPage />, { me: makeMe('researcher') });
    expect(await screen.findByText("No print's planned displays exceed its budget.")).toBeTruthy();
  });
});
