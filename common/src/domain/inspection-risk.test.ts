import { describe, expect, it } from 'vitest';
import { DateTime } from 'luxon';
import {
  addDays, addMonths, assessPrint, daysBetween, BASE_INTERVAL_MONTHS, DISPLAY_LEAD_DAYS, LOAN_LEAD_DAYS, MAX_INTERVAL_MONTHS, MIN_INTERVAL_MONTHS, type RiskInputs,
} from './inspection-risk';
import { DEFAULT_CLIMATE_SETTINGS, relativePermanence } from './isoperm';

/** A plain print: untoned developed-out silver, checked and graded good on 2026-01-15, nothing else known. */
const plain = (over: Partial<RiskInputs> = {}): RiskInputs => ({
  asOf: '2026-12-02', recordedOn: '2020-05-01', grade: 'good', previousGrade: 'good', lastCheckedOn: '2026-01-15', nextCheckOn: null,
  process: 'gelatin_silver_developing_out', tonerClasses: [], warningCodes: [], enclosureName: 'Unbuffered folder', lightShareOfBudget: null,
  permanence: null, fading: null, nextLoan: null, nextDisplay: null, ...over,
});

const permanenceAt = (t: number, rh: number) => relativePermanence(t, rh, DEFAULT_CLIMATE_SETTINGS);

describe('assessPrint: ordering of constructed prints', () => {
  it('an iron-blue print in a buffered folder, on display soon, is due long before an untoned good print in a cold store', () => {
    const blue = assessPrint(plain({
      tonerClasses: ['iron_blue'], warningCodes: ['prussian_blue_in_buffered_enclosure'], enclosureName: 'Buffered folder',
      nextDisplay: { startsOn: '2027-03-01', exhibition: 'Blue Hours' },
    }));
    // 10 °C / 30 % RH: permanence 5.603 against 20 °C / 50 % (REFERENCES.md §3, Ea 83.68 kJ/mol).
    const cold = assessPrint(plain({ permanence: permanenceAt(10, 30) }));
    expect(blue.dueOn < cold.dueOn).toBe(true);
    expect(blue.risk).not.toBe('low');
    expect(cold.risk).toBe('low');
    expect(cold.intervalMonths).toBeGreaterThan(BASE_INTERVAL_MONTHS);
  });

  it('ranks a poor, worsening cyanotype above a fair one above a good one', () => {
    const a = assessPrint(plain({ process: 'cyanotype', grade: 'poor', previousGrade: 'fair' }));
    const b = assessPrint(plain({ process: 'cyanotype', grade: 'fair', previousGrade: 'fair' }));
    const c = assessPrint(plain({ process: 'cyanotype' }));
    expect(a.dueOn < b.dueOn && b.dueOn < c.dueOn).toBe(true);
  });
});

