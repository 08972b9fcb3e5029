import { z } from 'zod';
import { pageQuerySchema } from './envelope';
import { id, isoDate, isoDateTime } from './primitives';
import { GRADES } from './condition';

/**
 * The re-inspection schedule: each print's next-inspection date from the risk model
 * (`domain/inspection-risk.ts`, written down in DEVELOPERS.md), the factors behind it in plain
 * words, a conservator's override with a reason; the conservators' work list; inspection rounds;
 * and the reminders (weekly digest e-mail, calendar feed).
 */

export const RISK_BANDS = ['low', 'moderate', 'high', 'urgent'] as const;
export type RiskBand = (typeof RISK_BANDS)[number];
export const RISK_BAND_LABELS: Record<RiskBand, string> = { low: 'Low', moderate: 'Moderate', high: 'High', urgent: 'Urgent' };

/** What a factor is about: the reason filter of the work list uses these codes. */
export const RISK_FACTOR_CODES = [
  'condition', 'condition_trend', 'vulnerable_process', 'enclosure', 'light', 'climate', 'fading', 'recommended',
  'never_checked', 'loan', 'display',
] as const;
export type RiskFactorCode = (typeof RISK_FACTOR_CODES)[number];
export const RISK_FACTOR_LABELS: Record<RiskFactorCode, string> = {
  condition: 'Condition grade', condition_trend: 'Condition getting worse', vulnerable_process: 'Vulnerable process or toner',
  enclosure: 'Enclosure warning', light: 'Light dose', climate: 'Storage climate', fading: 'Measured fading',
  recommended: 'Date asked for in a report', never_checked: 'Never checked', loan: 'Coming loan', display: 'Coming display',
};

/** One reason behind a print's date, in plain words, with how much it moved the date. */
export const riskFactorSchema = z.object({
  code: z.enum(RISK_FACTOR_CODES),
  /** e.g. "iron-blue print in a buffered folder". */
  text: z.string(),
  /** Months taken off the interval (negative) or added (positive); null for a fixed date (a loan's check). */
  months: z.number().nullable(),
  /** A date this factor fixes the check by (before a loan's dispatch, before a display, a report's asked-for date). */
  dueBy: isoDate.nullable(),
});
export type RiskFactor = z.infer<typeof riskFactorSchema>;

export const printScheduleSchema = z.object({
  printId: id,
  /** The date in force: the override when there is one, else the computed date. */
  dueOn: isoDate,
  computedDueOn: isoDate,
  intervalMonths: z.number(),
  risk: z.enum(RISK_BANDS),
  /** Largest effect first. */
  factors: z.array(riskFactorSchema),
  /** One line: "due 2027-03: iron-blue print in a buffered folder (−6 months), fading 0.6 ΔE00/yr …". */
  explanation: z.string(),
  lastCheckedOn: isoDate.nullable(),
  override: z.object({ dueOn: isoDate, reason: z.string(), by: z.object({ id, name: z.string() }), at: isoDateTime }).nullable(),
  computedAt: isoDateTime,
  /** Open rounds this print is in. */
  rounds: z.array(z.object({ id, title: z.string(), plannedOn: isoDate })),
  version: z.number().int(),
});
export type PrintSchedule = z.infer<typeof printScheduleSchema>;

/** A conservator's own date for a print, with a reason; `dueOn: null` returns it to the computed date. */
export const scheduleOverrideInputSchema = z
  .object({
    dueOn: isoDate.nullable(),
    reason: z.preprocess((v) => (typeof v === 'string' && v.trim() === '' ? null : v), z.string().trim().max(2000).nullable()).optional(),
    version: z.number().int().min(1),
  })
  .refine((v) => v.dueOn === null || (v.reason ?? '').length > 0, { path: ['reason'], message: 'Say why this print needs a different date' });

export const WORKLIST_WINDOWS = ['overdue', '30', '90', 'all'] as const;

export const worklistQuerySchema = pageQuerySchema.extend({
  /** overdue: due before today; 30 / 90: due within that many days (overdue included); all: every print. */
  window: z.enum(WORKLIST_WINDOWS).default('90'),
  /** This place and everything inside it. */
  locationId: id.optional(),
  risk: z.enum(RISK_BANDS).optional(),
  reason: z.enum(RISK_FACTOR_CODES).optional(),
  /** Prints in an open round assigned to this person; 'none' for prints in no open round. */
  assigneeId: z.union([id, z.literal('none')]).optional(),
  sort: z.enum(['dueOn', '-dueOn', 'location', 'risk', 'accessionNumber']).default('dueOn'),
});
export type WorklistQuery = z.infer<typeof worklistQuerySchema>;

export const worklistItemSchema = z.object({
  printId: id,
  accessionNumber: z.string(),
  title: z.string().nullable(),
  dueOn: isoDate,
  overdueDays: z.number().int(),
  risk: z.enum(RISK_BANDS),
  overridden: z.boolean(),
  /** The largest factor's words. */
  mainReason: z.string(),
  reasons: z.array(z.enum(RISK_FACTOR_CODES)),
  locationId: id.nullable(),
  locationLabel: z.string().nullable(),
  lastGrade: z.enum(GRADES).nullable(),
  lastCheckedOn: isoDate.nullable(),
  round: z.object({ id, title: z.string(), plannedOn: isoDate, assigneeName: z.string() }).nullable(),
});
export type WorklistItem = z.infer<typeof worklistItemSchema>;

