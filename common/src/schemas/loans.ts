import { z } from 'zod';
import { CURRENCY_CODES } from '../domain/currencies';
import { printInputSchema } from './catalogue';
import { pageQuerySchema } from './envelope';
import { id, isoDate } from './primitives';

/**
 * Loans out and loans in. A loan moves through its states in order (LOAN_STEPS); declined and
 * cancelled end it early. The server holds the rules: no dispatch without a signed condition report
 * made for this loan, no return without the one at the other end, no print in two loans at once.
 */

const text = (max: number) => z.string().trim().max(max, `At most ${max} characters`);
const optionalText = (max: number) =>
  z.preprocess((v) => (typeof v === 'string' && v.trim() === '' ? null : v), text(max).nullable()).optional();
const optionalDate = z.preprocess((v) => (v === '' ? null : v), isoDate.nullable()).optional();
const optionalNumber = (min: number, max: number) => z.number().min(min).max(max).nullable().optional();
const version = z.number({ message: 'The record version is required' }).int().min(1);
const userRef = z.object({ id, name: z.string() });

export const LOAN_DIRECTIONS = ['out', 'in'] as const;
export const LOAN_DIRECTION_LABELS: Record<(typeof LOAN_DIRECTIONS)[number], string> = { out: 'Loan out', in: 'Loan in' };

export const LOAN_PURPOSES = ['exhibition', 'research', 'conservation', 'photography'] as const;
export const LOAN_PURPOSE_LABELS: Record<(typeof LOAN_PURPOSES)[number], string> = {
  exhibition: 'Exhibition', research: 'Research', conservation: 'Conservation', photography: 'Photography',
};

/** The states of a loan, in the order it moves through them. */
export const LOAN_STEPS = ['proposed', 'approved', 'agreed', 'in_transit', 'on_loan', 'returned'] as const;
export const LOAN_ENDINGS = ['declined', 'cancelled'] as const;
export const LOAN_STATUSES = [...LOAN_STEPS, ...LOAN_ENDINGS] as const;
export type LoanStatus = (typeof LOAN_STATUSES)[number];
export const LOAN_STATUS_LABELS: Record<LoanStatus, string> = {
  proposed: 'Proposed', approved: 'Approved', agreed: 'Agreed', in_transit: 'In transit', on_loan: 'On loan', returned: 'Returned',
  declined: 'Declined', cancelled: 'Cancelled',
};
/** Where each state may go next: the next step, or an early end while nothing has left. */
export const LOAN_NEXT: Record<LoanStatus, readonly LoanStatus[]> = {
  proposed: ['approved', 'declined', 'cancelled'],
  approved: ['agreed', 'declined', 'cancelled'],
  agreed: ['in_transit', 'cancelled'],
  in_transit: ['on_loan'],
  on_loan: ['returned'],
  returned: [],
  declined: [],
  cancelled: [],
};

/** The conditions a lender asks for. */
export const loanConditionsSchema = z
  .object({
    maxLux: optionalNumber(0, 100000),
    maxAnnualLuxHours: optionalNumber(0, 100_000_000),
    temperatureMinC: optionalNumber(-30, 60),
    temperatureMaxC: optionalNumber(-30, 60),
    rhMinPercent: optionalNumber(0, 100),
    rhMaxPercent: optionalNumber(0, 100),
    /** No alkaline-buffered mounts or enclosures (asked for Prussian-blue images). */
    noAlkalineBufferedMounts: z.boolean().optional(),
    other: optionalText(5000),
  })
  .refine((c) => c.temperatureMinC == null || c.temperatureMaxC == null || c.temperatureMaxC >= c.temperatureMinC, {
    path: ['temperatureMaxC'], message: 'The highest temperature is at least the lowest',
  })
  .refine((c) => c.rhMinPercent == null || c.rhMaxPercent == null || c.rhMaxPercent >= c.rhMinPercent, {
    path: ['rhMaxPercent'], message: 'The highest RH is at least the lowest',
  });
export type LoanConditions = z.infer<typeof loanConditionsSchema>;

const loanFieldsShape = {
  direction: z.enum(LOAN_DIRECTIONS),
  /** The agreement's reference, unique. */
  reference: text(100).min(1, 'Enter the loan agreement reference'),
  /** The borrower (loan out) or the lender (loan in). */
  otherInstitution: text(300).min(1, 'Name the other institution'),
  contactName: optionalText(300),
  contactEmail: z.preprocess((v) => (v === '' ? null : v), z.string().trim().email('Enter an e-mail address').max(300).nullable()).optional(),
  purpose: z.enum(LOAN_PURPOSES),
  /** The exhibition the loan is for (purpose exhibition). */
  exhibitionId: z.preprocess((v) => (v === '' ? null : v), id.nullable()).optional(),
  venue: optionalText(300),
  dispatchOn: optionalDate,
  opensOn: optionalDate,
  closesOn: optionalDate,
  returnOn: optionalDate,
  courier: optionalText(300),
  conditions: loanConditionsSchema.optional(),
  creditLine: optionalText(1000),
  notes: optionalText(5000),
};

const DATE_ORDER = ['dispatchOn', 'opensOn', 'closesOn', 'returnOn'] as const;
const DATE_LABELS = { dispatchOn: 'dispatch', opensOn: 'opening', closesOn: 'closing', returnOn: 'return' } as const;
/** Dispatch ≤ opening ≤ closing ≤ return, for the dates that are given. */
export function loanDateIssues(v: Partial<Record<(typeof DATE_ORDER)[number], string | null | undefined>>): { path: string; message: string }[] {
  const issues: { path: string; message: string }[] = [];
  for (let i = 1; i < DATE_ORDER.length; i++) {
    const later = DATE_ORDER[i];
    const value = v[later];
    if (!value) continue;
    for (let j = i - 1; j >= 0; j--) {
      const earlier = v[DATE_ORDER[j]];
      if (earlier) {
        if (value < earlier) issues.push({ path: later, message: `The ${DATE_LABELS[later]} date is on or after the ${DATE_LABELS[DATE_ORDER[j]]} date` });
        break;
      }
    }
  }
  return issues;
}

