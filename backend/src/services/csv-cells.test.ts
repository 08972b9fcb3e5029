import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parse } from 'csv-parse/sync';
import { fromCsvCell, toCsv, toCsvText } from './csv-cells';

const TEXTS = [
  '=HYPERLINK("http://example.invalid","x")', '+1+cmd|\' /C calc\'!A0', '-2+3', '@SUM(A1:A2)', '\tTab first', '\rReturn first',
  "'=quote then formula", "''-two quotes", "'plain", "''", "'", '', 'Plain title', '2+2', 'a=b', ' =space first', '=', '-', '\'\t',
  '\uFF1D1+1 (full-width =)', 'line\nbreak', 'a\rb', 'a\r\nb', 'comma, "quoted"',
];

describe('CSV cells', () => {
  it('text that starts with = + - @, a tab or a carriage return gets a leading quote; other text stays as it is', () => {
    expect(toCsvText('=1+1')).toBe("'=1+1");
    expect(toCsvText('+1')).toBe("'+1");
    expect(toCsvText('-2+3')).toBe("'-2+3");
    expect(toCsvText('@SUM(A1)')).toBe("'@SUM(A1)");
    expect(toCsvText('\tx')).toBe("'\tx");
    expect(toCsvText('\rx')).toBe("'\rx");
    expect(toCsvText("'=x")).toBe("''=x");
    expect(toCsvText("'plain")).toBe("'plain");
    expect(toCsvText('\uFF20SUM(A1)')).toBe("'\uFF20SUM(A1)");
    expect(toCsvText('Plain title')).toBe('Plain title');
  });

  it('numbers are written as they are, negative ones included', () => {
    expect(toCsv([[-2, 3.5, 0, Number.NaN, null, '-2']])).toBe("-2,3.5,0,,,'-2\n");
  });

  it('every text reads back as it was from the written file', () => {
    const written = toCsv([TEXTS], { recordDelimiter: 'windows' });
    const [read] = parse(written) as string[][];
    for (const cell of read) expect(cell).not.toMatch(/^[=+\-@\t\r]/);
    expect(read.map(fromCsvCell)).toEqual(TEXTS);
  });

  it('reading leaves a cell alone unless it starts with quotes followed by a formula character', () => {
    expect(fromCsvCell("'plain")).toBe("'plain");
    expect(fromCsvCell("'=x")).toBe('=x');
    expect(fromCsvCell("''=x")).toBe("'=x");
    expect(fromCsvCell('-2')).toBe('-2');
    expect(fromCsvCell("'-2")).toBe('-2');
  });

  it('no other server file writes CSV: every writer goes through toCsv', () => {
    const src = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
    const files = readdirSync(src, { recursive: true, encoding: 'utf8' }).filter((f) => /\.ts$/.test(f) && !/\.test\.ts$/.test(f));
    const writers = files.filter((f) => /from ['"]csv-stringify/.test(readFileSync(path.join(src, f), 'utf8')));
    expect(writers).toEqual([path.join('services', 'csv-cells.ts')]);
  });
});
