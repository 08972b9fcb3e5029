import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import type { BrowserContext, Page } from 'playwright-core';
import { openBrowser, screenshot, signInAs, BASE_URL } from './browser';

let browser: { context: BrowserContext; close(): Promise<void> };
let page: Page;
let printId: string;
let reportUrl: string;
const stamp = String(Date.now() % 100000);
const dir = mkdtempSync(path.join(os.tmpdir(), 'toneledger-e2e-images-'));

/** A print-like test image: a toned rectangle on a paper-white sheet, lighter for the later capture. */
async function makeImage(name: string, tone: string) {
  const file = path.join(dir, name);
  const inner = await sharp({ create: { width: 560, height: 420, channels: 3, background: tone } }).png().toBuffer();
  await sharp({ create: { width: 640, height: 500, channels: 3, background: '#f3efe6' } })
    .composite([{ input: inner, left: 40, top: 40 }])
    .jpeg({ quality: 88 })
    .toFile(file);
  return file;
}

beforeAll(async () => {
  browser = await openBrowser();
  page = await browser.context.newPage();
  await signInAs(page, 'registrar');
  printId = await page.evaluate(async (s) => {
    const res = await fetch('/api/prints', {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ accessionNumber: `2094.${s}.1`, title: `Lighthouse keeper's cottage ${s}`, process: 'gelatin_silver_developing_out' }),
    });
    return ((await res.json()) as { data: { id: string } }).data.id;
  }, stamp);
  await signInAs(page, 'conservator');
});
afterAll(async () => {
  try {
    await browser?.close();
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
});

describe('a conservator documents a print', () => {
  it('uploads two images of the recto taken years apart', async () => {
    await page.goto(`${BASE_URL}/catalogue/prints/${printId}`);
    await page.getByRole('link', { name: 'Condition and images' }).click();
    await page.waitForURL(new RegExp(`/condition/prints/${printId}$`));
    const early = await makeImage('recto-2001.jpg', '#2b4a6f');
    const late = await makeImage('recto-2024.jpg', '#5d7590');
    await page.locator('input[type="file"]').setInputFiles([early, late]);
    for (const [name, date] of [['recto-2001.jpg', '2001-05-02'], ['recto-2024.jpg', '2024-05-02']]) {
      const item = page.getByRole('listitem', { name });
      await item.getByLabel('View type').selectOption('recto');
      await item.getByLabel('Captured on').fill(date);
    }
    await page.getByRole('button', { name: 'Upload', exact: true }).click();
    await expect.poll(async () => page.getByText('Uploaded', { exact: true }).count(), { timeout: 20_000 }).toBe(2);
    // Display copies are made by the background job; thumbnails appear when they are ready.
    await expect.poll(async () => page.getByRole('list', { name: 'Images of this print' }).locator('img').count(), { timeout: 30_000 }).toBe(2);
    await screenshot(page, 'condition-images');
  });

  it('creates a report with two observations, one with a region drawn on the image', async () => {
    await page.getByRole('link', { name: 'New condition report' }).or(page.getByRole('button', { name: 'New condition report' })).first().click();
    await page.getByLabel('Context').selectOption('routine');
    await page.getByRole('radiogroup', { name: 'Overall grade' }).getByRole('radio', { name: /Fair/ }).check();
    await page.getByRole('button', { name: 'Add observation' }).click();
    const first = page.getByRole('group', { name: 'Observation 1' });
    await first.getByLabel('Observed').selectOption('fading');
    await first.getByLabel('Severity').selectOption('moderate');
    await first.getByRole('button', { name: 'Draw region' }).click();
    const surface = page.getByRole('application', { name: 'Draw on the image' });
    await surface.waitFor();
    await expect.poll(() => surface.locator('img').evaluate((i) => { const img = i as unknown as { complete: boolean; naturalWidth: number }; return img.complete && img.naturalWidth > 0; })).toBe(true);
    await surface.scrollIntoViewIfNeeded();
    const box = (await surface.boundingBox())!;
    await page.mouse.move(box.x + box.width * 0.2, box.y + box.height * 0.25);
    await page.mouse.down();
    await page.mouse.move(box.x + box.width * 0.6, box.y + box.height * 0.7, { steps: 5 });
    await page.mouse.up();
    await page.getByRole('button', { name: 'Use this region' }).click();
    await first.getByText(/Region: (?!none)/).waitFor();

    await page.getByRole('button', { name: 'Add observation' }).click();
    const second = page.getByRole('group', { name: 'Observation 2' });
    await second.getByLabel('Observed').selectOption('silver_mirroring');
    await second.getByLabel('Area').selectOption('edge');
    await second.getByLabel('Severity').selectOption('slight');
    await page.getByLabel('Summary').fill('Overall fading of the blue image; slight mirroring at the lower edge.');
    await page.getByRole('button', { name: 'Save draft' }).click();
    await page.waitForURL(/\/condition\/reports\/[0-9a-f-]{36}$/);
    reportUrl = page.url();
    await screenshot(page, 'condition-report-draft');
  });

  it('signs it; the signed report cannot be edited, and an addendum is added instead', async () => {
    await page.getByRole('button', { name: 'Sign report' }).click();
    await page.getByRole('button', { name: 'Sign and lock' }).click();
    await page.getByText(/Signed on/).first().waitFor();
    expect(await page.getByRole('button', { name: 'Save draft' }).count()).toBe(0);
    const reportId = reportUrl.split('/').at(-1)!;
    const attempt = await page.evaluate(async (id) => {
      const res = await fetch(`/api/condition-reports/${id}`, {
        method: 'PATCH',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ version: 2, summary: 'changed after signing' }),
      });
      return { status: res.status, body: (await res.json()) as { error: { message: string } } };
    }, reportId);
    expect(attempt.status).toBe(409);
    expect(attempt.body.error.message).toMatch(/locked/);

    await page.getByLabel('Addendum', { exact: true }).fill('Correction: the mirroring is at the upper edge, not the lower.');
    await page.getByRole('button', { name: 'Add addendum' }).click();
    await page.getByText('Correction: the mirroring is at the upper edge, not the lower.').first().waitFor();
    await screenshot(page, 'condition-report-signed');
  });

  it('prints the report with the regions marked', async () => {
    await page.evaluate(() => {
      (window as unknown as { printed: boolean }).printed = false;
      window.print = () => {
        (window as unknown as { printed: boolean }).printed = true;
      };
    });
    await page.getByRole('button', { name: 'Print report' }).click();
    expect(await page.evaluate(() => (window as unknown as { printed: boolean }).printed)).toBe(true);
    await page.emulateMedia({ media: 'print' });
    await screenshot(page, 'condition-report-print');
    expect(await page.getByRole('navigation', { name: 'Main' }).isVisible()).toBe(false);
    await page.emulateMedia({ media: 'screen' });
  });

  it('compares the two captures side by side and as an overlay', async () => {
    await page.goto(`${BASE_URL}/condition/prints/${printId}`);
    await page.getByLabel('Compare view').selectOption('recto').catch(() => {});
    await page.getByRole('link', { name: 'Compare these images' }).click();
    await page.waitForURL(/\/compare\?/);
    await page.getByRole('img').first().waitFor();
    await screenshot(page, 'condition-compare-side');
    await page.getByRole('radio', { name: 'Overlay' }).check();
    const reveal = page.getByLabel('Reveal');
    await reveal.waitFor();
    await reveal.fill('30');
    await page.getByRole('button', { name: 'Nudge right' }).click();
    await page.getByRole('button', { name: 'Save alignment' }).click();
    await page.getByText(/saved/i).first().waitFor();
    await screenshot(page, 'condition-compare');
  });
});
