import { describe, expect, it } from 'vitest';
import {
  addDays, cumulativeSeries, dayNumber, exposureBetween, exposureByDay, exposureByYear, findOverlaps, isIsoDate, openDays,
  periodExposure, rollingExposure, totalExposure, validatePeriod, type DisplayPeriodInput,
} from './light-dose';

const period = (start: string, end: string, lux: number, hoursPerDay: number, extra: Partial<DisplayPeriodInput> = {}): DisplayPeriodInput => ({
  start, end, lux, hoursPerDay, ...extra,
});

describe('calendar days', () => {
  it('counts days across a leap day: 2024-02-28 to 2024-03-01 is three days (2024 is a Gregorian leap year)', () => {
    expect(dayNumber('2024-03-01') - dayNumber('2024-02-28')).toBe(2);
    expect(openDays(period('2024-02-28', '2024-03-01', 50, 8))).toBe(3);
    expect(addDays('2025-12-31', 1)).toBe('2026-01-01');
  });

  it('accepts only real dates written YYYY-MM-DD', () => {
    expect(isIsoDate('2025-02-28')).toBe(true);
    expect(isIsoDate('2025-02-29')).toBe(false); // 2025 is not a leap year
    expect(isIsoDate('2025-2-28')).toBe(false);
    expect(isIsoDate('2025-02-28T00:00:00Z')).toBe(false);
    expect(() => dayNumber('31/12/2025')).toThrow(RangeError);
  });
});

describe('exposure of display periods (lux × hours per open day)', () => {
  it('reciprocity: 50 lx for 10 h equals 250 lx for 2 h (REFERENCES.md §4, published national conservation institute guidance)', () => {
    const dim = period('2025-05-01', '2025-05-01', 50, 10);
    const bright = period('2025-05-01', '2025-05-01', 250, 2);
    expect(periodExposure(dim)).toBe(500);
    expect(periodExposure(bright)).toBe(periodExposure(dim));
  });

  it('closed weekdays: four weeks open Tuesday to Sunday, 8 h at 50 lx, give 9,600 lx·h', () => {
    // By hand: 2026-03-02 is a Monday (2026-03-01 is a Sunday). 2026-03-02 … 2026-03-29 is 28 days,
    // four of them Mondays (2, 9, 16, 23 March), so 24 open days × 50 lx × 8 h = 24 × 400 = 9,600 lx·h.
    expect(new Date('2026-03-02T00:00:00Z').getUTCDay()).toBe(1); // JavaScript's own calendar: 1 = Monday
    const p = period('2026-03-02', '2026-03-29', 50, 8, { daysOpen: [2, 3, 4, 5, 6, 7] });
    expect(openDays(p)).toBe(24);
    expect(periodExposure(p)).toBe(9_600);
    expect(exposureByDay(p).some(([d]) => d === dayNumber('2026-03-09'))).toBe(false);
  });

  it('closed dates (holidays) give nothing', () => {
    // 2026-03-02 … 2026-03-08, every day open but 2026-03-04: 6 days × 50 lx × 8 h = 2,400 lx·h.
    const p = period('2026-03-02', '2026-03-08', 50, 8, { closedDates: ['2026-03-04', '2027-01-01'] });
    expect(periodExposure(p)).toBe(2_400);
  });

  it('partial days: 7.5 h a day', () => {
    // 5 days × 50 lx × 7.5 h = 5 × 375 = 1,875 lx·h.
    expect(periodExposure(period('2025-03-01', '2025-03-05', 50, 7.5))).toBe(1_875);
  });

  // Two periods with a gap between them (worked by hand):
  //   A: 2025-01-10 … 2025-01-19, 10 days × 100 lx × 8 h = 10 × 800 = 8,000 lx·h
  //   B: 2025-03-01 … 2025-03-05,  5 days × 50 lx × 7.5 h = 5 × 375 = 1,875 lx·h
  const A = period('2025-01-10', '2025-01-19', 100, 8, { id: 'A' });
  const B = period('2025-03-01', '2025-03-05', 50, 7.5, { id: 'B' });

  it('sums periods with a gap between them: 8,000 + 1,875 = 9,875 lx·h', () => {
    expect(totalExposure([A, B])).toBe(9_875);
    expect(totalExposure([])).toBe(0);
  });

  it('a window counts only the days of each period inside it', () => {
    // 2025-01-15 … 2025-03-02: A's days 15–19 January (5 × 800 = 4,000) and B's 1–2 March (2 × 375 = 750).
    expect(exposureBetween([A, B], '2025-01-15', '2025-03-02')).toBe(4_750);
    // The gap alone: nothing.
    expect(exposureBetween([A, B], '2025-01-20', '2025-02-28')).toBe(0);
  });

  it('splits a period across 31 December between the two years', () => {
    // 2025-12-20 … 2026-01-10 at 50 lx × 10 h = 500 lx·h a day: 12 days in 2025 (6,000), 10 in 2026 (5,000).
    const p = period('2025-12-20', '2026-01-10', 50, 10);
    expect(periodExposure(p)).toBe(11_000);
    expect(exposureByYear([p, A])).toEqual([
      { year: 2025, luxHours: 8_000 + 6_000 },
      { year: 2026, luxHours: 5_000 },
    ]);
  });

  it('rolling 12 months: the 365 days ending on the date', () => {
    // The 365 days ending 2026-06-30 start on 2025-07-01; of a period 2025-06-30 … 2025-07-01 only its second day counts.
    const p = period('2025-06-30', '2025-07-01', 100, 1);
    expect(rollingExposure([p], '2026-06-30')).toBe(100);
    expect(rollingExposure([p], '2026-06-29')).toBe(200);
    expect(rollingExposure([p], '2026-07-01')).toBe(0);
    expect(rollingExposure([p], '2025-07-01', 1)).toBe(100);
  });

  it('overlapping periods add up day by day', () => {
    const x = period('2025-01-01', '2025-01-03', 10, 10);
    const y = period('2025-01-03', '2025-01-04', 20, 10);
    expect(exposureBetween([x, y], '2025-01-03', '2025-01-03')).toBe(100 + 200);
  });

  it('refuses to compute from an invalid period', () => {
    expect(() => periodExposure(period('2025-01-10', '2025-01-09', 50, 8))).toThrow(/end/);
  });
});

