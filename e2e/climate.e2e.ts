import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { openBrowser, screenshot, signInAs, BASE_URL } from './browser';

/**
 * A conservator loads a logger file for a new store room: the upload, the column mapping with the
 * file's first rows, a check that names the bad row (nothing can be accepted), the file discarded, a
 * good file (°F, local time in Europe/London) checked and accepted, and the room's figures shown with
 * their sources, and the room on the rooms page.
 *
 * 59 °F = 15 °C and 64.4 °F = 18 °C by °C = (°F − 32) × 5/9 (NIST SP 811); both within the default
 * target of 2–18 °C (DEFAULT_CLIMATE_SETTINGS), and 45 % within 30–50 %: no time outside.
 */

const stamp = String(Date.now() % 1_000_000);
const ROOM = `Logger store ${stamp}`;
let roomId = '';
let browser: { context: BrowserContext; close(): Promise<void> };
let page: Page;

const csv = (rows: string[]) => Buffer.from(['Date Time,Temp (°F),RH (%)', ...rows].join('\n'), 'utf8');

beforeAll(async () => {
  browser = await openBrowser();
  page = await browser.context.newPage();
  await signInAs(page, 'registrar');
  roomId = await page.evaluate(async (name) => {
    const res = await fetch('/api/locations', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ name, kind: 'room' }) });
    if (res.status !== 201) throw new Error(`${res.status} ${await res.text()}`);
    return ((await res.json()) as { data: { id: string } }).data.id;
  }, ROOM);
  await signInAs(page, 'conservator');
});
afterAll(() => browser?.close());

describe('storage climate in the browser', () => {
  it('refuses a file with a bad row, then loads a good one and shows the figures', async () => {
    await page.goto(`${BASE_URL}/climate/locations/${roomId}`);
    await screenshot(page, 'climate-empty');
    await page.getByRole('button', { name: 'Load a logger file' }).click();
    await page.getByLabel(/Logger CSV/).setInputFiles({ name: 'bad.csv', mimeType: 'text/csv', buffer: csv(['29/03/2026 00:30,59,45', '29/03/2026 01:30,59,45']) });
    await page.getByLabel('Date and time column').waitFor();
    expect(await page.getByLabel('Temperature unit').inputValue()).toBe('F');
    await page.getByLabel("Time zone of the logger's clock").fill('Europe/London');
    await page.getByRole('button', { name: 'Check the file' }).click();
    const problems = page.getByRole('table', { name: /Rows that cannot be read/ });
    await problems.getByText(/does not exist in Europe\/London/).waitFor();
    expect(await problems.getByRole('cell', { name: '3', exact: true }).count()).toBe(1);
    expect(await page.getByRole('button', { name: /^Accept/ }).count()).toBe(0);
    await screenshot(page, 'climate-bad-row');
    await page.getByRole('button', { name: 'Discard this file' }).click();

    await page.getByRole('button', { name: 'Load a logger file' }).click();
    const rows = Array.from({ length: 24 }, (_, h) => `10/03/2026 ${String(h).padStart(2, '0')}:00,${h < 12 ? 59 : 64.4},45`);
    await page.getByLabel(/Logger CSV/).setInputFiles({ name: 'good.csv', mimeType: 'text/csv', buffer: csv(rows) });
    await page.getByLabel("Time zone of the logger's clock").fill('Europe/London');
    await page.getByRole('button', { name: 'Check the file' }).click();
    await page.getByRole('button', { name: 'Accept 24 readings' }).click();
    await page.getByText('24 new readings were written.').waitFor();
    await page.getByRole('button', { name: 'Done' }).click();

    // The figures over the days around the file: mean (15 × 12 + 18 × 12) / 24 = 16.5 °C, nothing outside.
    await page.goto(`${BASE_URL}/climate/locations/${roomId}?from=2026-03-10&to=2026-03-10`);
    await page.getByText('16.5 °C').first().waitFor();
    await page.getByText('0.0 %').first().waitFor();
    await page.getByRole('complementary', { name: 'Settings and sources' }).getByText('83.68 kJ/mol').waitFor();
    await page.getByRole('table', { name: 'Logger files' }).getByText('Accepted').waitFor();
    await screenshot(page, 'climate-location');

    // The rooms page puts it beside the other rooms holding readings, over the same period.
    await page.goto(`${BASE_URL}/climate?from=2026-03-10&to=2026-03-10`);
    const row = page.getByRole('row', { name: new RegExp(ROOM) });
    await row.getByText('16.5 °C').waitFor();
    await screenshot(page, 'climate-rooms');
  });
});
