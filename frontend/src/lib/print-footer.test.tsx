import { describe, expect, it } from 'vitest';
import { footerCss, printDate } from '@/lib/print-footer';

describe('the printed footer', () => {
  it('names the accession number and the print date, and numbers the pages', () => {
    const css = footerCss('1987.14.3', '2 December 2026');
    expect(css).toContain('@bottom-left { content: "Accession number 1987.14.3 · printed 2 December 2026";');
    expect(css).toContain('@bottom-right { content: "Page " counter(page) " of " counter(pages);');
  });

  it('keeps an accession number with quotes or backslashes inside its CSS string', () => {
    const css = footerCss('A"1\\2', '1 May 2026');
    expect(css).toContain('content: "Accession number A\\"1\\\\2 · printed 1 May 2026";');
    // A line break cannot end the string early.
    expect(footerCss('1990.1\n}', 'x')).toContain('"Accession number 1990.1 } · printed x"');
  });

  it('writes the date in words', () => {
    expect(printDate(new Date('2026-12-02T12:00:00Z'))).toBe('2 December 2026');
  });
});
