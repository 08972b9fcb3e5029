import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { openBrowser, signInAs, BASE_URL } from './browser';

/**
 * A loan out of three prints for an exhibition at an invented gallery: the registrar plans it and its
 * display periods, a conservator signs the outgoing reports and approves the prints for display in the
 * exhibition, the registrar dispatches it and sees the light warning on the iron-blue print.
 *
 * Light figures: CIE 157:2004 (REFERENCES.md §4) gives the high responsivity category at most 50 lx and
 * 15 000 lx·h a year; the defaults of light-budget.ts follow it. 50 lx × 10 h × 60 days = 30 000 lx·h,
 * twice the high budget and a fifth of the medium one (150 000 lx·h), so only the iron-blue print is warned.
 */

const SHOTS = process.env.E2E_SHOTS ?? '/tmp/e2e-shots';
async function shot(page: Page, name: string) {
  mkdirSync(SHOTS, { recursive: true });
  await page.screenshot({ path: path.join(SHOTS, `loan-light-${name}.png`), fullPage: true });
}

const stamp = String(Date.now() % 1_000_000);
const GALLERY = `Saltmarsh Lane Gallery ${stamp}`;
const TITLE = `Blue Tides ${stamp}`;
const REFERENCE = `LO-${stamp}`;
const WARNING = 'On display past its light budget';
const MISSING = /outgoing/i;
/** The server's words while the prints wait for a conservator's approval for display in the exhibition. */
const NOT_APPROVED = `3 prints are not approved for display in ${TITLE} by a conservator.`;
/** The light functions' words for displays that go past the high category's annual 15 000 lx·h. */
const OVER_BUDGET = /over its annual budget of 15\D?000 lx·h/;

const day = (offset: number) => new Date(Date.now() + offset * 86_400_000).toISOString().slice(0, 10);
const OPENS = day(14);
const CLOSES = day(73); // 60 days, both ends included

interface MadePrint {
  id: string;
  accessionNumber: string;
  title: string;
}
const prints: MadePrint[] = [];
const ironBlue = () => prints[2]!;

let browser: { context: BrowserContext; close(): Promise<void> };
let page: Page;
let loanUrl = '';
let exhibitionUrl = '';

beforeAll(async () => {
  browser = await openBrowser();
  page = await browser.context.newPage();
  await signInAs(page, 'registrar');
  // Three prints of known process and toning: two untoned developing-out prints (medium category) and one
  // toned in iron blue (high category by the default rules).
  const specs = [
    { n: 1, title: `Harbour wall at low water ${stamp}`, ironBlue: false },
    { n: 2, title: `Net lofts in fog ${stamp}`, ironBlue: false },
    { n: 3, title: `Tide pool, blue-toned ${stamp}`, ironBlue: true },
  ];
  for (const spec of specs) {
    const made = await page.evaluate(
      async ({ s, spec }) => {
        const post = await fetch('/api/prints', {
          method: 'POST',
          headers: { 'content-type': 'application/json' },
          body: JSON.stringify({ accessionNumber: `2096.${s}.${spec.n}`, title: spec.title, process: 'gelatin_silver_developing_out' }),
        });
        const print = ((await post.json()) as { data: { id: string; accessionNumber: string; version: number } }).data;
        if (spec.ironBlue) {
          const put = await fetch(`/api/prints/${print.id}/steps`, {
            method: 'PUT',
            headers: { 'content-type': 'application/json' },
            body: JSON.stringify({
              version: print.version,
              steps: [
                { type: 'development', timeSeconds: 120 },
                { type: 'fixing', timeSeconds: 300 },
                { type: 'washing', timeSeconds: 1800 },
                { type: 'toning', tonerClass: 'iron_blue', timeSeconds: 240, extent: 'full' },
              ],
            }),
          });
          if (put.status !== 200) throw new Error(`steps: ${put.status} ${await put.text()}`);
        }
        return { id: print.id, accessionNumber: print.accessionNumber };
      },
      { s: stamp, spec },
    );
    prints.push({ ...made, title: spec.title });
  }
});
afterAll(async () => {
  await browser?.close();
});

