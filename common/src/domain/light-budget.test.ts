import { describe, expect, it } from 'vitest';
import { LIGHT_RESPONSIVITY } from '../schemas/vocab';
import {
  budgetStatus, DEFAULT_LIGHT_BUDGETS, DEFAULT_RESPONSIVITY_RULES, defaultResponsivity, LIGHT_BUDGET_SOURCE, LIGHT_CATEGORIES,
  lightWarnings, REST_RULE, restOwed, type LightBudget,
} from './light-budget';
import type { DisplayPeriodInput } from './light-dose';

const period = (start: string, end: string, lux: number, hoursPerDay: number, extra: Partial<DisplayPeriodInput> = {}): DisplayPeriodInput => ({
  start, end, lux, hoursPerDay, ...extra,
});

describe('categories and default budgets', () => {
  it('uses the catalogue’s own responsivity codes', () => {
    expect(LIGHT_CATEGORIES).toBe(LIGHT_RESPONSIVITY.codes);
    expect(Object.keys(DEFAULT_LIGHT_BUDGETS).sort()).toEqual([...LIGHT_RESPONSIVITY.codes].sort());
  });

  it('holds the limits of REFERENCES.md §4 (CIE 157:2004 categories; limits [memory — verify])', () => {
    expect(DEFAULT_LIGHT_BUDGETS).toEqual({
      irresponsive: { maxLux: null, annualLuxHours: null },
      low: { maxLux: 200, annualLuxHours: 600_000 },
      medium: { maxLux: 50, annualLuxHours: 150_000 },
      high: { maxLux: 50, annualLuxHours: 15_000 },
    });
    expect(LIGHT_BUDGET_SOURCE).toMatch(/CIE 157:2004/);
    expect(LIGHT_BUDGET_SOURCE).toMatch(/\[memory — verify\]/);
  });
});

describe('defaultResponsivity', () => {
  it('Prussian-blue images are high: cyanotypes and iron-blue toned prints (REFERENCES.md §4)', () => {
    expect(defaultResponsivity('cyanotype', [])).toBe('high');
    expect(defaultResponsivity('gelatin_silver_developing_out', ['iron_blue'])).toBe('high');
    expect(defaultResponsivity('gelatin_silver_developing_out', ['selenium', 'iron_blue'])).toBe('high');
  });

  it('gelatin silver, plain or selenium/gold/sulfide toned, is medium; platinum low (common practice, see the rules)', () => {
    expect(defaultResponsivity('gelatin_silver_developing_out', [])).toBe('medium');
    for (const t of ['selenium', 'gold', 'sulfide', 'polysulfide']) expect(defaultResponsivity('gelatin_silver_developing_out', [t])).toBe('medium');
    expect(defaultResponsivity('platinum_palladium', [])).toBe('low');
    expect(defaultResponsivity('platinum_palladium', ['copper'])).toBe('medium');
    expect(defaultResponsivity('albumen', ['gold'])).toBe('high');
  });

  it('takes its table as a setting, and the fallback for an unknown process', () => {
    const rules = { ...DEFAULT_RESPONSIVITY_RULES, process: { ...DEFAULT_RESPONSIVITY_RULES.process, gelatin_silver_developing_out: 'low' as const } };
    expect(defaultResponsivity('gelatin_silver_developing_out', ['gold'], rules)).toBe('low');
    expect(defaultResponsivity('daguerreotype', [], { ...DEFAULT_RESPONSIVITY_RULES, fallback: 'irresponsive' })).toBe('irresponsive');
  });
});

