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

  it('at 1440 × 900 shows every column of the trail unclipped, each record by its kind and name linked to its page, never an id or a code', async () => {
    await signInAs(page, 'admin');
    await page.setViewportSize({ width: 1440, height: 900 });
    await page.goto(`${BASE_URL}/admin/audit`);
    await page.getByRole('table', { name: 'Audit events' }).waitFor();
    await page.getByLabel('Record type').selectOption({ label: 'Loan' });
    await page.getByRole('button', { name: 'Filter' }).click();
    await page.waitForURL(/entityType=loan/);
    const link = page.getByRole('link', { name: reference }).first();
    await link.waitFor();
    const loanId = new URL((await link.getAttribute('href'))!, BASE_URL).pathname.split('/').pop()!;
    expect(await link.getAttribute('href')).toBe(`/loans/${loanId}`);

    await page.getByRole('button', { name: `Show only the events of Loan ${reference}` }).first().click();
    await page.waitForURL(new RegExp(`entityId=${loanId}`));
    await page.getByText(`Only this record: Loan ${reference}`).waitFor();
    expect(await page.getByRole('textbox', { name: /record/i }).count()).toBe(0);

    // The whole trail, sign-ins included: no column is clipped and the table needs no sideways scroll.
    await page.getByRole('button', { name: 'Clear filters' }).click();
    await page.waitForURL((url) => !url.search.includes('entity'));
    await page.getByText(/signed in\./).first().waitFor();
    const layout = await page.evaluate(() => {
      const main = document.querySelector('table')!;
      const table = main.parentElement!;
      const headers = [...main.querySelectorAll('thead th')].map((h) => ({ text: h.textContent, right: Math.round(h.getBoundingClientRect().right), width: Math.round(h.getBoundingClientRect().width) }));
      const clipped = [...main.querySelectorAll('th, td')].filter((c) => c.scrollWidth > c.clientWidth + 1).map((c) => (c.textContent ?? '').slice(0, 40));
      return { headers, clipped, wrap: { scroll: table.scrollWidth, client: table.clientWidth }, viewport: window.innerWidth };
    });
    expect(layout.headers.map((h) => h.text)).toEqual(['When', 'Who', 'What happened', 'Record']);
    expect(layout.clipped).toEqual([]);
    expect(layout.wrap.scroll).toBeLessThanOrEqual(layout.wrap.client);
    for (const h of layout.headers) expect(h.right, `${h.text} ends inside the window`).toBeLessThanOrEqual(layout.viewport);
    const body = await page.locator('main').innerText();
    expect(body).not.toMatch(/[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/i);
    expect(body).not.toMatch(/\b(condition_report|measurement_session|measurement_spot|print_schedule|object_entry)\b/);
    await screenshot(page, 'audit-1440');
  });
});
