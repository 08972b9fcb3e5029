import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { openBrowser, screenshot, signInAs, BASE_URL } from './browser';

/**
 * The sessions table on a print's measurements page at 1440 × 900, with four spots of long names and
 * sessions carrying spread and density: no cell clips its content, and where the table is wider than
 * its box it scrolls inside a named region the keyboard can reach (WCAG 2.1, 2.1.1 and 1.4.10).
 */
let browser: { context: BrowserContext; close(): Promise<void> };
let page: Page;
let printId: string;
const stamp = String(Date.now() % 100000);

beforeAll(async () => {
  browser = await openBrowser();
  page = await browser.context.newPage();
  await page.setViewportSize({ width: 1440, height: 900 });
  await signInAs(page, 'registrar');
  printId = await page.evaluate(async (s) => {
    const res = await fetch('/api/prints', {
      method: 'POST', headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ accessionNumber: `2097.${s}.1`, title: `Harbour lights ${s}`, process: 'gelatin_silver_developing_out' }),
    });
    return ((await res.json()) as { data: { id: string } }).data.id;
  }, stamp);
  await signInAs(page, 'conservator');
  const failed = await page.evaluate(async (id) => {
    const post = async (path: string, body: unknown) => {
      const res = await fetch(path, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
      return { status: res.status, body: (await res.json()) as { data: { id: string } } };
    };
    const names = ['Dmax, deepest shadow of the harbour wall', 'Highlight, sky above the lighthouse', 'Mid-tone, wet slipway in the foreground', 'Paper base, lower margin beside the signature'];
    const spots = [];
    for (const [i, name] of names.entries()) spots.push((await post(`/api/prints/${id}/measurement-spots`, { name, purpose: ['dmax', 'highlight', 'mid_tone', 'paper_base'][i] })).body.data.id);
    const problems: string[] = [];
    for (const [k, measuredOn] of ['2019-04-02', '2022-04-05', '2025-04-08'].entries()) {
      const res = await post(`/api/prints/${id}/measurement-sessions`, {
        measuredOn, instrument: 'Harlow Instruments SP-4 spectrodensitometer', serial: 'HX-2231-0097', illuminant: 'D50', observer: '2', geometry: '45/0', condition: 'M1',
        aperture: '4 mm', backing: 'White backing tile, ceramic', measuredBy: 'Conservation studio, second bench',
        readings: spots.map((spotId, i) => ({ spotId, density: 1.85 - i * 0.4 - k * 0.01, densityType: 'status_a', readings: [{ L: 22 + i * 20 + k, a: 0.45 + k * 0.3, b: 2.15 + k * 0.5 }, { L: 22.4 + i * 20 + k, a: 0.55 + k * 0.3, b: 2.05 + k * 0.5 }, { L: 21.8 + i * 20 + k, a: 0.5 + k * 0.3, b: 2.25 + k * 0.5 }] })),
      });
      if (res.status !== 201) problems.push(`${measuredOn}: ${res.status} ${JSON.stringify(res.body)}`);
    }
    return problems;
  }, printId);
  expect(failed).toEqual([]);
});
afterAll(() => browser?.close());

/** Where the sessions table stands at the page's current width: clipped cells, its width, and the box around it. */
async function measure() {
  const table = page.locator('table', { has: page.locator('caption', { hasText: 'Measurement sessions at this print' }) });
  await table.waitFor();
  await table.locator('tbody tr').nth(2).waitFor();
  // The scrollable region is decided after layout (a resize observer): let it settle.
  await page.waitForTimeout(300);
  return table.evaluate((el) => {
    const clipped = [...el.querySelectorAll('th, td')]
      .filter((c) => c.scrollWidth > c.clientWidth + 1)
      .map((c) => `${c.tagName} "${(c.textContent ?? '').slice(0, 40)}" ${c.scrollWidth} > ${c.clientWidth}`);
    // The nearest box that does not let the table overflow visibly.
    let box: HTMLElement | null = el.parentElement;
    while (box && getComputedStyle(box).overflowX === 'visible') box = box.parentElement;
    const rect = el.getBoundingClientRect();
    return {
      clipped,
      tableWidth: Math.round(rect.width), right: Math.round(rect.right), viewport: document.documentElement.clientWidth,
      pageScrolls: document.documentElement.scrollWidth > document.documentElement.clientWidth,
      box: box ? {
        overflowX: getComputedStyle(box).overflowX, scrolls: box.scrollWidth > box.clientWidth + 1, width: box.clientWidth, right: Math.round(box.getBoundingClientRect().right),
        role: box.getAttribute('role'), label: box.getAttribute('aria-label'), tabIndex: box.tabIndex,
      } : null,
    };
  });
}

describe('the sessions table of a print', () => {
  it('at 1440 × 900 fits its box: no cell clipped, nothing to scroll sideways, every column in the window', async () => {
    await page.goto(`${BASE_URL}/measurements/prints/${printId}`);
    const report = await measure();
    console.info(`sessions table at 1440 × 900: ${JSON.stringify(report)}`);
    await screenshot(page, 'measurements-sessions-1440');
    expect(report.clipped).toEqual([]);
    expect(report.pageScrolls).toBe(false);
    expect(report.box?.scrolls).toBe(false);
    expect(report.right).toBeLessThanOrEqual(report.viewport);
    // The last column (Void) is on screen, not behind a sideways scroll.
    const voidHeader = await page.locator('th', { hasText: 'Void' }).boundingBox();
    expect(voidHeader!.x + voidHeader!.width).toBeLessThanOrEqual(1440);
  });

  it('narrower (1024 × 768), scrolls inside a named region the keyboard reaches, with no cell clipped', async () => {
    await page.setViewportSize({ width: 1024, height: 768 });
    await page.goto(`${BASE_URL}/measurements/prints/${printId}`);
    const report = await measure();
    console.info(`sessions table at 1024 × 768: ${JSON.stringify(report)}`);
    await page.setViewportSize({ width: 1440, height: 900 });
    expect(report.clipped).toEqual([]);
    expect(report.pageScrolls).toBe(false);
    if (report.box?.scrolls) {
      expect(report.box.overflowX).toMatch(/auto|scroll/);
      expect(report.box.role).toBe('region');
      expect(report.box.label).toMatch(/Measurement sessions at this print/);
      expect(report.box.tabIndex).toBe(0);
    } else {
      expect(report.right).toBeLessThanOrEqual(report.viewport);
    }
  });
});
