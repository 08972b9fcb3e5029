/**
 * The re-inspection risk model: when a print should next be looked at, and why, in plain words.
 * Pure (no I/O); the server loads each print's inputs (`backend/src/services/schedule-inputs.ts`)
 * and stores the result. Written down in DEVELOPERS.md, "Re-inspection risk model".
 *
 * Shape of the model: a routine interval (BASE_INTERVAL_MONTHS) is shortened or lengthened by
 * factors, each a whole number of months with a reason; the sum is held between a floor and a cap.
 * The due date is the last check plus that interval, or earlier when a factor fixes a date (a check
 * before a loan's dispatch, before a display, the date the last report asked for). Dates are
 * calendar days 'YYYY-MM-DD', free of time zones.
 */
import type { Grade } from '../schemas/condition';
import type { RiskBand, RiskFactor, RiskFactorCode } from '../schemas/inspections';
import { isPrussianBlue } from './compatibility';

/** A routine check of a stable print in store every five years: common practice for survey cycles. */
export const BASE_INTERVAL_MONTHS = 60;
/** Never sooner than three months after the last check, whatever the factors add up to (a fixed date may still come earlier). */
export const MIN_INTERVAL_MONTHS = 3;
/** Never longer than ten years, however good the print and its store. */
export const MAX_INTERVAL_MONTHS = 120;
/**
 * A loan's check comes this many days before its dispatch: the outgoing condition report goes with
 * the loan's paperwork (facility report, insurance, courier), usually settled a month or more before
 * the crate leaves (common practice); six weeks leaves time to treat or withdraw the print.
 */
export const LOAN_LEAD_DAYS = 42;
/** A display's check comes two weeks before it opens: time to mount and frame after the look (common practice). */
export const DISPLAY_LEAD_DAYS = 14;

/** Months taken off for the last signed grade (good: none). */
export const GRADE_MONTHS: Record<Grade, number> = { good: 0, fair: -12, poor: -30, unacceptable: -48 };
const GRADE_ORDER: Record<Grade, number> = { good: 0, fair: 1, poor: 2, unacceptable: 3 };
/** Months taken off for each step the grade fell since the report before. */
export const TREND_MONTHS_PER_STEP = -12;
/** Iron blue (cyanotype, iron-blue toning) fades in light and under alkali (REFERENCES.md §4, §5). */
export const PRUSSIAN_BLUE_MONTHS = -12;
/** Printing-out and albumen prints: fine-grained image silver, more easily faded and yellowed (common practice). */
export const PRINTING_OUT_MONTHS = -6;
/** Gold, selenium or sulfide toning protects image silver (ISO 18920 names such prints in its scope; common practice). */
export const PROTECTIVE_TONER_MONTHS = 6;
const PROTECTIVE_TONERS = ['gold', 'selenium', 'sulfide', 'polysulfide'];

/** Months taken off per enclosure warning code; the largest of a print's codes counts. */
export const ENCLOSURE_MONTHS: Record<string, number> = {
  prussian_blue_in_buffered_enclosure: -9,
  enclosure_failed_pat: -9,
  alkaline_after_bath_on_iron_blue: -6,
  buffering_unknown_for_prussian_blue: -3,
  enclosure_without_pat: -3,
};
/** Over the light budget (stored warning, or its displays using the whole budget): −12; three quarters or more: −6. */
export const LIGHT_OVER_MONTHS = -12;
export const LIGHT_NEAR_MONTHS = -6;
export const LIGHT_NEAR_SHARE = 0.75;
/** Months per doubling (or halving) of the store's relative permanence, held within ±CLIMATE_MAX_MONTHS. */
export const CLIMATE_MONTHS_PER_DOUBLING = 12;
export const CLIMATE_MAX_MONTHS = 18;
/** Fading noticeable within FADING_HORIZON_YEARS takes off up to FADING_MAX_MONTHS, linearly (now: all of it). */
export const FADING_HORIZON_YEARS = 10;
export const FADING_MAX_MONTHS = -24;
/** Never checked: the interval runs from the day the print was recorded, less this. */
export const NEVER_CHECKED_MONTHS = -36;

