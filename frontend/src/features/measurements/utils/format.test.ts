import { describe, expect, it } from 'vitest';
import { projectionText, rateText } from '@/features/measurements/utils/format';

describe('rate in words', () => {
  it('gives the slope with its 95 % interval, the number of sessions and the span', () => {
    expect(
      rateText({ ok: true, slopePerYear: 0.2112, intercept: 0.05, standardError: 0.02, ci95: [0.1504, 0.2719], n: 6, spanYears: 24.04, r2: 0.95 }),
    ).toBe('0.21 ΔE00/year (95 % CI 0.15–0.27, n = 6 over 24.0 years)');
  });

  it('writes an interval that crosses zero with "to", so the dash is not read as a minus', () => {
    expect(rateText({ ok: true, slopePerYear: 0.01, intercept: 0, standardError: 0.02, ci95: [-0.03, 0.05], n: 4, spanYears: 6, r2: 0.2 })).toBe(
      '0.01 ΔE00/year (95 % CI −0.03 to 0.05, n = 4 over 6.0 years)',
    );
  });

  it('gives the server’s reason, word for word, when it refuses a rate', () => {
    const message = 'A rate needs measurements from at least 3 sessions; this series has 2.';
    expect(rateText({ ok: false, reason: 'not_enough_sessions', message })).toBe(message);
    expect(rateText({ ok: false, reason: 'span_too_short', message: 'A rate needs sessions spread over at least 1 year(s); this series spans 0.40.' })).toBe(
      'A rate needs sessions spread over at least 1 year(s); this series spans 0.40.',
    );
  });

  it('says plainly when there is nothing to fit', () => {
    expect(rateText(null)).toBe('No rate: there are no comparable measurements at this spot yet.');
  });

  it('takes another unit and precision for density', () => {
    expect(rateText({ ok: true, slopePerYear: -0.0042, intercept: 1.5, standardError: 0.001, ci95: [-0.006, -0.0024], n: 5, spanYears: 12.3, r2: 0.8 }, 'D/year', 3)).toBe(
      '−0.004 D/year (95 % CI −0.006 to −0.002, n = 5 over 12.3 years)',
    );
  });
});

describe('projection in words', () => {
  it('gives the month and year the threshold is reached, with the interval in years', () => {
    expect(
      projectionText({
        reached: true, alreadyReached: false, threshold: 2,
        date: '2031-03-14T00:00:00.000Z', interval: { earliest: '2029-06-01T00:00:00.000Z', latest: '2036-02-01T00:00:00.000Z' },
      }),
    ).toBe('reaches ΔE00 2.0 around March 2031 (between 2029 and 2036)');
  });

  it('says when no latest date can be given (the slope’s interval reaches zero)', () => {
    expect(
      projectionText({ reached: true, alreadyReached: false, threshold: 1.6, date: '2040-07-01T00:00:00.000Z', interval: { earliest: '2033-01-01T00:00:00.000Z', latest: null } }),
    ).toBe('reaches ΔE00 1.6 around July 2040 (not before 2033; no latest year can be given on current data)');
  });

  it('says since when a spot has been beyond the threshold', () => {
    expect(projectionText({ reached: true, alreadyReached: true, threshold: 2, firstDate: '2019-05-04T00:00:00.000Z' })).toBe(
      'already beyond the threshold since 4 May 2019',
    );
  });

  it('says when the trend does not reach it', () => {
    expect(projectionText({ reached: false, threshold: 2, reason: 'not reached on current trend' })).toBe('not reached on current trend');
  });

  it('says there is no projection without a rate', () => {
    expect(projectionText(null)).toBe('no projection without a rate');
  });
});
