import { describe, expect, it } from 'vitest';
import { DateTime } from 'luxon';
import { fahrenheitToCelsius, readClimateRows, readNumber, readTimestamp, suggestMapping, zoneOf } from './climate-readings';
import type { ClimateMapping } from '../schemas/climate';

const HEADER = ['Time', 'Temp °C', 'RH %'];
const mapping = (over: Partial<ClimateMapping> = {}): ClimateMapping => ({
  timestampColumn: 'Time', timeZone: 'UTC', dateOrder: 'auto', temperatureColumn: 'Temp °C', temperatureUnit: 'C', rhColumn: 'RH %', ...over,
});
const utc = (rows: string[][], m = mapping()) => readClimateRows(HEADER, rows, m).readings.map((r) => new Date(r.at).toISOString());

describe('°F to °C', () => {
  // The definition of the Fahrenheit scale (NIST SP 811, appendix B.8 [published]): t/°C = (t/°F − 32) / 1.8,
  // so water boils at 212 °F = 100 °C and freezes at 32 °F = 0 °C; the two scales meet at −40.
  it.each([[212, 100], [32, 0], [-40, -40], [50, 10]])('%s °F = %s °C (NIST SP 811 definition)', (f, c) => {
    expect(fahrenheitToCelsius(f)).toBeCloseTo(c, 12);
    expect(fahrenheitToCelsius(f)).toBeCloseTo((f - 32) / 1.8, 12);
  });

  it('converts the file’s temperatures when the mapping says °F', () => {
    const out = readClimateRows(HEADER, [['2026-01-01 00:00', '64.4', '45']], mapping({ temperatureUnit: 'F' }));
    // (64.4 − 32) × 5/9 = 18 °C (worked by hand from the definition).
    expect(out.readings[0].temperatureC).toBeCloseTo(18, 10);
  });
});

describe('timestamps', () => {
  it('follows summer time in an IANA zone: Europe/London across the change of 29 March 2026', () => {
    // EU rule (Directive 2000/84/EC [published]): summer time starts at 01:00 UTC on the last Sunday of March
    // (29 March 2026). 00:30 local is GMT (00:30Z); 02:30 local is BST (01:30Z): one hour apart, not two.
    expect(utc([['29/03/2026 00:30', '17', '45'], ['29/03/2026 02:30', '17', '45']], mapping({ timeZone: 'Europe/London' })))
      .toEqual(['2026-03-29T00:30:00.000Z', '2026-03-29T01:30:00.000Z']);
    // 01:30 local never happened that night: refused, not moved.
    const skipped = readClimateRows(HEADER, [['29/03/2026 01:30', '17', '45']], mapping({ timeZone: 'Europe/London' }));
    expect(skipped.problems).toEqual([{ row: 2, column: 'Time', message: expect.stringContaining('does not exist') }]);
  });

  it('reads the hour that happens twice when the clocks go back in order (Europe/London, 25 October 2026)', () => {
    // Summer time ends at 01:00 UTC on the last Sunday of October (Directive 2000/84/EC [published]): local 01:00
    // is first BST (00:00Z), then GMT (01:00Z).
    expect(utc([['25/10/2026 00:00', '17', '45'], ['25/10/2026 01:00', '17', '45'], ['25/10/2026 01:00', '17', '45'], ['25/10/2026 02:00', '17', '45']],
      mapping({ timeZone: 'Europe/London' })))
      .toEqual(['2026-10-24T23:00:00.000Z', '2026-10-25T00:00:00.000Z', '2026-10-25T01:00:00.000Z', '2026-10-25T02:00:00.000Z']);
  });

  it('keeps each timestamp’s own offset when the file’s offsets change, whatever the mapping’s zone', () => {
    // ISO 8601 / RFC 3339 [published]: the offset written with the time fixes the instant.
    expect(utc([['2026-03-28T23:00:00+00:00', '17', '45'], ['2026-03-29T01:00:00+01:00', '17', '45'], ['2026-03-29T02:00:00Z', '17', '45']],
      mapping({ timeZone: 'America/New_York' })))
      .toEqual(['2026-03-28T23:00:00.000Z', '2026-03-29T00:00:00.000Z', '2026-03-29T02:00:00.000Z']);
  });

  it('reads a fixed offset, day-first and month-first dates', () => {
    expect(utc([['2026-07-01 12:00', '17', '45']], mapping({ timeZone: '+01:00' }))).toEqual(['2026-07-01T11:00:00.000Z']);
    expect(utc([['03/04/2026 10:00', '17', '45']], mapping({ dateOrder: 'month-first' }))).toEqual(['2026-03-04T10:00:00.000Z']);
    expect(utc([['03/04/2026 10:00', '17', '45']], mapping({ dateOrder: 'day-first' }))).toEqual(['2026-04-03T10:00:00.000Z']);
    expect(utc([['03/04/2026 10:00', '17', '45']])).toEqual(['2026-04-03T10:00:00.000Z']);
  });

  it.each(['America/New_York', 'Australia/Lord_Howe'])('reads every hour of 2026 in %s as luxon does (second opinion: luxon alone)', (name) => {
    // The fast path keeps a day's offset when the clocks do not change near it; luxon's own reading of each local time is the reference.
    const zone = zoneOf(name)!;
    let previous: number | null = null;
    for (let local = Date.UTC(2026, 0, 1); local < Date.UTC(2027, 0, 1); local += 3_600_000) {
      const d = new Date(local);
      const text = d.toISOString().slice(0, 16).replace('T', ' ');
      const ours = readTimestamp(text, zone, 'auto', previous);
      const theirs = DateTime.fromObject({ year: d.getUTCFullYear(), month: d.getUTCMonth() + 1, day: d.getUTCDate(), hour: d.getUTCHours(), minute: d.getUTCMinutes() }, { zone: name });
      if (theirs.hour !== d.getUTCHours() || theirs.minute !== d.getUTCMinutes()) { expect(ours).toHaveProperty('error'); continue; }
      const possible = theirs.getPossibleOffsets().map((x) => x.toMillis());
      expect(possible).toContain((ours as { at: number }).at);
      if (possible.length === 1) expect((ours as { at: number }).at).toBe(theirs.toMillis());
      previous = (ours as { at: number }).at;
    }
  });

  it('refuses impossible dates, years out of range and offsets past ±14:00', () => {
    const z = zoneOf('UTC')!;
    expect(readTimestamp('31/02/2026 10:00', z, 'auto')).toEqual({ error: expect.stringContaining('Not a real date') });
    expect(readTimestamp('2026-13-01 10:00', z, 'auto')).toEqual({ error: expect.stringContaining('Not a real date') });
    expect(readTimestamp('0000-01-01', z, 'auto')).toEqual({ error: expect.stringContaining('year') });
    expect(readTimestamp('2026-01-01T10:00+15:00', z, 'auto')).toEqual({ error: expect.stringContaining('14:00') });
    expect(zoneOf('+14:30')).toBeNull();
    expect(zoneOf('Mars/Olympus')).toBeNull();
    expect(zoneOf('Europe/London')?.name).toBe('Europe/London');
  });
});