/** Bands by the interval in force (months): urgent ≤ 9, high ≤ 24, moderate ≤ 42, low above. */
export const BAND_LIMITS: { band: RiskBand; maxMonths: number }[] = [
  { band: 'urgent', maxMonths: 9 },
  { band: 'high', maxMonths: 24 },
  { band: 'moderate', maxMonths: 42 },
];
/** Stored `risk_rank`: higher is riskier (work lists sort it descending). */
export const RISK_RANK: Record<RiskBand, number> = { low: 1, moderate: 2, high: 3, urgent: 4 };

export interface RiskInputs {
  /** The day the schedule is computed for. */
  asOf: string;
  /** The day the print was recorded (the anchor when it was never checked). */
  recordedOn: string;
  /** Last signed report: its grade, the grade of the signed report before it, its day and the day it asked for. */
  grade: Grade | null;
  previousGrade: Grade | null;
  lastCheckedOn: string | null;
  nextCheckOn: string | null;
  process: string;
  tonerClasses: readonly string[];
  /** The print's stored warning codes (compatibility.ts). */
  warningCodes: readonly string[];
  enclosureName: string | null;
  /** Share of the annual light budget its displays use (1 = all); null when not known. The stored warning counts as over. */
  lightShareOfBudget: number | null;
  /** Time-weighted relative permanence of its store over the last year (isoperm.ts); null without readings. */
  permanence: number | null;
  /** The fastest-fading spot: ΔE00 per year and when the trend reaches the noticeable threshold (null: not on this trend). */
  fading: { ratePerYear: number; noticeableOn: string | null; alreadyNoticeable: boolean } | null;
  nextLoan: { dispatchOn: string; institution: string } | null;
  nextDisplay: { startsOn: string; exhibition: string } | null;
}

export interface PrintRisk {
  dueOn: string;
  intervalMonths: number;
  risk: RiskBand;
  factors: RiskFactor[];
  explanation: string;
}

// ── Calendar days ──

// Calendar arithmetic on 'YYYY-MM-DD' by Date.UTC: a full recompute runs these for every print, and
// luxon's parsing cost more than the rest of the model; the tests check them against luxon.
const DAY_MS = 86_400_000;
const pad = (n: number, w = 2) => String(n).padStart(w, '0');
function ymd(day: string): [number, number, number] {
  return [Number(day.slice(0, 4)), Number(day.slice(5, 7)), Number(day.slice(8, 10))];
}
const dayOf = (ms: number) => new Date(ms).toISOString().slice(0, 10);

/** Whole months later (or earlier), the day held to the month's last (2026-01-31 + 1 → 2026-02-28, as luxon does). */
export function addMonths(day: string, months: number): string {
  const [y, m, d] = ymd(day);
  const index = y * 12 + (m - 1) + Math.round(months);
  const ny = Math.floor(index / 12);
  const nm = index - ny * 12 + 1;
  const last = new Date(Date.UTC(ny, nm, 0)).getUTCDate();
  return `${pad(ny, 4)}-${pad(nm)}-${pad(Math.min(d, last))}`;
}

export function addDays(day: string, days: number): string {
  const [y, m, d] = ymd(day);
  return dayOf(Date.UTC(y, m - 1, d) + days * DAY_MS);
}

/** Days from a to b (b later: positive). */
export function daysBetween(a: string, b: string): number {
  const [y1, m1, d1] = ymd(a);
  const [y2, m2, d2] = ymd(b);
  return Math.round((Date.UTC(y2, m2 - 1, d2) - Date.UTC(y1, m1 - 1, d1)) / DAY_MS);
}

