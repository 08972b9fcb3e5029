/**
 * Light budgets of prints by light-responsivity category (CIE 157:2004): the default category of
 * a print from its process and toners, where its exposure stands against its budget, the rest
 * in the dark it owes after heavy exposure, and the warnings a registrar sees before a display.
 *
 * The annual budget is held over any 365 consecutive days (the last 12 months at each day), so a
 * display split across New Year cannot use two years' budget at once; calendar-year figures are
 * reported beside it. The product advises; care decisions rest with qualified conservators.
 */
import { LIGHT_RESPONSIVITY } from '../schemas/vocab';
import {
  dailyExposure, dayNumber, dayString, exposureBetween, periodExposure, rollingExposure, type DisplayPeriodInput,
} from './light-dose';

/** The categories, the same codes as the catalogue's LIGHT_RESPONSIVITY list. */
export const LIGHT_CATEGORIES = LIGHT_RESPONSIVITY.codes;
export type LightCategory = (typeof LIGHT_CATEGORIES)[number];

/** Limits for one category; null means no limit. */
export interface LightBudget {
  /** Highest illuminance on the object, lx. */
  maxLux: number | null;
  /** Most exposure in any 12 months (365 days), lx·h. */
  annualLuxHours: number | null;
}

/**
 * Default limits (REFERENCES.md §4, CIE 157:2004 categories; the figures are [memory — verify]).
 * They are settings: a collection may replace them.
 */
export const DEFAULT_LIGHT_BUDGETS: Record<LightCategory, LightBudget> = {
  irresponsive: { maxLux: null, annualLuxHours: null },
  low: { maxLux: 200, annualLuxHours: 600_000 },
  medium: { maxLux: 50, annualLuxHours: 150_000 },
  high: { maxLux: 50, annualLuxHours: 15_000 },
};

/** Where the default limits come from, to be shown beside them. */
export const LIGHT_BUDGET_SOURCE =
  'Categories: CIE 157:2004, Control of damage to museum objects by optical radiation (by ISO Blue Wool ' +
  'responsivity). Limits per category: recalled from that publication, not yet checked against the text ' +
  '[memory — verify]. The figures are settings of the collection.';

/**
 * Default category by process and by toner class. A print takes the most responsive category
 * among its process and each of its toner classes; a toner class missing from `toner` leaves the
 * process category as it is, and a process missing from `process` takes `fallback`.
 */
export interface ResponsivityRules {
  process: Record<string, LightCategory>;
  toner: Record<string, LightCategory>;
  fallback: LightCategory;
}

/**
 * The defaults (a setting; a conservator overrides a print's category with a reason). Choices,
 * as common practice, cautious where unsure:
 * - Prussian blue (cyanotype process, iron-blue toner) → high: it fades in light (REFERENCES.md §4,
 *   which places it in the high or medium band; high is the cautious end).
 * - Gelatin silver, developing-out, plain or toned with selenium, gold or sulfide → medium: the
 *   silver image itself is stable in light, but photographs are usually shown at about 50 lx
 *   because paper, gelatin, optical brighteners and retouching can change; toning with these
 *   toners makes the image more stable, not less, so it does not raise the category.
 * - Gelatin silver printing-out and albumen → high: fine-grained printed-out silver and albumen
 *   highlights yellow and fade readily (common practice).
 * - Platinum/palladium → low: the metal image is very stable; the paper is what ages.
 * - Copper and vanadium toners → medium (ferricyanide-based colour toners, less stable than the
 *   silver image; common practice). Other or unknown → medium.
 */
export const DEFAULT_RESPONSIVITY_RULES: ResponsivityRules = {
  process: {
    gelatin_silver_developing_out: 'medium',
    gelatin_silver_printing_out: 'high',
    cyanotype: 'high',
    albumen: 'high',
    platinum_palladium: 'low',
    other: 'medium',
  },
  toner: { iron_blue: 'high', copper: 'medium', vanadium: 'medium', other: 'medium' },
  fallback: 'medium',
};

const RANK: Record<LightCategory, number> = { irresponsive: 0, low: 1, medium: 2, high: 3 };

/** Default light-responsivity category of a print from its process and toner classes. */
export function defaultResponsivity(
  process: string,
  tonerClasses: readonly string[],
  rules: ResponsivityRules = DEFAULT_RESPONSIVITY_RULES,
): LightCategory {
  let cat = rules.process[process] ?? rules.fallback;
  for (const t of tonerClasses) {
    const c = rules.toner[t];
    if (c && RANK[c] > RANK[cat]) cat = c;
  }
  return cat;
}