/** Counts for the work list's header. */
export const worklistCountsSchema = z.object({ overdue: z.number().int(), within30: z.number().int(), within90: z.number().int(), total: z.number().int() });

export const ROUND_STATUSES = ['planned', 'done', 'cancelled'] as const;

export const roundInputSchema = z.object({
  title: z.string().trim().min(1, 'Name the round').max(200),
  plannedOn: isoDate,
  assigneeId: id,
  notes: z.preprocess((v) => (v === '' ? null : v), z.string().trim().max(4000).nullable()).optional(),
  printIds: z.array(id).min(1, 'Choose at least one print').max(2000),
});
export const roundUpdateSchema = z.object({
  title: z.string().trim().min(1, 'Name the round').max(200).optional(),
  plannedOn: isoDate.optional(),
  assigneeId: id.optional(),
  notes: z.preprocess((v) => (v === '' ? null : v), z.string().trim().max(4000).nullable()).optional(),
  status: z.enum(ROUND_STATUSES).optional(),
  /** Prints to add to or take out of the round. */
  addPrintIds: z.array(id).max(2000).optional(),
  removePrintIds: z.array(id).max(2000).optional(),
  version: z.number().int().min(1),
});

export const roundItemSchema = z.object({
  printId: id,
  accessionNumber: z.string(),
  title: z.string().nullable(),
  /** Shelf order: the location's full path. */
  locationLabel: z.string().nullable(),
  lastGrade: z.enum(GRADES).nullable(),
  lastCheckedOn: isoDate.nullable(),
  dueOn: isoDate.nullable(),
  /** What to look at, from the schedule's factors and the last report's observations. */
  lookAt: z.array(z.string()),
  /** Checked off: the condition report signed for it. */
  checkedOn: isoDate.nullable(),
  conditionReportId: id.nullable(),
});

export const roundSchema = z.object({
  id,
  title: z.string(),
  plannedOn: isoDate,
  status: z.enum(ROUND_STATUSES),
  assignee: z.object({ id, name: z.string(), email: z.string().nullable() }),
  notes: z.string().nullable(),
  printCount: z.number().int(),
  checkedCount: z.number().int(),
  /** The common place of its prints (the deepest location holding them all), for "one trip". */
  locationLabel: z.string().nullable(),
  createdBy: z.object({ id, name: z.string() }),
  createdAt: isoDateTime,
  version: z.number().int(),
});
export type Round = z.infer<typeof roundSchema>;
export const roundDetailSchema = roundSchema.extend({ items: z.array(roundItemSchema) });
export type RoundDetail = z.infer<typeof roundDetailSchema>;

export const roundListQuerySchema = pageQuerySchema.extend({
  status: z.enum(ROUND_STATUSES).optional(),
  assigneeId: id.optional(),
});

/** Progress of a full recompute of every print's date (null: never run). */
export const scheduleRecomputeSchema = z.object({
  status: z.enum(['running', 'done', 'failed']),
  done: z.number().int(),
  total: z.number().int(),
  startedAt: isoDateTime,
  finishedAt: isoDateTime.nullable(),
  /** Prints per second so far. */
  rate: z.number().nullable(),
});
export type ScheduleRecompute = z.infer<typeof scheduleRecomputeSchema>;

export const WEEKDAYS = [1, 2, 3, 4, 5, 6, 7] as const; // ISO: 1 = Monday

/** A person's reminders: the weekly digest and the calendar feed. */
export const remindersSchema = z.object({
  digestEnabled: z.boolean(),
  /** ISO weekday the digest is sent on, 1 = Monday. */
  digestWeekday: z.number().int().min(1).max(7),
  /** Whether a calendar feed address exists (the address itself is shown only when made). */
  calendarFeed: z.object({ createdAt: isoDateTime }).nullable(),
  lastDigest: z.object({ week: z.string(), status: z.string(), sentAt: isoDateTime.nullable() }).nullable(),
});
export type Reminders = z.infer<typeof remindersSchema>;
export const remindersInputSchema = z.object({ digestEnabled: z.boolean(), digestWeekday: z.number().int().min(1).max(7) });
/** A new feed address, shown once: the old one stops working. */
export const calendarFeedSchema = z.object({ url: z.string(), createdAt: isoDateTime });
export type CalendarFeed = z.infer<typeof calendarFeedSchema>;

export const DIGEST_STATUSES = ['sending', 'sent', 'failed', 'empty'] as const;
/** One weekly digest to one person (administrators see every send and its failures). */
export const digestSendSchema = z.object({
  id,
  user: z.object({ id, name: z.string(), email: z.string().nullable() }),
  /** ISO week, e.g. 2026-W49. */
  week: z.string(),
  status: z.enum(DIGEST_STATUSES),
  attempts: z.number().int(),
  lastError: z.string().nullable(),
  overdue: z.number().int(),
  due: z.number().int(),
  sentAt: isoDateTime.nullable(),
  createdAt: isoDateTime,
});
export type DigestSend = z.infer<typeof digestSendSchema>;
export const digestListQuerySchema = pageQuerySchema.extend({ status: z.enum(DIGEST_STATUSES).optional() });
