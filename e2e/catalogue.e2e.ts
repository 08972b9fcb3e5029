import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { openBrowser, screenshot, signInAs, BASE_URL } from './browser';

let browser: { context: BrowserContext; close(): Promise<void> };
let page: Page;
const stamp = String(Date.now() % 100000);
const accession = `2095.${stamp}.1`;

beforeAll(async () => {
  browser = await openBrowser();
  page = await browser.context.newPage();
  await signInAs(page, 'registrar');
});
afterAll(() => browser?.close());

describe('a registrar catalogues a print', () => {
  it('creates a bath recipe and sees its amounts per litre and the safety cautions', async () => {
    await page.goto(`${BASE_URL}/catalogue/recipes`);
    await page.getByRole('button', { name: 'New recipe' }).click();
    await page.getByLabel('Name', { exact: true }).fill(`Iron blue single bath ${stamp}`);
    await page.getByLabel('Final volume (ml)').fill('500');
    const rows: [string, string, string, string][] = [
      ['ferric ammonium citrate', '4', 'g', ''],
      ['potassium ferricyanide', '4', 'g', ''],
      ['acetic acid', '130', 'g', '28'],
    ];
    for (let i = 0; i < rows.length; i++) {
      if (i > 0) await page.getByRole('button', { name: /Add (an )?ingredient/i }).click();
      const group = page.getByRole('group', { name: `Ingredient ${i + 1}` });
      await group.getByLabel('Chemical').fill(rows[i][0]);
      await group.getByLabel('Amount').fill(rows[i][1]);
      await group.getByLabel('Unit').selectOption(rows[i][2]);
      if (rows[i][3]) await group.getByLabel('Strength (%)').fill(rows[i][3]);
    }
    await expect.poll(() => page.getByText('72.8').first().isVisible()).toBe(true);
    await expect.poll(() => page.getByText(/ferricyanide/i).first().isVisible()).toBe(true);
    await page.getByRole('button', { name: 'Save' }).click();
    await page.waitForURL(/\/catalogue\/recipes\/[0-9a-f-]{36}$/);
    await expect.poll(() => page.getByText(/safety data sheet/i).first().isVisible()).toBe(true);
    await screenshot(page, 'catalogue-recipe');
  });

  it('creates a buffered enclosure type', async () => {
    await page.goto(`${BASE_URL}/catalogue/enclosures`);
    await page.getByRole('button', { name: 'New enclosure type' }).click();
    await page.getByLabel('Name', { exact: true }).fill(`Buffered four-flap ${stamp}`);
    await page.getByLabel('Alkaline-buffered').selectOption({ label: 'Yes' });
    await page.getByLabel('Photographic Activity Test').selectOption('passed');
    await page.getByRole('button', { name: 'Save' }).click();
    await page.getByRole('cell', { name: `Buffered four-flap ${stamp}` }).first().waitFor();
  });

  it('creates a print, adds a toning step with the recipe, and finds it by search', async () => {
    await page.goto(`${BASE_URL}/catalogue`);
    await page.getByRole('link', { name: 'New print' }).or(page.getByRole('button', { name: 'New print' })).first().click();
    await page.getByLabel('Accession number').fill(accession);
    await page.getByLabel('Title').fill(`Breakwater in fog ${stamp}`);
    await page.getByLabel('Date made').fill('1968-04~');
    await page.getByText(/April 1968/).first().waitFor();
    await page.getByLabel('Process').selectOption('gelatin_silver_developing_out');
    await page.getByRole('button', { name: 'Save' }).click();
    await page.getByRole('heading', { name: accession, exact: true }).waitFor();

    await page.getByRole('link', { name: /Edit process history/ }).click();
    await page.getByLabel('Kind of step to add').selectOption('toning');
    await page.getByRole('button', { name: 'Add step' }).click();
    const step = page.getByRole('listitem', { name: /Step 1: Toning/ });
    await step.getByLabel('Toner', { exact: true }).selectOption('iron_blue');
    // The recipe holds potassium ferricyanide, so the list marks it hazardous.
    await step.getByLabel('Recipe').selectOption({ label: `Iron blue single bath ${stamp} (⚠ hazardous)` });
    await step.getByLabel('Time (m:ss or seconds)').fill('4:00');
    await step.getByLabel('Extent').selectOption('full');
    await page.getByRole('button', { name: 'Save process history' }).click();
    await page.getByRole('heading', { name: accession, exact: true }).waitFor();
    await page.getByText(`Iron blue single bath ${stamp}`).first().waitFor();

    await page.goto(`${BASE_URL}/catalogue`);
    await page.getByLabel('Search the catalogue').fill('breakwater fog');
    await page.getByLabel('Search the catalogue').press('Enter');
    await page.getByRole('link', { name: new RegExp(accession.replace(/\./g, '\\.')) }).or(page.getByRole('link', { name: `Breakwater in fog ${stamp}` })).first().waitFor();
    expect(new URL(page.url()).searchParams.get('q')).toBe('breakwater fog');
    await screenshot(page, 'catalogue-search');
  });

  it('sees the buffered-enclosure warning when choosing a buffered enclosure for the iron-blue print', async () => {
    await page.getByRole('link', { name: `Breakwater in fog ${stamp}` }).or(page.getByRole('link', { name: new RegExp(accession.replace(/\./g, '\\.')) })).first().click();
    await page.getByRole('heading', { name: accession, exact: true }).waitFor();
    await page.getByRole('link', { name: /^Edit$/ }).or(page.getByRole('link', { name: 'Edit print' })).first().click();
    const enclosure = page.getByLabel('Enclosure');
    const option = enclosure.locator('option', { hasText: `Buffered four-flap ${stamp}` });
    await option.waitFor({ state: 'attached' });
    await enclosure.selectOption((await option.getAttribute('value'))!);
    // The warning is previewed in the form before saving …
    await page.getByText(/buffered/i).filter({ hasText: /iron.blue|Prussian/i }).first().waitFor();
    await page.getByRole('button', { name: 'Save' }).click();
    await page.getByRole('heading', { name: accession, exact: true }).waitFor();
    // … and stored on the record.
    await page.waitForURL((u) => !u.pathname.endsWith('/edit'));
    const warnings = page.getByRole('region', { name: 'Warnings', exact: true });
    await warnings.waitFor();
    expect(await warnings.innerText()).toMatch(/buffered/i);
    await screenshot(page, 'catalogue-print-warning');
  });

  it('imports a small CSV: checks it, then writes every row', async () => {
    const dir = mkdtempSync(path.join(os.tmpdir(), 'toneledger-e2e-'));
    try {
      const file = path.join(dir, 'three-prints.csv');
      writeFileSync(
        file,
        [
          'accession_number,title,maker,date_made,process,toner_classes',
          `2095.${stamp}.11,Net lofts,Imported Printer ${stamp},1957,gelatin_silver_developing_out,selenium`,
          `2095.${stamp}.12,"Ropes, coiled",Imported Printer ${stamp},196X,gelatin_silver_developing_out,sulfide`,
          `2095.${stamp}.13,Lantern,,1971?,cyanotype,`,
        ].join('\n'),
      );
      await page.goto(`${BASE_URL}/catalogue/import`);
      await page.getByLabel('Prints (CSV)').setInputFiles(file);
      await page.getByRole('button', { name: 'Check the files' }).click();
      await page.getByRole('region', { name: 'Ready to import' }).waitFor();
      await screenshot(page, 'catalogue-import-ready');
      await page.getByRole('button', { name: /Import 3 prints/ }).click();
      await page.getByText(/3 prints were added to the catalogue/).first().waitFor({ timeout: 20_000 });
      await page.goto(`${BASE_URL}/catalogue?q=${encodeURIComponent(`Imported Printer ${stamp}`)}`);
      await page.getByText('Ropes, coiled').first().waitFor();
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('a viewer reads the catalogue', () => {
  it('sees the print but no location column, and cannot edit', async () => {
    const viewer = await browser.context.newPage();
    try {
      await signInAs(viewer, 'viewer');
      await viewer.goto(`${BASE_URL}/catalogue?q=${encodeURIComponent(accession)}`);
      await viewer.getByText(`Breakwater in fog ${stamp}`).first().waitFor();
      expect(await viewer.getByRole('button', { name: 'New print' }).count()).toBe(0);
      expect(await viewer.getByRole('link', { name: 'New print' }).count()).toBe(0);
      await screenshot(viewer, 'catalogue-viewer');
    } finally {
      await viewer.close();
    }
  });
});
