import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import sharp from 'sharp';
import type { BrowserContext, Page } from 'playwright-core';
import { openBrowser, screenshot, signInAs, BASE_URL } from './browser';

/**
 * The deep-zoom viewer over the IIIF image service: opened from the condition page's images, zoomed
 * with the toolbar and the keyboard; and the comparison page's linked zoom (the
 * display-copy rule for viewers is checked in backend/src/routes/iiif/iiif.test.ts). Makes its own print and images, so it runs again on the same database.
 */

let browser: { context: BrowserContext; close(): Promise<void> };
let page: Page;
let printId: string;
const stamp = String(Date.now() % 100000);

/** A 3000 × 2000 print-like image with fine lines, so zooming in shows detail the fitted view cannot. */
async function makeImage(tone: string): Promise<string> {
  const lines = Array.from({ length: 60 }, (_, i) => `<line x1="${i * 50}" y1="0" x2="${3000 - i * 50}" y2="2000" stroke="#1d2733" stroke-width="2"/>`).join('');
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="3000" height="2000"><rect width="3000" height="2000" fill="#f3efe6"/>
    <rect x="150" y="150" width="2700" height="1700" fill="${tone}"/>${lines}
    <circle cx="1500" cy="1000" r="400" fill="none" stroke="#f3efe6" stroke-width="12"/></svg>`;
  return (await sharp(Buffer.from(svg)).jpeg({ quality: 88 }).toBuffer()).toString('base64');
}

async function upload(b64: string, capturedOn: string): Promise<string> {
  return page.evaluate(
    async ({ id, b64, capturedOn }) => {
      const bytes = Uint8Array.from(atob(b64), (ch) => ch.charCodeAt(0));
      const form = new FormData();
      form.append('viewType', 'recto');
      form.append('capturedOn', capturedOn);
      form.append('file', new Blob([bytes], { type: 'image/jpeg' }), `recto-${capturedOn}.jpg`);
      const res = await fetch(`/api/prints/${id}/images`, { method: 'POST', body: form });
      return ((await res.json()) as { data: { id: string } }).data.id;
    },
    { id: printId, b64, capturedOn },
  );
}

const level = async (scope: Page | ReturnType<Page['locator']>) => {
  const text = (await scope.getByTestId('deep-zoom-level').first().textContent()) ?? '';
  return Number(text.replace(/[^\d]/g, ''));
};

beforeAll(async () => {
  browser = await openBrowser();
  page = await browser.context.newPage();
  await signInAs(page, 'registrar');
  printId = await page.evaluate(async (s) => {
    const res = await fetch('/api/prints', {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ accessionNumber: `2095.${s}.1`, title: `Net lofts at dusk ${s}`, process: 'gelatin_silver_developing_out', creditLine: 'Calder Reach purchase fund' }),
    });
    return ((await res.json()) as { data: { id: string } }).data.id;
  }, stamp);
  await signInAs(page, 'conservator');
  await upload(await makeImage('#3c5670'), '2003-04-11');
  await upload(await makeImage('#5f7690'), '2022-04-11');
});
afterAll(async () => {
  await browser?.close();
});

describe('the deep-zoom viewer', () => {
  it('opens from the condition page, zooms with the toolbar and the keyboard, and closes with Escape', async () => {
    const tiles: string[] = [];
    const problems: string[] = [];
    page.on('console', (m) => {
      if (m.type() === 'error') problems.push(m.text());
    });
    page.on('response', (r) => {
      if (/\/api\/iiif\/images\/[^/]+\/[^/]+\/[^/]+\/0\/default\.jpg$/.test(r.url()) && r.status() === 200) tiles.push(r.url());
    });
    await page.goto(`${BASE_URL}/condition/prints/${printId}`);
    await page.getByRole('button', { name: 'Zoom in the viewer' }).first().click();
    const dialog = page.getByRole('dialog', { name: /Image viewer/ });
    await dialog.waitFor();
    await expect.poll(() => level(dialog), { timeout: 15_000 }).toBeGreaterThan(0);
    await expect.poll(() => tiles.length, { timeout: 15_000 }).toBeGreaterThan(0);
    const fitted = await level(dialog);
    expect(fitted).toBeLessThan(100); // 3000 px wide in a 1280 px window
    const before = tiles.length;
    for (let i = 0; i < 4; i++) await dialog.getByRole('button', { name: /Zoom in on/ }).click();
    await expect.poll(() => level(dialog), { timeout: 10_000 }).toBeGreaterThan(fitted * 4);
    // Zoomed in, the viewer asks for tiles at a finer scale than the fitted view's.
    await expect.poll(() => tiles.length, { timeout: 15_000 }).toBeGreaterThan(before);
    // The zoom animates: take the level once it has settled (two reads 400 ms apart agree).
    let zoomedIn = await level(dialog);
    await expect.poll(async () => {
      const earlier = zoomedIn;
      await page.waitForTimeout(400);
      zoomedIn = await level(dialog);
      return zoomedIn === earlier;
    }, { timeout: 10_000 }).toBe(true);
    await page.getByRole('img', { name: /deep-zoom view/ }).focus();
    await page.keyboard.press('-');
    await expect.poll(() => level(dialog), { timeout: 10_000 }).toBeLessThan(zoomedIn);
    await page.keyboard.press('ArrowRight');
    await page.waitForTimeout(800);
    await screenshot(page, 'deep-zoom-viewer');
    await page.keyboard.press('0');
    await expect.poll(() => level(dialog), { timeout: 10_000 }).toBeLessThanOrEqual(fitted + 1);
    await page.keyboard.press('Escape');
    await dialog.waitFor({ state: 'hidden' });
    // OpenSeadragon works under the app's Content-Security-Policy (nothing it tries is refused).
    expect(problems).toEqual([]);
    // The manifest address is there to copy.
    const manifest = await page.getByLabel('IIIF manifest').inputValue();
    expect(manifest).toBe(`${new URL(BASE_URL).origin}/api/iiif/prints/${printId}/manifest`);
  });

  it('the comparison page zooms and pans both images together', async () => {
    await page.goto(`${BASE_URL}/condition/prints/${printId}/compare`);
    await page.getByLabel('Zoom side by side').check();
    const earlier = page.getByRole('figure').filter({ hasText: 'Earlier' });
    const later = page.getByRole('figure').filter({ hasText: 'Later' });
    await expect.poll(() => level(later), { timeout: 15_000 }).toBeGreaterThan(0);
    const start = await level(later);
    for (let i = 0; i < 3; i++) await earlier.getByRole('button', { name: /Zoom in on/ }).click();
    await expect.poll(() => level(later), { timeout: 10_000 }).toBeGreaterThan(start * 2.5);
    await expect.poll(async () => Math.abs((await level(earlier)) - (await level(later))), { timeout: 10_000 }).toBeLessThanOrEqual(1);
    await page.waitForTimeout(800);
    await screenshot(page, 'deep-zoom-compare');
  });
});