describe('budgetStatus at and just past each limit', () => {
  // 30 days × 50 lx × 10 h = 15,000 lx·h: exactly the high-responsivity annual budget.
  const atLimit = period('2026-01-01', '2026-01-30', 50, 10);
  // One more lux-hour: 1 lx × 1 h on one day.
  const oneMore = period('2026-02-10', '2026-02-10', 1, 1);

  it('exactly at the annual budget is within it', () => {
    const s = budgetStatus({ periods: [atLimit], category: 'high', asOf: '2026-03-01' });
    expect(s).toMatchObject({ usedThisYear: 15_000, usedRolling12: 15_000, total: 15_000, remaining: 0, annualBudget: 15_000 });
    expect(s.restOwed.owedUntil).toBeNull();
    expect(lightWarnings(s)).toEqual([]);
  });

  it('one lux-hour past it is over: warning and rest owed', () => {
    const s = budgetStatus({ periods: [atLimit, oneMore], category: 'high', asOf: '2026-03-01' });
    expect(s.usedRolling12).toBe(15_001);
    expect(s.remaining).toBe(-1);
    expect(lightWarnings(s).map((w) => w.code)).toEqual(['over_annual_budget']);
    expect(s.restOwed.owedUntil).not.toBeNull();
  });

  it('a planned display that fills the budget exactly is allowed; one lux-hour more is warned', () => {
    const s = budgetStatus({ periods: [], category: 'high', asOf: '2025-12-01', planned: [atLimit] });
    expect(s).toMatchObject({ plannedExtra: 15_000, wouldExceed: false, usedRolling12: 0 });
    const t = budgetStatus({ periods: [oneMore], category: 'high', asOf: '2025-12-01', planned: [atLimit] });
    expect(t.wouldExceed).toBe(true);
    expect(t.scheduledExceeds).toBe(false);
    expect(t.peakRolling12?.luxHours).toBe(15_001);
    const w = lightWarnings(t);
    expect(w.map((x) => x.code)).toEqual(['planned_exceeds_budget']);
    expect(w[0].message).toContain('15,001');
  });

  it('medium (150,000) and low (600,000): at the limit and past it', () => {
    // 300 days × 50 lx × 10 h = 150,000; 300 days × 200 lx × 10 h = 600,000.
    const medium = period('2025-01-01', '2025-10-27', 50, 10);
    const low = period('2025-01-01', '2025-10-27', 200, 10);
    expect(budgetStatus({ periods: [medium], category: 'medium', asOf: '2025-12-31' }).remaining).toBe(0);
    expect(budgetStatus({ periods: [medium], category: 'medium', asOf: '2025-12-31', planned: [period('2025-12-31', '2025-12-31', 1, 1)] }).wouldExceed).toBe(true);
    expect(budgetStatus({ periods: [low], category: 'low', asOf: '2025-12-31' }).remaining).toBe(0);
    expect(budgetStatus({ periods: [low, period('2025-12-31', '2025-12-31', 1, 1)], category: 'low', asOf: '2025-12-31' }).remaining).toBe(-1);
  });

  it('maximum illuminance: equal to it is allowed, above it is warned', () => {
    const s = budgetStatus({
      periods: [period('2026-01-01', '2026-01-01', 50, 1), period('2026-01-05', '2026-01-05', 51, 1)],
      category: 'medium', asOf: '2026-02-01', planned: [period('2026-03-01', '2026-03-01', 200, 1)],
    });
    expect(s.luxOverMax.map((x) => [x.period.lux, x.planned])).toEqual([[51, false], [200, true]]);
    expect(lightWarnings(s).filter((w) => w.code === 'over_max_lux').map((w) => w.severity)).toEqual(['medium', 'high']);
    expect(budgetStatus({ periods: [period('2026-01-01', '2026-01-01', 200, 1)], category: 'low', asOf: '2026-02-01' }).luxOverMax).toEqual([]);
  });

  it('irresponsive has no limits', () => {
    const s = budgetStatus({ periods: [period('2026-01-01', '2026-12-31', 10_000, 24)], category: 'irresponsive', asOf: '2026-12-31' });
    expect(s).toMatchObject({ annualBudget: null, maxLux: null, remaining: null, wouldExceed: false, luxOverMax: [] });
    expect(lightWarnings(s)).toEqual([]);
  });

  it('budgets are a setting', () => {
    const budgets: Record<string, LightBudget> = { ...DEFAULT_LIGHT_BUDGETS, high: { maxLux: 30, annualLuxHours: 10_000 } };
    const s = budgetStatus({ periods: [atLimit], category: 'high', asOf: '2026-03-01', budgets });
    expect(s.remaining).toBe(-5_000);
    expect(s.luxOverMax).toHaveLength(1);
  });

  it('a display across New Year cannot use two calendar years’ budgets: the budget holds over any 12 months', () => {
    // 20 days × 50 lx × 10 h = 10,000 lx·h in December 2025 and again in January 2026: each calendar year
    // 10,000 ≤ 15,000, but the 12 months ending 2026-01-20 hold 20,000.
    const s = budgetStatus({
      periods: [period('2025-12-12', '2025-12-31', 50, 10)], category: 'high', asOf: '2025-12-31',
      planned: [period('2026-01-01', '2026-01-20', 50, 10)],
    });
    expect(s.usedThisYear).toBe(10_000);
    expect(s.wouldExceed).toBe(true);
    expect(s.peakRolling12).toEqual({ luxHours: 20_000, endingOn: '2026-01-20' });
  });

  it('separates exposure so far from displays scheduled after today', () => {
    const s = budgetStatus({ periods: [period('2026-01-01', '2026-01-10', 100, 10)], category: 'high', asOf: '2026-01-05' });
    // 5 days of 1,000 lx·h have passed, 5 are still to come.
    expect(s).toMatchObject({ total: 5_000, scheduled: 5_000, usedThisYear: 5_000, scheduledExceeds: false });
  });

  it('warns when exposure so far and a scheduled display together go over the budget within 12 months', () => {
    // 10,000 lx·h in January 2026 (20 days × 500) and 10,000 scheduled for March 2026: 20,000 in the 12 months to 2026-03-20.
    const s = budgetStatus({
      periods: [period('2026-01-01', '2026-01-20', 50, 10), period('2026-03-01', '2026-03-20', 50, 10)], category: 'high', asOf: '2026-02-01',
    });
    expect(s).toMatchObject({ usedRolling12: 10_000, scheduled: 10_000, scheduledExceeds: true, wouldExceed: false });
    // The same March display a year and a day after January's last day fits: January has left the window.
    const later = budgetStatus({
      periods: [period('2026-01-01', '2026-01-20', 50, 10), period('2027-01-21', '2027-02-09', 50, 10)], category: 'high', asOf: '2026-02-01',
    });
    expect(later.scheduledExceeds).toBe(false);
  });

  it('warns when displays already scheduled go over the budget', () => {
    const s = budgetStatus({ periods: [period('2026-06-01', '2026-06-30', 50, 12)], category: 'high', asOf: '2026-01-05' });
    expect(s.scheduledExceeds).toBe(true);
    expect(lightWarnings(s).map((w) => w.code)).toEqual(['scheduled_exceeds_budget']);
  });
});

