import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { openBrowser, screenshot, signInAs, BASE_URL } from './browser';

/**
 * A registrar's procedures on screen: an object entry (then corrected), an acquisition from it
 * (then corrected) accessioning a catalogued print, and that print's deaccession from proposal to
 * completion, after which the print's record is read-only: no edit offered, and an edit is refused.
 */
let browser: { context: BrowserContext; close(): Promise<void> };
let page: Page;
let print: { id: string; accessionNumber: string };
const stamp = String(Date.now() % 100000);
const today = new Date().toISOString().slice(0, 10);

beforeAll(async () => {
  browser = await openBrowser();
  page = await browser.context.newPage();
  await page.setViewportSize({ width: 1440, height: 900 });
  await signInAs(page, 'registrar');
  print = await page.evaluate(async (s) => {
    const res = await fetch('/api/prints', {
      method: 'POST', headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ accessionNumber: `2096.${s}.1`, title: `Kelp gatherers at low tide ${s}`, process: 'gelatin_silver_developing_out', status: 'in_store' }),
    });
    return ((await res.json()) as { data: { id: string; accessionNumber: string } }).data;
  }, stamp);
});
afterAll(async () => {
  await browser?.close();
});

const api = <T>(path: string) => page.evaluate(async (p) => (await (await fetch(p)).json()) as unknown, path) as Promise<T>;

