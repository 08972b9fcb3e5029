import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext } from 'playwright-core';
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';
import { openBrowser, screenshot, signInAs, BASE_URL, SHOTS } from './browser';

/**
 * The printable record sheet of a print, printed to PDF by Chromium (page.pdf): every page's footer
 * carries the accession number, the print date and "Page n of N"; the page has none of the app's
 * navigation. The PDF's text is read back with pdfjs-dist.
 */
let browser: { context: BrowserContext; close(): Promise<void> };
beforeAll(async () => {
  browser = await openBrowser();
});
afterAll(() => browser?.close());

async function pdfPages(pdf: Buffer): Promise<string[]> {
  const doc = await getDocument({ data: new Uint8Array(pdf), useSystemFonts: false }).promise;
  const pages: string[] = [];
  for (let n = 1; n <= doc.numPages; n++) {
    const content = await (await doc.getPage(n)).getTextContent();
    pages.push(content.items.map((i) => ('str' in i ? i.str : '')).join(' ').replace(/\s+/g, ' '));
  }
  return pages;
}

describe('record sheet', () => {
  it('prints with the accession number, the print date and page numbers on every page', async () => {
    const page = await browser.context.newPage();
    try {
      await signInAs(page, 'registrar');
      const stamp = Date.now().toString().slice(-6);
      const accession = `2098.${stamp}.1`;
      // Long inscriptions make the sheet run to a second page.
      const inscriptions = Array.from({ length: 40 }, (_, i) => `Verso, pencil, line ${i + 1}: Harbour at dusk, second state, printed for the exhibition.`).join('\n');
      const id = await page.evaluate(
        async ({ accession, inscriptions }) => {
          const post = await fetch('/api/prints', {
            method: 'POST',
            headers: { 'content-type': 'application/json' },
            body: JSON.stringify({ accessionNumber: accession, title: 'Breakwater lamps', process: 'gelatin_silver_developing_out', dateMade: '1994~', inscriptions }),
          });
          if (post.status !== 201) throw new Error(`print: ${post.status} ${await post.text()}`);
          return ((await post.json()) as { data: { id: string } }).data.id;
        },
        { accession, inscriptions },
      );
      await page.goto(new URL(`/catalogue/prints/${id}/sheet`, BASE_URL).toString());
      await page.getByRole('heading', { level: 1, name: new RegExp(accession.replace(/\./g, '\\.')) }).waitFor();
      expect(await page.getByText('ca. 1994 (EDTF 1994~)').count()).toBe(1);
      await screenshot(page, 'record-sheet');

      // page.pdf sets the page margins itself (0 unless given); the sheet's @page rule asks for these, and its
      // footer lives in the bottom margin, as in the browser's print dialog with default margins.
      const pdf = await page.pdf({
        format: 'A4', preferCSSPageSize: true, printBackground: true, margin: { top: '18mm', right: '16mm', bottom: '20mm', left: '16mm' },
      });
      mkdirSync(SHOTS, { recursive: true });
      writeFileSync(path.join(SHOTS, 'record-sheet.pdf'), pdf);
      const pages = await pdfPages(pdf);
      expect(pages.length).toBeGreaterThanOrEqual(2);
      const today = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'long', year: 'numeric' }).format(new Date());
      pages.forEach((text, i) => {
        expect(text, `page ${i + 1}`).toContain(`Accession number ${accession} · printed ${today}`);
        expect(text, `page ${i + 1}`).toContain(`Page ${i + 1} of ${pages.length}`);
      });
      // The app's header and navigation are not printed; the sheet's own button neither.
      expect(pages.join(' ')).not.toContain('Skip to content');
      expect(pages.join(' ')).not.toContain('Print this sheet');
      expect(pages[0]).toContain('Process history');
    } finally {
      await page.close();
    }
  }, 120_000);
});