export interface RestOwed {
  /** Last day the print should stay in the dark; null when no rest is owed. */
  owedUntil: string | null;
  /** First day it may be shown again; null when no rest is owed. */
  freeFrom: string | null;
  /** The rule and its outcome in plain words. */
  explanation: string;
}

/** The rest rule, as shown to people. */
export const REST_RULE =
  'A print whose exposure over the last 12 months is above its annual budget rests in the dark until ' +
  'its exposure over the 12 months ending on a day is back within the budget, counting no further display.';

const fmt = (n: number) => Math.round(n).toLocaleString('en-GB');

/**
 * Rest owed on `asOf` under REST_RULE. Only days up to `asOf` count. With no annual budget
 * (irresponsive) no rest is ever owed.
 */
export function restOwed(periods: readonly DisplayPeriodInput[], annualBudget: number | null, asOf: string): RestOwed {
  const used = rollingExposure(periods, asOf);
  if (annualBudget === null) return { owedUntil: null, freeFrom: null, explanation: 'No annual light budget applies; no rest is owed.' };
  if (used <= annualBudget) {
    return {
      owedUntil: null,
      freeFrom: null,
      explanation: `${fmt(used)} of ${fmt(annualBudget)} lx·h used in the 12 months to ${asOf}: within budget, no rest owed.`,
    };
  }
  const end = dayNumber(asOf);
  const daily = dailyExposure(periods);
  let window = used;
  let d = end;
  // Move the 365-day window forward a day at a time: the day leaving it drops out, nothing comes in.
  while (window > annualBudget) {
    d += 1;
    window -= daily.get(d - 365) ?? 0;
  }
  return {
    owedUntil: dayString(d - 1),
    freeFrom: dayString(d),
    explanation:
      `${fmt(used)} lx·h in the 12 months to ${asOf}, over the annual budget of ${fmt(annualBudget)} lx·h. ` +
      `${REST_RULE} Without further display that is ${dayString(d)}: the print rests in the dark through ${dayString(d - 1)}.`,
  };
}

/** Largest 365-day exposure among windows ending on days `from`..`to`, and the day it ends. */
function peakWindow(daily: Map<number, number>, from: number, to: number): { luxHours: number; endingOn: string } | null {
  if (to < from) return null;
  let window = 0;
  for (let d = from - 364; d <= from; d++) window += daily.get(d) ?? 0;
  let best = { luxHours: window, end: from };
  for (let e = from + 1; e <= to; e++) {
    window += (daily.get(e) ?? 0) - (daily.get(e - 365) ?? 0);
    if (window > best.luxHours) best = { luxHours: window, end: e };
  }
  return { luxHours: best.luxHours, endingOn: dayString(best.end) };
}

export interface BudgetStatusInput {
  /** The print's display periods already recorded, past and scheduled. */
  periods: readonly DisplayPeriodInput[];
  category: LightCategory;
  budgets?: Record<LightCategory, LightBudget>;
  /** Today, 'YYYY-MM-DD'. */
  asOf: string;
  /** A display being considered, not yet recorded. */
  planned?: readonly DisplayPeriodInput[];
}

export interface BudgetStatus {
  category: LightCategory;
  maxLux: number | null;
  annualBudget: number | null;
  /** Exposure from 1 January of asOf's year through asOf, lx·h. */
  usedThisYear: number;
  /** Exposure over the 365 days ending on asOf, lx·h. */
  usedRolling12: number;
  /** Exposure of all days up to asOf, lx·h. */
  total: number;
  /** Exposure of recorded periods after asOf, lx·h. */
  scheduled: number;
  /** Annual budget less usedRolling12 (negative when over); null without a budget. */
  remaining: number | null;
  /** Annual budget less usedThisYear (negative when over); null without a budget. */
  remainingThisYear: number | null;
  /** Exposure the planned display would add, lx·h. */
  plannedExtra: number;
  /** Largest 12-month exposure ending on or after asOf with recorded and planned periods. */
  peakRolling12: { luxHours: number; endingOn: string } | null;
  /** Recorded periods alone take some 12 months that include a day after asOf over the budget. */
  scheduledExceeds: boolean;
  /** With the planned display, some 12 months that include one of its days go over the budget. */
  wouldExceed: boolean;
  /** Periods lit above maxLux (equal to it is allowed). */
  luxOverMax: { period: DisplayPeriodInput; planned: boolean }[];
  restOwed: RestOwed;
}