describe('a registrar records an entry, an acquisition from it and a deaccession', () => {
  it('records and corrects an object entry, then an acquisition that accessions the print', async () => {
    await page.goto(`${BASE_URL}/catalogue/entries`);
    await page.getByRole('button', { name: 'New object entry' }).click();
    await page.getByLabel('Depositor', { exact: true }).fill(`Mair Pascoe ${stamp}`);
    await page.getByLabel('Reason for entry').selectOption('possible_acquisition');
    await page.getByLabel('Number of objects').fill('2');
    await page.getByLabel('Objects received').fill('Two toned gelatin silver prints of the harbour, unmounted');
    await page.getByRole('button', { name: 'Save and open the receipt' }).click();
    await page.waitForURL(/\/catalogue\/entries\/[0-9a-f-]{36}$/);
    const entryNumber = (await page.locator('p.mono').first().textContent())!.trim();
    expect(entryNumber).toMatch(new RegExp(`^E${today.slice(0, 4)}\\.\\d{3,}$`));

    // Correct the entry: one more object, the depositor's name as on the receipt they signed.
    await page.getByRole('button', { name: 'Edit entry' }).click();
    const entryForm = page.getByRole('form', { name: `Edit entry ${entryNumber}` });
    await entryForm.getByLabel('Depositor', { exact: true }).fill(`Mair Pascoe-Lind ${stamp}`);
    await entryForm.getByLabel('Number of objects').fill('3');
    await entryForm.getByRole('button', { name: 'Save the entry' }).click();
    await entryForm.waitFor({ state: 'detached', timeout: 10_000 }).catch(async (err: unknown) => {
      await screenshot(page, 'entry-edit-not-saved');
      throw new Error(`The entry edit was not saved: ${await entryForm.innerText()}`, { cause: err });
    });
    const receipt = page.getByRole('region', { name: 'Receipt' });
    await receipt.getByText(`Mair Pascoe-Lind ${stamp}`).waitFor();
    expect(await receipt.getByText('3', { exact: true }).count()).toBe(1);

    // An acquisition from the entry.
    await page.getByText('Record an acquisition').click();
    await page.getByLabel('Source', { exact: true }).fill(`Mair Pascoe-Lind ${stamp}`);
    await page.getByLabel('Method of acquisition').selectOption('gift');
    await page.getByLabel('Transfer of title document').fill(`Deed of gift CR/DG/${stamp}`);
    await page.getByRole('button', { name: 'Record the acquisition' }).click();
    const acquisitions = page.getByRole('region', { name: 'Acquisitions' });
    await acquisitions.getByText(`Gift from Mair Pascoe-Lind ${stamp}, acquired ${today}`).waitFor();

    // Corrected: it was a purchase, with the fund that paid.
    await acquisitions.getByRole('button', { name: 'Edit acquisition' }).click();
    const acqForm = page.getByRole('form', { name: 'Edit acquisition' });
    await acqForm.getByLabel('Method of acquisition').selectOption('purchase');
    await acqForm.getByLabel('Funds').fill('Quayside Acquisitions Fund');
    await acqForm.getByRole('button', { name: 'Save the acquisition' }).click();
    await acqForm.waitFor({ state: 'detached' });
    await acquisitions.getByText(`Purchase from Mair Pascoe-Lind ${stamp}, acquired ${today}`).waitFor();
    await acquisitions.getByText('Funds: Quayside Acquisitions Fund').waitFor();

    // Accessioning the print by its accession number.
    await acquisitions.getByLabel('Accession number of a catalogued print').fill(print.accessionNumber);
    await acquisitions.getByRole('button', { name: 'Link to this acquisition' }).click();
    await acquisitions.getByRole('link', { name: print.accessionNumber }).waitFor();
    const acq = await api<{ data: { method: string; funds: string; prints: { id: string }[] } }>(`/api/prints/${print.id}/acquisition`);
    expect(acq.data).toMatchObject({ method: 'purchase', funds: 'Quayside Acquisitions Fund', prints: [{ id: print.id }] });
  });

  it('proposes, approves and completes the deaccession; the print is then read-only', async () => {
    await page.goto(`${BASE_URL}/catalogue/prints/${print.id}`);
    await page.getByRole('link', { name: 'Edit', exact: true }).waitFor();
    const panel = page.getByRole('region', { name: 'Deaccession' });
    await panel.getByRole('button', { name: 'Propose a deaccession' }).click();
    await panel.getByLabel('Reason', { exact: true }).fill('Water damage from the store leak; the image is lost over most of its area');
    await panel.getByLabel('Method', { exact: true }).selectOption('destruction');
    await panel.getByRole('button', { name: 'Propose the deaccession' }).click();
    await panel.getByLabel('Approving authority').fill(`Collections Committee, minute ${stamp}`);
    await panel.getByRole('button', { name: 'Record the approval' }).click();
    await panel.getByLabel('Final record').fill('Destroyed in the presence of two staff; certificate filed');
    await panel.getByRole('button', { name: 'Complete the deaccession' }).click();
    await panel.getByText(`Deaccessioned on ${today}; this record is read-only.`).waitFor();
    await screenshot(page, 'deaccession-completed');

    // No edit is offered any more …
    await page.reload();
    await panel.getByText(`Deaccessioned on ${today}; this record is read-only.`).waitFor();
    expect(await page.getByRole('link', { name: 'Edit', exact: true }).count()).toBe(0);
    expect(await page.getByRole('link', { name: 'Edit process history' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: /Delete/ }).count()).toBe(0);
    // … the page says at the top that the print has left, and it is no longer inspected.
    await page.getByText(/^This print has left the collection\./).waitFor();
    await page.getByText(/^No further inspections: the print was deaccessioned on /).waitFor();
    // … and an edit reached by its address is refused with the reason, the typed title kept.
    await page.goto(`${BASE_URL}/catalogue/prints/${print.id}/edit`);
    const title = page.getByLabel('Title', { exact: true });
    await title.fill('A title that must not be saved');
    await page.getByRole('button', { name: /^Save/ }).first().click();
    await page.getByText(/deaccessioned on .*read-only/).first().waitFor();
    expect(await title.inputValue()).toBe('A title that must not be saved');
    const saved = await api<{ data: { title: string; status: string } }>(`/api/prints/${print.id}`);
    expect(saved.data).toMatchObject({ title: `Kelp gatherers at low tide ${stamp}`, status: 'deaccessioned' });
  });
});
