import { describe, expect, it } from 'vitest';
import { DateTime } from 'luxon';
import { isoWeek, isoWeekday, utcDay } from './iso-week';

describe('ISO 8601 week dates', () => {
  // Year-boundary cases of the ISO week-numbering year [memory]: 2021-01-03 is a Sunday in 2020-W53;
  // 2008-12-29 is Monday of 2009-W01; 2010-01-03 is in 2009-W53; 2026-12-02 (a Wednesday) is in 2026-W49.
  it.each([
    ['2021-01-03', '2020-W53', 7],
    ['2021-01-04', '2021-W01', 1],
    ['2008-12-29', '2009-W01', 1],
    ['2010-01-03', '2009-W53', 7],
    ['2026-12-02', '2026-W49', 3],
  ])('%s is in %s, weekday %i', (day, week, weekday) => {
    const at = new Date(`${day}T12:00:00Z`);
    expect(isoWeek(at)).toBe(week);
    expect(isoWeekday(at)).toBe(weekday);
  });

  it('agrees with luxon (a general-purpose date library) on every day from 1999 to 2032, at both ends of the UTC day', () => {
    for (let t = Date.UTC(1999, 0, 1); t < Date.UTC(2033, 0, 1); t += 86_400_000) {
      for (const at of [new Date(t), new Date(t + 86_399_999)]) {
        const ref = DateTime.fromJSDate(at, { zone: 'utc' });
        expect(isoWeek(at)).toBe(`${ref.weekYear}-W${String(ref.weekNumber).padStart(2, '0')}`);
        expect(isoWeekday(at)).toBe(ref.weekday);
      }
    }
  });

  it('takes the UTC day, whatever the hour', () => {
    expect(utcDay(new Date('2026-12-31T23:59:59Z'))).toBe('2026-12-31');
    expect(utcDay(new Date('2026-12-31T23:59:59Z'), 1)).toBe('2027-01-01');
    expect(utcDay(new Date('2026-03-01T00:00:00Z'), -1)).toBe('2026-02-28');
  });
});
