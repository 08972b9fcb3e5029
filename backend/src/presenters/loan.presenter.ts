import type { LoanConditions } from '@toneledger/common/schemas/loans';
import type { Loan as LoanDto, LoanDetail } from '@toneledger/common/schemas/loans';
import type { Loan, LoanStatusChange } from '../models';

const iso = (d: Date) => d.toISOString();

/** The conditions the lender asked for, every key present. */
export function presentConditions(l: Loan): LoanDto['conditions'] {
  return {
    maxLux: l.maxLux, maxAnnualLuxHours: l.maxAnnualLuxHours, temperatureMinC: l.temperatureMinC, temperatureMaxC: l.temperatureMaxC,
    rhMinPercent: l.rhMinPercent, rhMaxPercent: l.rhMaxPercent, noAlkalineBufferedMounts: l.noAlkalineBufferedMounts, other: l.otherConditions,
  };
}

/** The columns of the conditions given in an input (keys left out stay as they are). */
export function conditionColumns(c: LoanConditions | undefined): Partial<Loan> {
  if (!c) return {};
  const out: Record<string, unknown> = {};
  const map = {
    maxLux: 'maxLux', maxAnnualLuxHours: 'maxAnnualLuxHours', temperatureMinC: 'temperatureMinC', temperatureMaxC: 'temperatureMaxC',
    rhMinPercent: 'rhMinPercent', rhMaxPercent: 'rhMaxPercent', noAlkalineBufferedMounts: 'noAlkalineBufferedMounts', other: 'otherConditions',
  } as const;
  for (const [key, column] of Object.entries(map)) {
    const v = c[key as keyof LoanConditions];
    if (v !== undefined) out[column] = v;
  }
  return out as Partial<Loan>;
}

export function presentLoan(l: Loan, objectCount: number, exhibition: { id: string; title: string } | null): LoanDto {
  return {
    id: l.id, direction: l.direction, reference: l.reference, otherInstitution: l.otherInstitution, contactName: l.contactName,
    contactEmail: l.contactEmail, purpose: l.purpose as LoanDto['purpose'], exhibition, venue: l.venue,
    dispatchOn: l.dispatchOn, opensOn: l.opensOn, closesOn: l.closesOn, returnOn: l.returnOn, courier: l.courier,
    conditions: presentConditions(l), creditLine: l.creditLine, notes: l.notes, status: l.status as LoanDto['status'], objectCount,
    version: l.version, createdAt: iso(l.createdAt), updatedAt: iso(l.updatedAt),
  };
}

export function presentStatusChange(c: LoanStatusChange): LoanDetail['statusHistory'][number] {
  return {
    from: c.fromStatus as LoanDto['status'] | null, to: c.toStatus as LoanDto['status'], on: c.onDate, note: c.note,
    by: c.byId ? { id: c.byId, name: c.byName ?? '' } : null, at: iso(c.at),
  };
}