describe('assessPrint: each factor moves the date the way its words say', () => {
  const base = assessPrint(plain());
  it('a plain good print has no factors and the routine interval', () => {
    expect(base.factors).toEqual([]);
    expect(base.intervalMonths).toBe(BASE_INTERVAL_MONTHS);
    expect(base.dueOn).toBe('2031-01-15');
    expect(base.explanation).toBe('due 2031-01: no risk factors, the routine 60-month interval');
  });

  /** The factor with this code, and that the date moved by exactly its months. */
  function movedBy(over: Partial<RiskInputs>, code: string) {
    const r = assessPrint(plain(over));
    const f = r.factors.find((x) => x.code === code)!;
    expect(f, code).toBeDefined();
    expect(r.intervalMonths).toBe(BASE_INTERVAL_MONTHS + f.months!);
    expect(r.dueOn).toBe(addMonths('2026-01-15', BASE_INTERVAL_MONTHS + f.months!));
    expect(r.explanation).toContain(`${f.text} (${f.months! > 0 ? '+' : '−'}${Math.abs(f.months!)} months)`);
    return { r, f };
  }

  it('condition: a fair grade shortens', () => {
    const { f } = movedBy({ grade: 'fair', previousGrade: null }, 'condition');
    expect(f.months).toBeLessThan(0);
    expect(f.text).toBe('last graded fair');
  });
  it('condition trend: worse than the check before shortens beyond the grade alone', () => {
    const steady = assessPrint(plain({ grade: 'fair', previousGrade: 'fair' }));
    const worse = assessPrint(plain({ grade: 'fair', previousGrade: 'good' }));
    expect(worse.dueOn < steady.dueOn).toBe(true);
    expect(worse.factors.find((f) => f.code === 'condition_trend')?.text).toBe('worse since the check before (good → fair)');
    // Better than before is no factor.
    expect(assessPrint(plain({ grade: 'good', previousGrade: 'fair' })).factors).toEqual([]);
  });
  it('vulnerable process: a cyanotype shortens (iron blue, REFERENCES.md §4/§5), gold toning lengthens (common practice)', () => {
    expect(movedBy({ process: 'cyanotype' }, 'vulnerable_process').f.months).toBeLessThan(0);
    expect(movedBy({ tonerClasses: ['gold'] }, 'vulnerable_process').f.months).toBeGreaterThan(0);
  });
  it('enclosure: a Prussian-blue image in a buffered enclosure shortens more than the process alone', () => {
    const alone = assessPrint(plain({ tonerClasses: ['iron_blue'] }));
    const r = assessPrint(plain({ tonerClasses: ['iron_blue'], warningCodes: ['prussian_blue_in_buffered_enclosure'], enclosureName: 'Buffered folder' }));
    expect(r.dueOn < alone.dueOn).toBe(true);
    expect(r.factors.map((x) => x.code)).toEqual(['vulnerable_process', 'enclosure']);
    expect(r.explanation).toContain('iron-blue print in a buffered enclosure (Buffered folder) (−9 months)');
  });
  it('light: over the budget shortens more than near it', () => {
    const over = movedBy({ warningCodes: ['over_light_budget'] }, 'light');
    const near = movedBy({ lightShareOfBudget: 0.8 }, 'light');
    expect(over.f.months!).toBeLessThan(near.f.months!);
    expect(near.f.text).toBe('displays use 80 % of its light budget');
    expect(assessPrint(plain({ lightShareOfBudget: 0.5 })).factors).toEqual([]);
  });
  it('climate: a warm store (25 °C 50 %, permanence 0.562) shortens, a cool dry one (15 °C 40 %, 2.268) lengthens', () => {
    // REFERENCES.md §3 values at Ea 83.68 kJ/mol: log2(0.562)·12 = −9.98 → −10; log2(2.268)·12 = 14.18 → +14 [computed].
    expect(movedBy({ permanence: permanenceAt(25, 50) }, 'climate').f.months).toBe(-10);
    expect(movedBy({ permanence: permanenceAt(15, 40) }, 'climate').f.months).toBe(14);
  });
  it('fading: the sooner the change is noticeable, the more it shortens', () => {
    const soon = movedBy({ fading: { ratePerYear: 0.6, noticeableOn: '2029-06-01', alreadyNoticeable: false } }, 'fading');
    const late = movedBy({ fading: { ratePerYear: 0.1, noticeableOn: '2034-06-01', alreadyNoticeable: false } }, 'fading');
    expect(soon.f.months!).toBeLessThan(late.f.months!);
    expect(soon.f.text).toBe('fading 0.6 ΔE00/yr, noticeable by 2029');
    // Not reached on the current trend: no factor.
    expect(assessPrint(plain({ fading: { ratePerYear: 0, noticeableOn: null, alreadyNoticeable: false } })).factors).toEqual([]);
  });
  it('never checked: the interval runs from the day recorded, shortened', () => {
    const r = assessPrint(plain({ grade: null, previousGrade: null, lastCheckedOn: null }));
    const f = r.factors.find((x) => x.code === 'never_checked')!;
    expect(f.months).toBeLessThan(0);
    expect(r.dueOn).toBe(addMonths('2020-05-01', BASE_INTERVAL_MONTHS + f.months!));
  });
  it('recommended: the day the last report asked for is kept when earlier', () => {
    const r = assessPrint(plain({ nextCheckOn: '2027-06-30' }));
    expect(r.dueOn).toBe('2027-06-30');
    expect(r.intervalMonths).toBe(BASE_INTERVAL_MONTHS);
    expect(r.factors[0]).toEqual({ code: 'recommended', text: 'the last report asked for a check by 2027-06-30', months: null, dueBy: '2027-06-30' });
  });
  it(`loan: the check comes ${LOAN_LEAD_DAYS} days before dispatch`, () => {
    const r = assessPrint(plain({ nextLoan: { dispatchOn: '2027-04-20', institution: 'Hollin Gallery' } }));
    expect(r.dueOn).toBe('2027-03-09'); // 42 days before 2027-04-20, counted by hand on a calendar
    expect(r.explanation).toBe('due 2027-03: loan to Hollin Gallery on 2027-04');
  });
  it(`display: the check comes ${DISPLAY_LEAD_DAYS} days before it opens`, () => {
    const r = assessPrint(plain({ nextDisplay: { startsOn: '2027-03-01', exhibition: 'Blue Hours' } }));
    expect(r.dueOn).toBe('2027-02-15'); // 2027 is not a leap year: 14 days before 1 March is 15 February
  });
  it('a fixed date later than the interval does not move the date, and comes last', () => {
    const r = assessPrint(plain({ grade: 'poor', previousGrade: null, nextLoan: { dispatchOn: '2030-01-10', institution: 'Hollin Gallery' } }));
    expect(r.dueOn).toBe(addMonths('2026-01-15', r.intervalMonths));
    expect(r.factors.map((f) => f.code)).toEqual(['condition', 'loan']);
  });
});