describe('cumulativeSeries: points for the chart', () => {
  it('is flat between displays and rises across each one (exposure received before each date)', () => {
    const A = period('2025-01-10', '2025-01-19', 100, 8);
    const B = period('2025-03-01', '2025-03-05', 50, 7.5);
    expect(cumulativeSeries([B, A])).toEqual([
      { date: '2025-01-10', luxHours: 0 },
      { date: '2025-01-20', luxHours: 8_000 },
      { date: '2025-03-01', luxHours: 8_000 },
      { date: '2025-03-06', luxHours: 9_875 },
    ]);
    expect(cumulativeSeries([])).toEqual([]);
  });

  it('merges touching periods into one rise', () => {
    const a = period('2025-01-01', '2025-01-02', 100, 1);
    const b = period('2025-01-03', '2025-01-04', 100, 1);
    expect(cumulativeSeries([a, b])).toEqual([
      { date: '2025-01-01', luxHours: 0 },
      { date: '2025-01-03', luxHours: 200 },
      { date: '2025-01-05', luxHours: 400 },
    ]);
  });
});

describe('findOverlaps: a print cannot be in two displays at once', () => {
  const first = period('2025-01-01', '2025-01-19', 50, 8, { id: 'first' });

  it('periods that only touch do not overlap', () => {
    expect(findOverlaps([first, period('2025-01-20', '2025-02-01', 50, 8)])).toEqual([]);
  });

  it('a period starting on the day another ends overlaps it by that day', () => {
    const second = period('2025-01-19', '2025-02-01', 50, 8, { id: 'second' });
    const o = findOverlaps([first, second]);
    expect(o).toHaveLength(1);
    expect(o[0]).toMatchObject({ firstIndex: 0, secondIndex: 1, from: '2025-01-19', to: '2025-01-19' });
    expect(o[0].second.id).toBe('second');
  });

  it('finds every pair, including a period inside another', () => {
    const inner = period('2025-01-05', '2025-01-06', 50, 8);
    const later = period('2025-03-01', '2025-03-02', 50, 8);
    const across = period('2025-01-10', '2025-03-01', 50, 8);
    const o = findOverlaps([first, inner, later, across]);
    expect(o.map((x) => [x.firstIndex, x.secondIndex])).toEqual([[0, 1], [0, 3], [2, 3]]);
    expect(o[1]).toMatchObject({ from: '2025-01-10', to: '2025-01-19' });
  });
});

describe('validatePeriod names the field at fault', () => {
  const ok = period('2025-01-01', '2025-01-31', 50, 8);
  const fields = (p: DisplayPeriodInput) => validatePeriod(p).map((x) => x.field);

  it('a sound period has no problems; a one-day period and 24 h a day are allowed', () => {
    expect(validatePeriod(ok)).toEqual([]);
    expect(validatePeriod({ ...ok, end: ok.start, hoursPerDay: 24, lux: 0, daysOpen: [7] })).toEqual([]);
  });

  it('end before start', () => {
    expect(validatePeriod({ ...ok, end: '2024-12-31' })).toEqual([{ field: 'end', message: 'End (2024-12-31) is before start (2025-01-01).' }]);
  });

  it('dates that are not calendar dates', () => {
    expect(fields({ ...ok, start: '2025-02-30' })).toEqual(['start']);
    expect(fields({ ...ok, end: '' })).toEqual(['end']);
    expect(fields({ ...ok, closedDates: ['2025-01-05', 'Christmas'] })).toEqual(['closedDates']);
  });

  it('illuminance negative or not a number', () => {
    expect(fields({ ...ok, lux: -1 })).toEqual(['lux']);
    expect(fields({ ...ok, lux: Number.NaN })).toEqual(['lux']);
    expect(fields({ ...ok, lux: Number.POSITIVE_INFINITY })).toEqual(['lux']);
  });

  it('hours a day of 0, 25 or not a number', () => {
    expect(fields({ ...ok, hoursPerDay: 0 })).toEqual(['hoursPerDay']);
    expect(fields({ ...ok, hoursPerDay: 25 })).toEqual(['hoursPerDay']);
    expect(fields({ ...ok, hoursPerDay: 24.01 })).toEqual(['hoursPerDay']);
    expect(fields({ ...ok, hoursPerDay: Number.NaN })).toEqual(['hoursPerDay']);
  });

  it('open weekdays empty, out of 1–7, fractional or repeated', () => {
    for (const daysOpen of [[], [0], [8], [1.5], [2, 2]]) expect(fields({ ...ok, daysOpen })).toEqual(['daysOpen']);
  });

  it('reports several problems at once', () => {
    expect(fields({ start: 'x', end: '2025-01-01', lux: -5, hoursPerDay: 30 })).toEqual(['start', 'lux', 'hoursPerDay']);
  });
});
