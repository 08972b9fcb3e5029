import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { openBrowser, screenshot, signInAs, BASE_URL } from './browser';

let browser: { context: BrowserContext; close(): Promise<void> };
let page: Page;
let printId: string;
const stamp = String(Date.now() % 100000);
const day = (n: number) => new Date(Date.now() + n * 86_400_000).toISOString().slice(0, 10);

beforeAll(async () => {
  browser = await openBrowser();
  page = await browser.context.newPage();
  await page.setViewportSize({ width: 1440, height: 900 });
  await signInAs(page, 'registrar');
  printId = await page.evaluate(async (s) => {
    const res = await fetch('/api/prints', {
      method: 'POST', headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ accessionNumber: `2095.${s}.1`, title: `Net lofts at Calder Reach ${s}`, process: 'gelatin_silver_developing_out', status: 'in_store' }),
    });
    return ((await res.json()) as { data: { id: string } }).data.id;
  }, stamp);
  await signInAs(page, 'conservator');
});
afterAll(async () => {
  await browser?.close();
});

describe('a conservator records a treatment from proposal to signed record', () => {
  it('proposes, records the approval, the work and its materials, marks it done and signs it', async () => {
    await page.goto(`${BASE_URL}/condition/prints/${printId}`);
    await page.getByRole('link', { name: 'Propose a treatment' }).click();
    await page.getByLabel('Condition found').fill('Silver mirroring along the upper margin, 20 mm deep');
    await page.getByLabel('Aims').fill('Reduce the mirroring without touching the image area');
    await page.getByLabel('Options considered').fill('Leave as is; local reduction');
    await page.getByLabel('Chosen method').fill('Local reduction at the margin, cleared and washed');
    await page.getByRole('button', { name: 'Save the proposal' }).click();
    await page.waitForURL(/\/condition\/treatments\/[0-9a-f-]{36}$/);
    await page.getByRole('heading', { name: /Treatment of 2095\./ }).waitFor();

    await page.getByLabel('Approved by').fill('Ilse Marrow, Head of Collections');
    await page.getByRole('button', { name: 'Record the approval' }).click();
    await page.getByRole('button', { name: 'Save the record' }).waitFor();
    // Approval put the print into treatment.
    const status = await page.evaluate(async (id) => ((await (await fetch(`/api/prints/${id}`)).json()) as { data: { status: string } }).data.status, printId);
    expect(status).toBe('in_treatment');

    await page.getByLabel('Started on').fill(day(0));
    await page.getByLabel('Completed on').fill(day(0));
    await page.getByLabel('Hours spent (h)').fill('3.5');
    await page.getByRole('button', { name: 'Add a step' }).click();
    await page.getByLabel('Step 1: what was done').fill('Tested the solution in the lower margin, then treated the upper margin');
    await page.getByLabel('Minutes').fill('90');
    await page.getByRole('button', { name: 'Add a material or solvent' }).click();
    await page.getByLabel('Item 1: kind').selectOption('solvent');
    await page.getByLabel('Name', { exact: true }).fill('Ethanol, 50 % in water');
    await page.getByLabel('Batch or product').fill('Lot 22-114');
    await page.getByLabel('Summary of the treatment').fill('Mirroring reduced at the upper margin.');
    await page.getByRole('button', { name: 'Save the record' }).click();
    // Saved: the record on the server holds the step (and the form opens again on the new version).
    const treatmentId = page.url().split('/').pop()!;
    await expect.poll(async () => page.evaluate(async (id) => ((await (await fetch(`/api/treatments/${id}`)).json()) as { data: { steps: unknown[] } }).data.steps.length, treatmentId), { timeout: 10_000 }).toBe(1);
    await expect.poll(async () => page.getByLabel('Step 1: what was done').inputValue()).toContain('Tested the solution');

    await page.getByRole('button', { name: 'Mark the treatment done' }).click();
    const signButton = page.getByRole('button', { name: 'Sign and lock' });
    await signButton.or(page.getByText('Not done.')).first().waitFor();
    if (!(await signButton.count())) {
      await screenshot(page, 'treatment-not-done');
      throw new Error(`Not marked done: ${await page.locator('main').innerText()}`);
    }
    await signButton.click();
    await page.getByText(/Signed by .* The record is locked/).waitFor();
    expect(await page.getByRole('button', { name: 'Save the record' }).count()).toBe(0);
    expect(await page.getByText('Solvent: Ethanol, 50 % in water, Lot 22-114').count()).toBe(1);
    expect(await page.locator('[aria-current="step"]').textContent()).toContain('Signed');

    await page.getByLabel('Addendum').fill('The ethanol was lot 22-141, not 22-114.');
    await page.getByRole('button', { name: 'Add addendum' }).click();
    await page.getByRole('region', { name: 'Addenda' }).getByRole('listitem').filter({ hasText: 'The ethanol was lot 22-141, not 22-114.' }).waitFor();
    expect(await page.getByLabel('Addendum').inputValue()).toBe('');
    await screenshot(page, 'treatment-signed');
  });
});