/** Where a print's exposure stands against its budget on `asOf`, and what a planned display would do. */
export function budgetStatus(input: BudgetStatusInput): BudgetStatus {
  const { periods, category, asOf } = input;
  const planned = input.planned ?? [];
  const budget = (input.budgets ?? DEFAULT_LIGHT_BUDGETS)[category];
  const annual = budget.annualLuxHours;
  const today = dayNumber(asOf);
  const yearStart = `${asOf.slice(0, 4)}-01-01`;
  const usedThisYear = exposureBetween(periods, yearStart, asOf);
  const usedRolling12 = rollingExposure(periods, asOf);
  const recorded = dailyExposure(periods);
  const everything = dailyExposure([...periods, ...planned]);
  let total = 0;
  let scheduled = 0;
  for (const [d, v] of recorded) if (d <= today) total += v; else scheduled += v;

  const lastDay = (ps: readonly DisplayPeriodInput[]) => Math.max(today, ...ps.map((p) => dayNumber(p.end)));
  const peakAll = peakWindow(everything, today, lastDay([...periods, ...planned]) + 364);
  // Windows that hold a recorded day after today: those ending from the first such day to a year after the last.
  const future = [...recorded.keys()].filter((d) => d > today);
  const peakRecorded = future.length ? peakWindow(recorded, Math.min(...future), Math.max(...future) + 364) : null;
  let wouldExceed = false;
  if (annual !== null && planned.length) {
    const first = Math.min(...planned.map((p) => dayNumber(p.start)));
    const peak = peakWindow(everything, first, lastDay(planned) + 364);
    wouldExceed = peak !== null && peak.luxHours > annual;
  }
  const max = budget.maxLux;
  const over = (ps: readonly DisplayPeriodInput[], isPlanned: boolean) =>
    max === null ? [] : ps.filter((p) => p.lux > max).map((period) => ({ period, planned: isPlanned }));

  return {
    category,
    maxLux: max,
    annualBudget: annual,
    usedThisYear,
    usedRolling12,
    total,
    scheduled,
    remaining: annual === null ? null : annual - usedRolling12,
    remainingThisYear: annual === null ? null : annual - usedThisYear,
    plannedExtra: planned.reduce((s, p) => s + periodExposure(p), 0),
    peakRolling12: peakAll,
    scheduledExceeds: annual !== null && peakRecorded !== null && peakRecorded.luxHours > annual,
    wouldExceed,
    luxOverMax: [...over(periods, false), ...over(planned, true)],
    restOwed: restOwed(periods, annual, asOf),
  };
}

export type LightWarningCode = 'over_annual_budget' | 'scheduled_exceeds_budget' | 'planned_exceeds_budget' | 'over_max_lux';

export interface LightWarning {
  code: LightWarningCode;
  severity: 'high' | 'medium';
  message: string;
}

/** Warnings from a budget status, most severe first. */
export function lightWarnings(s: BudgetStatus): LightWarning[] {
  const out: LightWarning[] = [];
  if (s.annualBudget !== null && s.usedRolling12 > s.annualBudget) {
    out.push({
      code: 'over_annual_budget',
      severity: 'high',
      message: `Past its light budget: ${fmt(s.usedRolling12)} lx·h in the last 12 months, budget ${fmt(s.annualBudget)} lx·h. ${s.restOwed.explanation}`,
    });
  }
  if (s.wouldExceed && s.peakRolling12) {
    out.push({
      code: 'planned_exceeds_budget',
      severity: 'high',
      message:
        `The planned display (${fmt(s.plannedExtra)} lx·h) would take the print over its annual budget of ` +
        `${fmt(s.annualBudget ?? 0)} lx·h: up to ${fmt(s.peakRolling12.luxHours)} lx·h in the 12 months to ${s.peakRolling12.endingOn}.`,
    });
  }
  if (s.scheduledExceeds) {
    out.push({
      code: 'scheduled_exceeds_budget',
      severity: 'medium',
      message: `Displays already scheduled take the print over its annual budget of ${fmt(s.annualBudget ?? 0)} lx·h.`,
    });
  }
  for (const { period, planned } of s.luxOverMax) {
    out.push({
      code: 'over_max_lux',
      severity: planned ? 'high' : 'medium',
      message: `${planned ? 'Planned display' : 'Display'} ${period.start} to ${period.end} at ${period.lux} lx is above the ${s.maxLux} lx maximum for ${s.category} responsivity.`,
    });
  }
  return out;
}