const minDay = (a: string, b: string) => (a <= b ? a : b);
const signed = (months: number) => (months > 0 ? `+${months}` : `−${Math.abs(months)}`);
const fmt = (n: number) => (Math.round(n * 10) / 10).toString();

// ── The factors ──

function processWords(input: RiskInputs): string {
  if (input.process === 'cyanotype') return 'cyanotype';
  if (input.tonerClasses.includes('iron_blue')) return 'iron-blue print';
  if (input.process === 'albumen') return 'albumen print';
  if (input.process === 'gelatin_silver_printing_out') return 'printing-out print';
  return 'print';
}

const ENCLOSURE_WORDS: Record<string, (what: string, enc: string) => string> = {
  prussian_blue_in_buffered_enclosure: (what, enc) => `${what} in a buffered enclosure (${enc})`,
  enclosure_failed_pat: (_w, enc) => `enclosure failed the Photographic Activity Test (${enc})`,
  alkaline_after_bath_on_iron_blue: (what) => `${what} given an alkaline after-bath`,
  buffering_unknown_for_prussian_blue: (what, enc) => `${what} in an enclosure of unknown buffering (${enc})`,
  enclosure_without_pat: (_w, enc) => `enclosure not tested for photographic activity (${enc})`,
};

/** Every factor of a print with its months (or its fixed date); unordered, zero effects left out. */
export function riskFactors(input: RiskInputs): RiskFactor[] {
  const out: RiskFactor[] = [];
  const add = (code: RiskFactorCode, text: string, months: number | null, dueBy: string | null = null) => {
    if (months === 0) return;
    out.push({ code, text, months, dueBy });
  };
  const what = processWords(input);

  if (input.grade) add('condition', `last graded ${input.grade}`, GRADE_MONTHS[input.grade]);
  if (input.grade && input.previousGrade) {
    const steps = GRADE_ORDER[input.grade] - GRADE_ORDER[input.previousGrade];
    if (steps > 0) add('condition_trend', `worse since the check before (${input.previousGrade} → ${input.grade})`, steps * TREND_MONTHS_PER_STEP);
  }
  if (!input.lastCheckedOn) add('never_checked', 'never checked', NEVER_CHECKED_MONTHS);

  if (isPrussianBlue({ process: input.process, tonerClasses: [...input.tonerClasses] })) {
    add('vulnerable_process', `${what}: iron blue fades in light and under alkali`, PRUSSIAN_BLUE_MONTHS);
  } else if (input.process === 'albumen' || input.process === 'gelatin_silver_printing_out') {
    add('vulnerable_process', `${what}: fine-grained image silver`, PRINTING_OUT_MONTHS);
  } else {
    const protective = input.tonerClasses.filter((c) => PROTECTIVE_TONERS.includes(c));
    if (protective.length) add('vulnerable_process', `${protective.join(' and ').replace('_', ' ')} toning protects the image`, PROTECTIVE_TONER_MONTHS);
  }

  const enclosureCodes = input.warningCodes.filter((c) => c in ENCLOSURE_MONTHS).sort((a, b) => ENCLOSURE_MONTHS[a]! - ENCLOSURE_MONTHS[b]!);
  if (enclosureCodes.length) {
    const code = enclosureCodes[0]!;
    add('enclosure', ENCLOSURE_WORDS[code]!(what, input.enclosureName ?? 'unnamed'), ENCLOSURE_MONTHS[code]!);
  }

  const share = input.warningCodes.includes('over_light_budget') ? Math.max(1, input.lightShareOfBudget ?? 1) : input.lightShareOfBudget;
  if (share !== null && share >= 1) add('light', 'displays past its light budget', LIGHT_OVER_MONTHS);
  else if (share !== null && share >= LIGHT_NEAR_SHARE) add('light', `displays use ${Math.round(share * 100)} % of its light budget`, LIGHT_NEAR_MONTHS);

  if (input.permanence !== null && input.permanence > 0) {
    const months = Math.round(Math.max(-CLIMATE_MAX_MONTHS, Math.min(CLIMATE_MAX_MONTHS, CLIMATE_MONTHS_PER_DOUBLING * Math.log2(input.permanence))));
    add('climate', months < 0 ? `store wears faster than the reference climate (permanence ${fmt(input.permanence)})` : `cool, dry store (permanence ${fmt(input.permanence)})`, months);
  }

  if (input.fading && input.fading.ratePerYear > 0) {
    const rate = `fading ${fmt(input.fading.ratePerYear)} ΔE00/yr`;
    if (input.fading.alreadyNoticeable) add('fading', `${rate}, already a noticeable change`, FADING_MAX_MONTHS);
    else if (input.fading.noticeableOn) {
      const years = Math.max(0, daysBetween(input.asOf, input.fading.noticeableOn) / 365.2425);
      const months = Math.round(FADING_MAX_MONTHS * Math.max(0, 1 - years / FADING_HORIZON_YEARS));
      add('fading', `${rate}, noticeable by ${input.fading.noticeableOn.slice(0, 4)}`, months);
    }
  }

  if (input.nextCheckOn) add('recommended', `the last report asked for a check by ${input.nextCheckOn}`, null, input.nextCheckOn);
  if (input.nextLoan) {
    add('loan', `loan to ${input.nextLoan.institution} on ${input.nextLoan.dispatchOn.slice(0, 7)}`, null, addDays(input.nextLoan.dispatchOn, -LOAN_LEAD_DAYS));
  }
  if (input.nextDisplay) {
    add('display', `display in ${input.nextDisplay.exhibition} from ${input.nextDisplay.startsOn.slice(0, 7)}`, null, addDays(input.nextDisplay.startsOn, -DISPLAY_LEAD_DAYS));
  }
  return out;
}