describe('rows', () => {
  it('names each bad row by row number (header = row 1) and column, and keeps the good ones', () => {
    const out = readClimateRows(HEADER, [
      ['2026-01-01 00:00', '17', '45'],
      ['2026-01-01 01:00', 'warm', '45'],
      ['2026-01-01 02:00', '17', '101'],
      ['2026-01-01 00:00', '17', '45'],
      ['2026-01-01 04:00', '1e308', '45'],
    ], mapping());
    expect(out.readings).toHaveLength(1);
    expect(out.badRows).toBe(4);
    expect(out.problems).toEqual([
      { row: 3, column: 'Temp °C', message: 'Not a number' },
      { row: 4, column: 'RH %', message: 'RH must be between 0 and 100 %' },
      { row: 5, column: 'Time', message: 'The same instant as row 2' },
      { row: 6, column: 'Temp °C', message: 'Not a number' },
    ]);
  });

  it('refuses a mapping naming a column the header lacks, or a time zone that is not one', () => {
    const out = readClimateRows(HEADER, [['2026-01-01 00:00', '17', '45']], mapping({ rhColumn: 'Humidity', timeZone: 'Nowhere/Else' }));
    expect(out.badRows).toBe(1);
    expect(out.problems.map((p) => p.column)).toEqual(['Humidity', null]);
  });

  it('reads numbers with a decimal point or comma and nothing looser', () => {
    expect([readNumber('21.5'), readNumber('-3,25'), readNumber(' 7 ')]).toEqual([21.5, -3.25, 7]);
    expect([readNumber('1e3'), readNumber('1,000.5'), readNumber(''), readNumber('Infinity')]).toEqual([null, null, null, null]);
  });

  it('suggests a mapping from the header names', () => {
    expect(suggestMapping(['#', 'Date Time, GMT+01:00', 'Temp, °F', 'RH, %'])).toEqual({
      dateOrder: 'auto', timestampColumn: 'Date Time, GMT+01:00', temperatureColumn: 'Temp, °F', temperatureUnit: 'F', rhColumn: 'RH, %',
    });
    expect(suggestMapping(['Timestamp', 'Temperature (C)', 'Humidity'])).toMatchObject({ temperatureUnit: 'C', rhColumn: 'Humidity' });
  });
});
