import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { openBrowser, screenshot, signInAs, BASE_URL } from './browser';

/**
 * A conservator rehouses a shelf of warned prints at once, and the compact catalogue list at 1440 px.
 * The prints, places and enclosure types are made through the API by a registrar: three iron-blue
 * toned prints and one plain print, in an unbuffered folder, in a drawer four levels deep, with long titles.
 */

const stamp = String(Date.now() % 1_000_000);
const WORD = `slipway${stamp}`;

interface Made { id: string; accessionNumber: string }
let prints: Made[] = [];
let browser: { context: BrowserContext; close(): Promise<void> };
let page: Page;
const names = { buffered: `Buffered folder ${stamp}`, sleeve: `Polyester sleeve ${stamp}`, folder: `Unbuffered folder ${stamp}` };

beforeAll(async () => {
  browser = await openBrowser();
  page = await browser.context.newPage();
  await signInAs(page, 'registrar');
  prints = await page.evaluate(
    async ({ s, word, names }) => {
      const send = async (method: string, url: string, body: unknown, status: number) => {
        const res = await fetch(url, { method, headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
        if (res.status !== status) throw new Error(`${url}: ${res.status} ${await res.text()}`);
        return ((await res.json()) as { data: Record<string, unknown> }).data;
      };
      const building = await send('POST', '/api/locations', { name: `Quay building ${s}`, kind: 'building' }, 201);
      const room = await send('POST', '/api/locations', { name: `Print room ${s}`, kind: 'room', parentId: building.id }, 201);
      const cabinet = await send('POST', '/api/locations', { name: `Cabinet 7`, kind: 'cabinet', parentId: room.id }, 201);
      const drawer = await send('POST', '/api/locations', { name: `Drawer 12`, kind: 'drawer', parentId: cabinet.id }, 201);
      const folder = await send('POST', '/api/enclosures', { name: names.folder, alkalineBuffered: false, patResult: 'passed' }, 201);
      await send('POST', '/api/enclosures', { name: names.buffered, alkalineBuffered: true, patResult: 'passed' }, 201);
      await send('POST', '/api/enclosures', { name: names.sleeve, material: 'Polyester', alkalineBuffered: false, patResult: 'passed' }, 201);
      // Long values in every column the compact list shows: a long maker's name, a written date, two toners.
      const maker = await send('POST', '/api/makers', { name: `Wenna Trask-Polglase of Porth Ceiriog ${s}` }, 201);
      const out = [];
      for (const n of [1, 2, 3, 4]) {
        const print = await send('POST', '/api/prints', {
          accessionNumber: `2094.${s}.${n}`, title: `The ${word} at dusk with the lifeboat house, the crane and the long breakwater beyond, plate ${n}`,
          process: 'gelatin_silver_developing_out', locationId: drawer.id, enclosureId: folder.id, makerId: maker.id, dateMade: '1968-04~',
        }, 201);
        if (n <= 3) {
          const toning = [{ type: 'toning', tonerClass: 'iron_blue' }, ...(n === 1 ? [{ type: 'toning', tonerClass: 'gold' }] : [])];
          await send('PUT', `/api/prints/${print.id}/steps`, { version: print.version, steps: [{ type: 'development' }, ...toning] }, 200);
        }
        out.push({ id: print.id as string, accessionNumber: print.accessionNumber as string });
      }
      return out;
    },
    { s: stamp, word: WORD, names },
  );
  await signInAs(page, 'conservator');
}, 90_000);
afterAll(async () => {
  await browser?.close();
});

const enclosureOf = (id: string) =>
  page.evaluate(async (printId) => ((await (await fetch(`/api/prints/${printId}`)).json()) as { data: { enclosure: { name: string } | null } }).data.enclosure?.name ?? null, id);

describe('a bulk rehouse with its preview', () => {
  it('the conservator ticks a range, previews a rehouse into buffered folders, is warned, and rehouses the iron-blue prints elsewhere', async () => {
    await page.goto(`${BASE_URL}/catalogue?q=${WORD}`);
    await page.getByRole('checkbox', { name: `Select ${prints[0]!.accessionNumber}` }).click();
    await page.getByRole('checkbox', { name: `Select ${prints[3]!.accessionNumber}` }).click({ modifiers: ['Shift'] });
    const bar = page.getByRole('region', { name: 'Selected prints' });
    await bar.getByText('4 selected.').waitFor();
    await bar.getByRole('button', { name: 'Rehouse…' }).click();
    const panel = page.getByRole('dialog', { name: 'Rehouse in another enclosure' });
    await panel.getByLabel('Into').selectOption({ label: `${names.buffered} (buffered)` });
    await panel.getByRole('button', { name: 'Preview the changes' }).click();
    const warning = panel.getByRole('list', { name: 'Warnings' }).getByRole('listitem');
    await warning.first().waitFor();
    expect(await warning.count()).toBe(1);
    expect(await warning.first().textContent()).toMatch(/3 iron-blue prints would move into an alkaline-buffered enclosure/);
    expect(await panel.getByRole('status').first().textContent()).toMatch(/4 of 4 prints would change/);
    await screenshot(page, 'bulk-rehouse-preview-warning');

    // The warning's offer opens the rehouse action with its three prints selected.
    await warning.first().getByRole('button', { name: 'Choose another enclosure for these 3' }).click();
    const again = page.getByRole('dialog', { name: 'Rehouse in another enclosure' });
    await again.getByText('For 3 prints from the warning.').waitFor();
    await again.getByLabel('Into').selectOption({ label: `${names.sleeve} (unbuffered)` });
    await again.getByRole('button', { name: 'Preview the changes' }).click();
    await again.getByText(/3 of 3 prints would change/).waitFor();
    expect(await again.getByRole('list', { name: 'Warnings' }).count()).toBe(0);
    const rows = again.getByRole('region', { name: 'Each print' }).getByRole('row');
    expect(await rows.count()).toBe(4);
    expect(await rows.nth(1).textContent()).toContain(names.folder);
    expect(await rows.nth(1).textContent()).toContain(names.sleeve);
    await screenshot(page, 'bulk-rehouse-preview');
    await again.getByRole('button', { name: 'Apply to 3 prints' }).click();
    await again.getByText('3 prints rehoused.').waitFor();
    await screenshot(page, 'bulk-rehouse-done');
    for (const p of prints.slice(0, 3)) expect(await enclosureOf(p.id)).toBe(names.sleeve);
    expect(await enclosureOf(prints[3]!.id)).toBe(names.folder);
  }, 90_000);
});

describe('the compact list at 1440 px', () => {
  it('one line per print, no cell or column clipped, / focuses the search, arrows and Enter open a print', async () => {
    await page.setViewportSize({ width: 1440, height: 900 });
    await page.goto(`${BASE_URL}/catalogue?q=${WORD}`);
    await page.getByRole('checkbox', { name: `Select ${prints[0]!.accessionNumber}` }).waitFor({ timeout: 20_000 }).catch(async (e) => {
      await screenshot(page, 'compact-failed');
      throw e;
    });
    const compact = page.getByRole('checkbox', { name: 'Compact rows' });
    if (!(await compact.isChecked())) await compact.check();
    await page.locator('table[data-compact]').waitFor();
    const measured = await page.evaluate(() => {
      const table = document.querySelector('table[data-compact]')!;
      const wrap = table.parentElement!;
      const cells = [...table.querySelectorAll('th, td')].map((c) => ({ text: (c.textContent ?? '').slice(0, 40), scroll: c.scrollWidth, client: c.clientWidth }));
      const rows = [...table.querySelectorAll('tbody tr')].map((r) => r.getBoundingClientRect().height);
      const line = parseFloat(getComputedStyle(table).lineHeight) || 16;
      const headers = [...table.querySelectorAll('thead th')].map((h) => h.textContent);
      const widths = [...table.querySelectorAll('thead th')].map((h) => [h.textContent, Math.round(h.getBoundingClientRect().width)]);
      return { widths, clipped: cells.filter((c) => c.scroll > c.client), wrap: { scroll: wrap.scrollWidth, client: wrap.clientWidth }, rows, line, headers };
    });
    console.log('compact widths', JSON.stringify(measured.widths), measured.wrap);
    expect(measured.headers.join('|')).toMatch(/Warnings/i);
    expect(measured.clipped).toEqual([]);
    expect(measured.wrap.scroll).toBeLessThanOrEqual(measured.wrap.client);
    expect(measured.rows).toHaveLength(4);
    // One line each: a row no taller than its thumbnail (28 px) and padding, well under two lines of text.
    for (const h of measured.rows) expect(h).toBeLessThan(measured.line * 2 + 8);
    // The location is its last two levels, the full path on hover.
    const place = page.getByRole('cell', { name: 'Cabinet 7 › Drawer 12' }).first();
    expect(await place.locator('span').getAttribute('title')).toMatch(new RegExp(`^Quay building ${stamp} › Print room ${stamp} › Cabinet 7 › Drawer 12$`));
    await screenshot(page, 'catalogue-compact-1440');

    await page.locator('body').click({ position: { x: 5, y: 5 } });
    await page.keyboard.press('/');
    expect(await page.evaluate(() => (document.activeElement as HTMLInputElement | null)?.type)).toBe('search');
    const firstRow = page.locator('tbody tr[data-row]').first();
    await firstRow.focus();
    await page.keyboard.press('ArrowDown');
    expect(await page.evaluate(() => document.activeElement?.querySelector('a')?.textContent)).toBe(prints[1]!.accessionNumber);
    await page.keyboard.press('Enter');
    await page.waitForURL(new RegExp(`/catalogue/prints/${prints[1]!.id}$`));
  }, 90_000);
});