describe('a loan out of three prints, from plan to dispatch, with the light it will cost', () => {
  it('the registrar records the exhibition at the gallery with its display periods', async () => {
    await page.goto(`${BASE_URL}/exhibitions/new`);
    await page.getByLabel('Title').fill(TITLE);
    await page.getByLabel('Organiser').fill(GALLERY);
    await page.getByLabel('Venue', { exact: true }).fill(GALLERY);
    await page.getByLabel('Place').fill('Merrowby');
    await page.getByLabel('Opens').fill(OPENS);
    await page.getByLabel('Closes').fill(CLOSES);
    await page.getByRole('button', { name: 'Record the exhibition' }).click();
    await page.getByRole('heading', { level: 1, name: TITLE }).waitFor({ timeout: 20_000 });
    exhibitionUrl = page.url();

    await page.getByRole('button', { name: 'Add prints' }).click();
    await page.getByLabel('Accession number or title').fill(`2096.${stamp}`);
    await page.getByRole('button', { name: 'Find' }).click();
    for (const p of prints) await page.getByRole('button', { name: `Choose ${p.accessionNumber}` }).click();
    await page.getByRole('button', { name: 'Add to the object list' }).click();
    await page.getByRole('heading', { name: 'Object list (3)' }).waitFor({ timeout: 20_000 });

    for (const p of prints) {
      const entry = page.getByRole('listitem', { name: new RegExp(p.accessionNumber.replace(/\./g, '\\.')) });
      await entry.getByRole('button', { name: 'Add a display period' }).click();
      const form = page.getByRole('form', { name: `New display period of ${p.accessionNumber}` });
      // One venue: the form starts with it and its dates.
      expect(await form.getByLabel('Starts on').inputValue()).toBe(OPENS);
      expect(await form.getByLabel('Ends on').inputValue()).toBe(CLOSES);
      await form.getByLabel('Illuminance (lux)').fill('50');
      await form.getByLabel('Hours a day').fill('10');
      await form.getByRole('button', { name: 'Add the display period' }).click();
      await form.waitFor({ state: 'detached', timeout: 20_000 });
      await entry.getByRole('table', { name: `Display periods of ${p.accessionNumber}` }).getByText('30,000').waitFor({ timeout: 20_000 });
    }
    const blue = page.getByRole('listitem', { name: new RegExp(ironBlue().accessionNumber.replace(/\./g, '\\.')) });
    await expect.poll(() => blue.getByText('Light responsivity: High').count(), { timeout: 20_000 }).toBe(1);
    // The budget left in the opening year: 15 000 lx·h less 500 lx·h (50 lx × 10 h) for each day of the display in that year.
    const year = OPENS.slice(0, 4);
    const lastInYear = CLOSES.slice(0, 4) === year ? CLOSES : `${year}-12-31`;
    const daysInYear = (Date.parse(lastInYear) - Date.parse(OPENS)) / 86_400_000 + 1;
    const left = new Intl.NumberFormat('en-GB').format(15_000 - 500 * daysInYear);
    await blue.getByText(`${left} lux-hours`, { exact: true }).waitFor({ timeout: 20_000 });
    await page.getByRole('list', { name: `Warnings for ${ironBlue().accessionNumber}` }).getByText(OVER_BUDGET).first().waitFor({ timeout: 20_000 });
    for (const p of prints.slice(0, 2)) expect(await page.getByRole('list', { name: `Warnings for ${p.accessionNumber}` }).count()).toBe(0);
    await shot(page, '1-exhibition');
  }, 120_000);

  it('the registrar proposes the loan, adds the three prints and moves it to agreed', async () => {
    await page.goto(`${BASE_URL}/loans/new`);
    const form = page.getByRole('form', { name: 'New loan' });
    await form.getByLabel('Direction').selectOption('out');
    await form.getByLabel('Agreement reference').fill(REFERENCE);
    await form.getByLabel('Other institution').fill(GALLERY);
    await form.getByLabel('Purpose').selectOption('exhibition');
    const exhibition = form.getByLabel('Exhibition', { exact: true });
    await exhibition.locator('option', { hasText: TITLE }).waitFor({ state: 'attached', timeout: 20_000 });
    await exhibition.selectOption({ label: TITLE });
    await form.getByLabel('Venue').fill(`${GALLERY}, Merrowby`);
    await form.getByLabel('Dispatch').fill(day(7));
    await form.getByLabel('Opening').fill(OPENS);
    await form.getByLabel('Closing').fill(CLOSES);
    await form.getByLabel('Return').fill(day(80));
    await form.getByLabel('Maximum illuminance (lux)').fill('50');
    await form.getByLabel(/alkaline-buffered/i).check();
    await form.getByRole('button', { name: 'Propose the loan' }).click();
    await page.waitForURL(/\/loans\/[0-9a-f-]{36}$/, { timeout: 20_000 });
    loanUrl = page.url();
    await page.getByRole('heading', { level: 1, name: new RegExp(REFERENCE) }).waitFor();
    await page.getByText(`To ${GALLERY} · Proposed · 0 prints`).waitFor();
    await page.getByText(/50 lux/).first().waitFor();
    await page.getByText(/alkaline-buffered/i).first().waitFor();

    await page.getByRole('button', { name: 'Add prints' }).click();
    await page.getByLabel('Accession number or title').fill(`2096.${stamp}`);
    await page.getByRole('button', { name: 'Find' }).click();
    for (const p of prints) await page.getByRole('button', { name: `Choose ${p.accessionNumber}` }).click();
    for (const [index, value] of ['1200', '950', '4800'].entries()) {
      await page.getByLabel('Insurance value').nth(index).fill(value);
      await page.getByLabel('Currency').nth(index).selectOption('GBP');
    }
    await page.getByRole('button', { name: 'Add to the loan' }).click();
    await page.getByRole('heading', { name: 'Objects (3)' }).waitFor({ timeout: 20_000 });
    const objects = page.getByRole('table', { name: `Prints on loan ${REFERENCE}` });
    await objects.getByText('£4,800.00').waitFor();

    for (const [button, label] of [['Approve', 'Approved'], ['Mark agreed', 'Agreed']] as const) {
      await page.getByRole('region', { name: 'Move the loan' }).getByRole('button', { name: button, exact: true }).click();
      await page.getByRole('form', { name: new RegExp(`^${button}:`) }).getByRole('button', { name: button, exact: true }).click();
      await page.getByText(`To ${GALLERY} · ${label} · 3 prints`).waitFor({ timeout: 20_000 });
    }
    await page.getByRole('region', { name: 'Before the next step' }).getByText(MISSING).waitFor();
    await shot(page, '2-loan-agreed');
  }, 120_000);

  it('dispatching before the outgoing reports are signed is refused, naming them, and keeps the date typed', async () => {
    await page.getByRole('region', { name: 'Move the loan' }).getByRole('button', { name: 'Dispatch (in transit)', exact: true }).click();
    const form = page.getByRole('form', { name: /^Dispatch \(in transit\):/ });
    const yesterday = day(-1);
    await form.getByLabel('On', { exact: true }).fill(yesterday);
    await form.getByLabel('Note').fill('Crated, courier booked.');
    const refused = page.waitForResponse((r) => r.url().includes('/status') && r.request().method() === 'POST');
    await form.getByRole('button', { name: 'Dispatch (in transit)', exact: true }).click();
    expect((await refused).status()).toBe(409);
    const alert = form.getByRole('alert');
    await alert.getByText('The loan was not moved to in transit.').waitFor({ timeout: 20_000 });
    await expect.poll(async () => alert.innerText()).toMatch(MISSING);
    expect(await alert.innerText()).toContain('3 prints have no signed outgoing condition report for this loan.');
    expect(await alert.innerText()).toContain(NOT_APPROVED);
    const named = await form.getByText(/^Refused for /).innerText();
    for (const p of prints) expect(named).toContain(p.accessionNumber);
    // The refusal fetches the loan again: what stands in the way is listed above, print by print.
    const blockers = page.getByRole('region', { name: 'Before the next step' });
    for (const p of prints) await blockers.getByText(new RegExp(p.accessionNumber.replace(/\./g, '\\.'))).first().waitFor();
    expect(await form.getByLabel('On', { exact: true }).inputValue()).toBe(yesterday);
    expect(await form.getByLabel('Note').inputValue()).toBe('Crated, courier booked.');
    await page.getByText(`To ${GALLERY} · Agreed · 3 prints`).waitFor();
    await shot(page, '3-dispatch-refused');
  }, 120_000);

  it('the conservator signs an outgoing report for each print from the loan page', async () => {
    await signInAs(page, 'conservator');
    for (const [index, p] of prints.entries()) {
      await page.goto(loanUrl);
      const row = page.getByRole('table', { name: `Prints on loan ${REFERENCE}` }).getByRole('row', { name: new RegExp(p.accessionNumber.replace(/\./g, '\\.')) });
      await row.getByRole('link', { name: 'Write the outgoing report' }).click();
      await page.waitForURL(new RegExp(`/condition/prints/${p.id}/reports/new\\?`));
      expect(await page.getByLabel('Context').inputValue()).toBe('outgoing_loan');
      await page.getByText(/This report is made for a loan/).waitFor();
      await page.getByRole('radiogroup', { name: 'Overall grade' }).getByRole('radio', { name: index === 2 ? /Fair/ : /Good/ }).check();
      await page.getByLabel('Summary').fill(index === 2 ? 'Slight overall fading of the blue image; stable for travel.' : 'Stable for travel.');
      await page.getByRole('button', { name: 'Save draft' }).click();
      await page.waitForURL(/\/condition\/reports\/[0-9a-f-]{36}$/, { timeout: 20_000 });
      if (index === 0) await shot(page, '4-outgoing-report-draft');
      await page.getByRole('button', { name: 'Sign report' }).click();
      await page.getByRole('button', { name: 'Sign and lock' }).click();
      await page.getByText(/Signed on/).first().waitFor({ timeout: 20_000 });
    }
    await page.goto(loanUrl);
    const objects = page.getByRole('table', { name: `Prints on loan ${REFERENCE}` });
    await expect.poll(() => objects.getByRole('link', { name: /^Signed / }).count(), { timeout: 20_000 }).toBe(3);
    // Nothing has left yet: the report for the way back is not offered.
    expect(await objects.getByRole('link', { name: 'Write the returning report' }).count()).toBe(0);
    const blockers = page.getByRole('region', { name: 'Before the next step' });
    expect(await blockers.getByText(MISSING).count()).toBe(0);
    // The reports are signed, but the prints still wait for a conservator's approval for display.
    await blockers.getByText(NOT_APPROVED).waitFor({ timeout: 20_000 });
    await shot(page, '5-reports-signed');
  }, 120_000);

  it('the conservator approves the three prints for display on the exhibition page; nothing then stands in the way', async () => {
    await page.goto(exhibitionUrl);
    await page.getByRole('heading', { level: 1, name: TITLE }).waitFor({ timeout: 20_000 });
    for (const p of prints) {
      const entry = page.getByRole('listitem', { name: new RegExp(p.accessionNumber.replace(/\./g, '\\.')) });
      await entry.getByText('Waiting for a conservator').waitFor({ timeout: 20_000 });
      await entry.getByRole('button', { name: 'Approve', exact: true }).click();
      await entry.getByText('Approved for display').waitFor({ timeout: 20_000 });
    }
    await shot(page, '6-approved-for-display');
    await page.goto(loanUrl);
    await page.getByText(`To ${GALLERY} · Agreed · 3 prints`).waitFor({ timeout: 20_000 });
    expect(await page.getByRole('region', { name: 'Before the next step' }).count()).toBe(0);
  }, 120_000);

  it('the registrar dispatches the loan; the iron-blue print is away on loan and warned about its light', async () => {
    await signInAs(page, 'registrar');
    await page.goto(loanUrl);
    await page.getByRole('region', { name: 'Move the loan' }).getByRole('button', { name: 'Dispatch (in transit)', exact: true }).click();
    const form = page.getByRole('form', { name: /^Dispatch \(in transit\):/ });
    await form.getByRole('button', { name: 'Dispatch (in transit)', exact: true }).click();
    await page.getByText(`To ${GALLERY} · In transit · 3 prints`).waitFor({ timeout: 20_000 });
    await page.getByRole('button', { name: 'Mark on loan' }).waitFor();
    const objects = page.getByRole('table', { name: `Prints on loan ${REFERENCE}` });
    const row = (p: MadePrint) => objects.getByRole('row', { name: new RegExp(p.accessionNumber.replace(/\./g, '\\.')) });
    await row(ironBlue()).getByText(WARNING).waitFor();
    for (const p of prints.slice(0, 2)) expect(await row(p).getByText(WARNING).count()).toBe(0);
    const history = page.getByRole('table', { name: `Status history of loan ${REFERENCE}` });
    await history.getByText('In transit', { exact: true }).waitFor();
    await shot(page, '7-loan-in-transit');

    await row(ironBlue()).getByRole('link', { name: ironBlue().accessionNumber }).click();
    await page.waitForURL(new RegExp(`/catalogue/prints/${ironBlue().id}$`));
    await page.getByText(`Away on loan › ${GALLERY}`).first().waitFor({ timeout: 20_000 });
    await page.getByText('On loan', { exact: true }).first().waitFor();
    const light = page.getByRole('region', { name: 'Light dose' });
    await light.getByText('Light warnings').waitFor({ timeout: 20_000 });
    await light.getByText(OVER_BUDGET).first().waitFor();
    await light.getByText(/^High/).first().waitFor();
    await shot(page, '8-print-light');
  }, 120_000);
});