describe('restOwed', () => {
  it('rests in the dark until the last 12 months are back within budget', () => {
    // 2026-01-01 … 2026-01-30 at 50 lx × 12 h = 600 lx·h a day, 18,000 lx·h; high budget 15,000.
    // By hand: the window ending on day D covers D − 364 … D. 3,000 lx·h (5 days) must leave it:
    // 1–5 January 2026 have left the window ending 2027-01-05 (which starts 2026-01-06; 2026 has 365 days),
    // leaving 25 × 600 = 15,000 ≤ 15,000. So the print may be shown again from 2027-01-05.
    const r = restOwed([period('2026-01-01', '2026-01-30', 50, 12)], 15_000, '2026-02-15');
    expect(r.freeFrom).toBe('2027-01-05');
    expect(r.owedUntil).toBe('2027-01-04');
    expect(r.explanation).toContain('18,000 lx·h');
    expect(r.explanation).toContain(REST_RULE);
  });

  it('ignores displays after the date (no further display is counted)', () => {
    const r = restOwed([period('2026-01-01', '2026-01-30', 50, 12), period('2026-03-01', '2026-03-30', 50, 12)], 15_000, '2026-02-15');
    expect(r.freeFrom).toBe('2027-01-05');
  });

  it('owes nothing within budget or without one', () => {
    expect(restOwed([period('2026-01-01', '2026-01-30', 50, 10)], 15_000, '2026-02-15')).toMatchObject({ owedUntil: null, freeFrom: null });
    expect(restOwed([period('2026-01-01', '2026-01-30', 5_000, 10)], null, '2026-02-15').owedUntil).toBeNull();
  });
});