const withDateOrder = <T extends z.ZodType<Partial<Record<(typeof DATE_ORDER)[number], string | null | undefined>>>>(schema: T) =>
  schema.superRefine((v, ctx) => {
    for (const issue of loanDateIssues(v)) ctx.addIssue({ code: 'custom', path: [issue.path], message: issue.message });
  });

export const loanInputSchema = withDateOrder(
  z.object({
    ...loanFieldsShape,
    /** The day the loan was proposed, for a loan recorded after the fact; today when absent. Not in the future. */
    proposedOn: optionalDate,
  }),
);
export const loanUpdateSchema = withDateOrder(z.object(loanFieldsShape).omit({ direction: true }).partial().extend({ version }));

/** One print on a loan, with its value for insurance or indemnity (registrars and administrators only). */
export const loanObjectInputSchema = z
  .object({
    printId: id,
    insuranceValue: z.number().min(0).max(1e12).nullable().optional(),
    currency: z.preprocess(
      (v) => (typeof v === 'string' ? (v.trim() === '' ? null : v.trim().toUpperCase()) : v),
      z.enum(CURRENCY_CODES, { error: (issue) => `${JSON.stringify(issue.input)} is not an ISO 4217 currency code (such as GBP, EUR or USD)` }).nullable(),
    ).optional(),
  })
  .refine((o) => o.insuranceValue == null || o.currency != null, { path: ['currency'], message: 'Give the currency of the value' });
export const loanObjectsInputSchema = z.object({ objects: z.array(loanObjectInputSchema).min(1).max(500), version });

export const loanObjectSchema = z.object({
  printId: id, accessionNumber: z.string(), printTitle: z.string(),
  /** A print lent to the collection (a loan in), not part of it. */
  borrowed: z.boolean(),
  /** Absent for a role without `valuation.read`. */
  insuranceValue: z.number().nullable().optional(),
  currency: z.string().nullable().optional(),
  /** The signed condition report made for this loan as the print leaves (or arrives, for a loan in). */
  outgoingReport: z.object({ id, examinedOn: isoDate, grade: z.string().nullable() }).nullable(),
  /** The signed condition report made for this loan as the print comes back (or is sent back). */
  returningReport: z.object({ id, examinedOn: isoDate, grade: z.string().nullable() }).nullable(),
  warnings: z.array(z.object({ code: z.string(), message: z.string() })),
});

export const loanStatusChangeSchema = z.object({
  from: z.enum(LOAN_STATUSES).nullable(), to: z.enum(LOAN_STATUSES), on: isoDate, note: z.string().nullable(),
  by: userRef.nullable(), at: z.string().datetime(),
});

/** The conditions as a loan answers them (every key present). */
export const loanConditionsOutputSchema = z.object({
  maxLux: z.number().nullable(), maxAnnualLuxHours: z.number().nullable(), temperatureMinC: z.number().nullable(),
  temperatureMaxC: z.number().nullable(), rhMinPercent: z.number().nullable(), rhMaxPercent: z.number().nullable(),
  noAlkalineBufferedMounts: z.boolean(), other: z.string().nullable(),
});

export const loanSchema = z.object({
  id, direction: z.enum(LOAN_DIRECTIONS), reference: z.string(), otherInstitution: z.string(),
  contactName: z.string().nullable(), contactEmail: z.string().nullable(), purpose: z.enum(LOAN_PURPOSES),
  exhibition: z.object({ id, title: z.string() }).nullable(), venue: z.string().nullable(),
  dispatchOn: isoDate.nullable(), opensOn: isoDate.nullable(), closesOn: isoDate.nullable(), returnOn: isoDate.nullable(),
  courier: z.string().nullable(), conditions: loanConditionsOutputSchema,
  creditLine: z.string().nullable(), notes: z.string().nullable(),
  status: z.enum(LOAN_STATUSES), objectCount: z.number().int(),
  version: z.number().int(), createdAt: z.string().datetime(), updatedAt: z.string().datetime(),
});
export type Loan = z.infer<typeof loanSchema>;
export const loanDetailSchema = loanSchema.extend({
  objects: z.array(loanObjectSchema),
  statusHistory: z.array(loanStatusChangeSchema),
  /** What still stands in the way of the next step, in plain words (e.g. "2 prints have no signed outgoing report"). */
  blockers: z.array(z.object({ to: z.enum(LOAN_STATUSES), message: z.string(), printIds: z.array(id) })),
});
export type LoanDetail = z.infer<typeof loanDetailSchema>;

export const loanListQuerySchema = pageQuerySchema.extend({
  q: z.string().trim().max(200).optional(),
  direction: z.enum(LOAN_DIRECTIONS).optional(),
  status: z.enum(LOAN_STATUSES).optional(),
  /** Loans not yet returned, declined or cancelled. */
  open: z.enum(['true', 'false']).optional(),
});

export const loanStatusInputSchema = z.object({
  to: z.enum(LOAN_STATUSES),
  /** The day the change happened; today when absent. */
  on: isoDate.optional(),
  note: optionalText(2000),
  version,
});

/**
 * A print lent to the collection (loan in): a print record of its own, marked borrowed, which the
 * catalogue list shows only when asked. Its number is the lender's, not checked against the
 * institution's accession pattern; the loan's version guards the object list.
 */
export const borrowedPrintInputSchema = z.object({ print: printInputSchema.omit({ locationId: true }), version });
