import { useEffect } from 'react';

/**
 * The running footer of a printed record: the accession number and the print date at the bottom left,
 * "Page n of N" at the bottom right, on every page. Written as CSS paged-media margin boxes
 * (`@page { @bottom-left … }`), which Chromium lays out when printing or making a PDF; the rule is
 * made for the record shown, so the footer names it, and is removed with the screen.
 */
export function footerCss(accessionNumber: string, printedOn: string): string {
  // A CSS string: backslashes and double quotes escaped, line breaks dropped.
  const quoted = (text: string) => `"${text.replace(/[\\"]/g, (c) => `\\${c}`).replace(/[\r\n]+/g, ' ')}"`;
  return [
    '@page {',
    '  size: A4;',
    '  margin: 18mm 16mm 20mm 16mm;',
    `  @bottom-left { content: ${quoted(`Accession number ${accessionNumber} · printed ${printedOn}`)}; font-size: 8pt; color: #4a443c; }`,
    '  @bottom-right { content: "Page " counter(page) " of " counter(pages); font-size: 8pt; color: #4a443c; }',
    '}',
  ].join('\n');
}

/** "2 December 2026": the day the record is printed, in words. */
export function printDate(now = new Date()): string {
  return new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'long', year: 'numeric' }).format(now);
}

/**
 * Put on a page that may be printed: its footer for the record shown. The rule goes in through the
 * CSS object model (a constructed style sheet adopted by the document): the app's Content Security
 * Policy allows no inline <style>, and it governs markup, not the CSSOM.
 */
export function PrintFooter({ accessionNumber }: { accessionNumber: string }) {
  useEffect(() => {
    if (typeof CSSStyleSheet === 'undefined' || !('adoptedStyleSheets' in document)) return;
    const sheet = new CSSStyleSheet();
    sheet.replaceSync(footerCss(accessionNumber, printDate()));
    document.adoptedStyleSheets = [...document.adoptedStyleSheets, sheet];
    return () => {
      document.adoptedStyleSheets = document.adoptedStyleSheets.filter((s) => s !== sheet);
    };
  }, [accessionNumber]);
  return null;
}
