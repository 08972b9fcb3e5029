import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { openBrowser, screenshot, signInAs, BASE_URL } from './browser';

let browser: { context: BrowserContext; close(): Promise<void> };
let page: Page;
let printId: string;
const stamp = String(Date.now() % 100000);

beforeAll(async () => {
  browser = await openBrowser();
  page = await browser.context.newPage();
  await signInAs(page, 'registrar');
  printId = await page.evaluate(async (s) => {
    const res = await fetch('/api/prints', {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ accessionNumber: `2093.${s}.1`, title: `Quay in blue ${s}`, process: 'gelatin_silver_developing_out' }),
    });
    return ((await res.json()) as { data: { id: string } }).data.id;
  }, stamp);
  await signInAs(page, 'conservator');
});
afterAll(() => browser?.close());

async function recordSession(date: string, lab: [string, string, string], expectPreview?: RegExp) {
  await page.getByRole('button', { name: 'Record a session' }).click();
  await page.waitForURL(/\/sessions\/new$/);
  await page.getByLabel('Measured on', { exact: true }).fill(date);
  await page.getByLabel('Instrument', { exact: true }).fill('Harlow Instruments SP-4');
  await page.getByLabel('Geometry', { exact: true }).selectOption('45/0');
  const spot = page.getByRole('region', { name: /Dmax/ }).or(page.locator('section', { hasText: 'Dmax' })).first();
  await spot.getByLabel('L*', { exact: true }).first().fill(lab[0]);
  await spot.getByLabel('a*', { exact: true }).first().fill(lab[1]);
  await spot.getByLabel('b*', { exact: true }).first().fill(lab[2]);
  if (expectPreview) await page.getByText(expectPreview).first().waitFor();
  await page.getByRole('button', { name: 'Save session' }).click();
  await page.waitForURL(new RegExp(`/measurements/prints/${printId}$`));
}

describe('a conservator measures a print', () => {
  it('registers a spot, records two sessions, and sees ΔE00 and the chart update', async () => {
    await page.goto(`${BASE_URL}/measurements/prints/${printId}`);
    await page.getByRole('button', { name: 'New spot' }).click();
    await page.getByLabel('Spot name').fill('Dmax sky');
    await page.getByLabel('Purpose').selectOption('dmax');
    await page.getByRole('button', { name: 'Save spot' }).click();
    await page.getByRole('region', { name: /Dmax sky/ }).first().waitFor();

    // Baseline, then a later session: Sharma, Wu & Dalal (2005) Table 1 pair 1 gives ΔE00 2.0425.
    await recordSession('2020-03-01', ['50', '2.6772', '-79.7751']);
    await recordSession('2024-03-01', ['50', '0', '-82.7485'], /ΔE00 2\.04/);

    const card = page.getByRole('region', { name: /Dmax sky/ }).first();
    await card.getByText(/2\.04/).first().waitFor();
    const chart = card.getByRole('img').first();
    await chart.waitFor();
    const description = await chart.evaluate((el) => {
      const ids = (el.getAttribute('aria-describedby') ?? '').split(/\s+/).filter(Boolean);
      return ids.map((id) => document.getElementById(id)?.textContent ?? '').join(' ');
    });
    expect(description).toMatch(/2\.04/);
    // Two sessions are not enough for a rate: the page says so instead of inventing one.
    await card.getByText(/not enough|at least three|3 sessions/i).first().waitFor();
    await screenshot(page, 'measurements-print');
  });

  it('a researcher reads the measurements but cannot record', async () => {
    const researcher = await browser.context.newPage();
    try {
      await signInAs(researcher, 'researcher');
      await researcher.goto(`${BASE_URL}/measurements/prints/${printId}`);
      await researcher.getByRole('region', { name: /Dmax sky/ }).first().waitFor();
      expect(await researcher.getByRole('button', { name: 'Record a session' }).count()).toBe(0);
    } finally {
      await researcher.close();
    }
  });
});