describe('assessPrint: floors, caps, bands and words', () => {
  it('never below the floor, never above the cap', () => {
    const worst = assessPrint(plain({
      process: 'cyanotype', grade: 'unacceptable', previousGrade: 'good', warningCodes: ['prussian_blue_in_buffered_enclosure', 'over_light_budget'],
      permanence: 0.2, fading: { ratePerYear: 2, noticeableOn: null, alreadyNoticeable: true },
    }));
    expect(worst.intervalMonths).toBe(MIN_INTERVAL_MONTHS);
    expect(worst.risk).toBe('urgent');
    const best = assessPrint(plain({ tonerClasses: ['gold', 'selenium'], permanence: 100 }));
    expect(best.intervalMonths).toBeLessThanOrEqual(MAX_INTERVAL_MONTHS);
  });
  it('orders factors largest first and writes the one line in that order', () => {
    const r = assessPrint(plain({
      tonerClasses: ['iron_blue'], warningCodes: ['prussian_blue_in_buffered_enclosure'], enclosureName: 'Buffered folder',
      fading: { ratePerYear: 0.6, noticeableOn: '2029-06-01', alreadyNoticeable: false },
      nextLoan: { dispatchOn: '2027-04-20', institution: 'Hollin Gallery' },
    }));
    // Interval 60 − 18 (fading: 912 days to 2029-06-01 = 2.50 years, 24 × (1 − 2.50/10) = 18.0) − 12 − 9 = 21 months → 2027-10-15;
    // the loan's date (2027-03-09) brings it 220 days ≈ 7.2 months earlier, so it weighs less than the enclosure's 9.
    expect(r.intervalMonths).toBe(21);
    expect(r.factors.map((f) => [f.code, f.months])).toEqual([['fading', -18], ['vulnerable_process', -12], ['enclosure', -9], ['loan', null]]);
    expect(r.dueOn).toBe('2027-03-09');
    expect(r.explanation).toBe(
      'due 2027-03: fading 0.6 ΔE00/yr, noticeable by 2029 (−18 months), iron-blue print: iron blue fades in light and under alkali (−12 months), ' +
      'iron-blue print in a buffered enclosure (Buffered folder) (−9 months), loan to Hollin Gallery on 2027-04',
    );
  });
  it('calendar arithmetic agrees with luxon (a general-purpose date library) over eight years of days', () => {
    const utc = (d: string) => DateTime.fromISO(d, { zone: 'utc' });
    for (let day = utc('2023-01-01'); day < utc('2031-01-01'); day = day.plus({ days: 1 })) {
      const iso = day.toISODate()!;
      for (const m of [-48, -13, -1, 1, 12, 24, 59, 120]) expect(addMonths(iso, m), `${iso} ${m}`).toBe(day.plus({ months: m }).toISODate());
      for (const n of [-42, -14, 1, 400]) expect(addDays(iso, n)).toBe(day.plus({ days: n }).toISODate());
      expect(daysBetween('2026-12-02', iso)).toBe(Math.round(day.diff(utc('2026-12-02'), 'days').days));
    }
  });
  it('month arithmetic holds the day to the month\'s end: 2026-01-31 + 1 month = 2026-02-28', () => {
    expect(addMonths('2026-01-31', 1)).toBe('2026-02-28');
    expect(addMonths('2024-01-31', 1)).toBe('2024-02-29'); // leap year
  });
});