/** A print's schedule: interval, band, due date, factors largest first and the one-line explanation. */
export function assessPrint(input: RiskInputs): PrintRisk {
  const factors = riskFactors(input);
  const sum = factors.reduce((s, f) => s + (f.months ?? 0), 0);
  const intervalMonths = Math.max(MIN_INTERVAL_MONTHS, Math.min(MAX_INTERVAL_MONTHS, BASE_INTERVAL_MONTHS + sum));
  const anchor = input.lastCheckedOn ?? input.recordedOn;
  const byInterval = addMonths(anchor, intervalMonths);
  let dueOn = byInterval;
  for (const f of factors) if (f.dueBy) dueOn = minDay(dueOn, f.dueBy);

  // Largest first: a months factor by its size; a fixed date by the months it brings the date forward (none when it is later).
  const weight = (f: RiskFactor) => (f.dueBy ? Math.max(0, daysBetween(f.dueBy, byInterval) / 30.44) : Math.abs(f.months ?? 0));
  const ordered = factors
    .map((f, i) => ({ f, i, w: weight(f) }))
    .sort((a, b) => b.w - a.w || a.i - b.i)
    .map((x) => x.f);

  let risk: RiskBand = 'low';
  for (const { band, maxMonths } of [...BAND_LIMITS].reverse()) if (intervalMonths <= maxMonths) risk = band;
  if (input.grade === 'unacceptable') risk = 'urgent';

  return { dueOn, intervalMonths, risk, factors: ordered, explanation: explain(dueOn, ordered) };
}

/** The one line: "due 2027-03: iron-blue print in a buffered enclosure (…) (−9 months), loan to … on 2027-04". */
export function explain(dueOn: string, factors: readonly RiskFactor[]): string {
  const words = factors.map((f) => (f.months === null ? f.text : `${f.text} (${signed(f.months)} months)`));
  return `due ${dueOn.slice(0, 7)}: ${words.length ? words.join(', ') : `no risk factors, the routine ${BASE_INTERVAL_MONTHS}-month interval`}`;
}
