import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import type { BrowserContext, Page } from 'playwright-core';
import { DEMO_ACCOUNTS } from '../backend/src/seed/demo-accounts';
import { openBrowser, screenshot, signInAs, BASE_URL } from './browser';

let browser: { context: BrowserContext; close(): Promise<void> };
let page: Page;
const stamp = `${Date.now() % 1_000_000}`;
const reference = `EXP-${stamp}`;
const registrar = DEMO_ACCOUNTS.find((a) => a.role === 'registrar')!.name;

beforeAll(async () => {
  browser = await openBrowser();
  page = await browser.context.newPage();
  await signInAs(page, 'registrar');
  const status = await page.evaluate(async (ref) => {
    const res = await fetch('/api/loans', {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ direction: 'out', reference: ref, otherInstitution: '=Harrowgate Gallery', purpose: 'exhibition' }),
    });
    return res.status;
  }, reference);
  expect(status).toBe(201);
});
afterAll(() => browser?.close());

describe('exports and the audit trail', () => {
  it('exports the loans list as filtered on screen: a CSV a spreadsheet opens, and its data dictionary', async () => {
    await page.goto(`${BASE_URL}/loans?q=${reference}`);
    await page.getByRole('link', { name: reference }).first().waitFor();
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Export CSV' }).click()]);
    const text = readFileSync((await download.path())!, 'utf8');
    expect(text.charCodeAt(0)).toBe(0xfeff);
    const lines = text.slice(1).trim().split('\n');
    expect(lines).toHaveLength(2);
    expect(lines[1]).toContain(reference);
    // A cell that a spreadsheet would run as a formula is written with a leading quote.
    expect(lines[1]).toContain("'=Harrowgate Gallery");
    const dictionary = await page.getByRole('link', { name: 'Data dictionary' }).getAttribute('href');
    const columns = await page.evaluate(async (href) => (await fetch(href!)).text(), dictionary);
    expect(columns.split('\n')[0]).toContain('column,meaning,type,unit,source');
  });

  it('filters the audit trail by person, action and days with pickers, and tells each event as a sentence', async () => {
    await signInAs(page, 'admin');
    await page.goto(`${BASE_URL}/admin/audit`);
    const today = new Date().toISOString().slice(0, 10);
    await page.getByLabel('Person').selectOption({ label: registrar });
    await page.getByLabel('Action').selectOption({ label: 'Loan proposed' });
    await page.getByLabel('From (day)').fill(today);
    await page.getByLabel('To (day)').fill(today);
    await page.getByRole('button', { name: 'Filter' }).click();
    await page.waitForURL(/action=loan\.created/);
    await page.getByText(`${registrar} proposed loan ${reference}.`).waitFor();
    await page.getByRole('button', { name: 'Show changes' }).first().click();
    await page.getByRole('table', { name: 'Fields changed, before and after' }).first().waitFor();
    const body = await page.locator('main').innerText();
    expect(body).not.toMatch(/loan\.created|"reference"|in_transit|\{"/);
    const href = await page.getByRole('link', { name: 'Export CSV' }).getAttribute('href');
    expect(new URL(href!, BASE_URL).searchParams.get('from')).toBe(today);
    await screenshot(page, 'audit-filtered');
  });
});
