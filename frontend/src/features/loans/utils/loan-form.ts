import type { LoanDetail, LoanStatus } from '@toneledger/common/schemas/loans';
import { fieldList } from '@/lib/forms/stale-edit';
import { typedNumber } from '@/lib/forms/typed-number';

/** The conditions a lender asks for, as the form's controls hold them (text, yes/no). */
export interface ConditionsValues {
  maxLux: string;
  maxAnnualLuxHours: string;
  temperatureMinC: string;
  temperatureMaxC: string;
  rhMinPercent: string;
  rhMaxPercent: string;
  noAlkalineBufferedMounts: boolean;
  other: string;
}

export interface LoanFormValues {
  direction: string;
  reference: string;
  otherInstitution: string;
  contactName: string;
  contactEmail: string;
  purpose: string;
  exhibitionId: string;
  venue: string;
  proposedOn: string;
  dispatchOn: string;
  opensOn: string;
  closesOn: string;
  returnOn: string;
  courier: string;
  conditions: ConditionsValues;
  creditLine: string;
  notes: string;
}

export const LOAN_FIELD_LABELS: Record<keyof LoanFormValues, string> = {
  direction: 'Direction',
  reference: 'Agreement reference',
  otherInstitution: 'Other institution',
  contactName: 'Contact',
  contactEmail: 'Contact e-mail',
  purpose: 'Purpose',
  exhibitionId: 'Exhibition',
  venue: 'Venue',
  proposedOn: 'Proposed on',
  dispatchOn: 'Dispatch',
  opensOn: 'Opening',
  closesOn: 'Closing',
  returnOn: 'Return',
  courier: 'Courier',
  conditions: 'Conditions asked for',
  creditLine: 'Credit line',
  notes: 'Notes',
};

export const CONDITION_LABELS: Record<keyof ConditionsValues, string> = {
  maxLux: 'Maximum illuminance (lux)',
  maxAnnualLuxHours: 'Maximum lux-hours a year',
  temperatureMinC: 'Lowest temperature (°C)',
  temperatureMaxC: 'Highest temperature (°C)',
  rhMinPercent: 'Lowest RH (%)',
  rhMaxPercent: 'Highest RH (%)',
  noAlkalineBufferedMounts: 'No alkaline-buffered mounts or enclosures',
  other: 'Other conditions',
};

/** The edited fields for the stale-edit review (the direction is fixed once the loan exists). */
export const LOAN_EDIT_FIELDS = fieldList(LOAN_FIELD_LABELS).filter((f) => f.key !== 'direction' && f.key !== 'proposedOn');

const text = (v: string | null | undefined) => v ?? '';
const figure = (v: number | null | undefined) => (v == null ? '' : String(v));

export function emptyLoanValues(direction: 'out' | 'in' = 'out'): LoanFormValues {
  return {
    direction, reference: '', otherInstitution: '', contactName: '', contactEmail: '', purpose: 'exhibition', exhibitionId: '', venue: '',
    proposedOn: '', dispatchOn: '', opensOn: '', closesOn: '', returnOn: '', courier: '', creditLine: '', notes: '',
    conditions: {
      maxLux: '', maxAnnualLuxHours: '', temperatureMinC: '', temperatureMaxC: '', rhMinPercent: '', rhMaxPercent: '',
      noAlkalineBufferedMounts: false, other: '',
    },
  };
}

export function loanToValues(loan: LoanDetail): LoanFormValues {
  const c = loan.conditions;
  return {
    direction: loan.direction, reference: loan.reference, otherInstitution: loan.otherInstitution, contactName: text(loan.contactName),
    contactEmail: text(loan.contactEmail), purpose: loan.purpose, exhibitionId: loan.exhibition?.id ?? '', venue: text(loan.venue),
    proposedOn: '', dispatchOn: text(loan.dispatchOn), opensOn: text(loan.opensOn), closesOn: text(loan.closesOn), returnOn: text(loan.returnOn),
    courier: text(loan.courier), creditLine: text(loan.creditLine), notes: text(loan.notes),
    conditions: {
      maxLux: figure(c.maxLux), maxAnnualLuxHours: figure(c.maxAnnualLuxHours), temperatureMinC: figure(c.temperatureMinC),
      temperatureMaxC: figure(c.temperatureMaxC), rhMinPercent: figure(c.rhMinPercent), rhMaxPercent: figure(c.rhMaxPercent),
      noAlkalineBufferedMounts: c.noAlkalineBufferedMounts, other: text(c.other),
    },
  };
}

/** The form's values as the request body: the conditions' figures as numbers (the rest the schema reads). */
export function loanValuesToBody(values: LoanFormValues): Record<string, unknown> {
  const c = values.conditions;
  return {
    ...values,
    conditions: {
      maxLux: typedNumber(c.maxLux), maxAnnualLuxHours: typedNumber(c.maxAnnualLuxHours), temperatureMinC: typedNumber(c.temperatureMinC),
      temperatureMaxC: typedNumber(c.temperatureMaxC), rhMinPercent: typedNumber(c.rhMinPercent), rhMaxPercent: typedNumber(c.rhMaxPercent),
      noAlkalineBufferedMounts: c.noAlkalineBufferedMounts, other: c.other,
    },
  };
}

/** The body of an edit: the direction is not edited. */
export function loanEditValuesToBody(values: LoanFormValues): Record<string, unknown> {
  const { direction: _direction, proposedOn: _proposedOn, ...rest } = loanValuesToBody(values);
  return rest;
}

/** The report context a conservator writes for a loan's print, at each end (outgoing: as it leaves us or arrives from the lender). */
export function reportContextFor(direction: 'out' | 'in', end: 'outgoing' | 'returning'): 'outgoing_loan' | 'returning_loan' | 'incoming' {
  if (direction === 'in') return end === 'outgoing' ? 'incoming' : 'outgoing_loan';
  return end === 'outgoing' ? 'outgoing_loan' : 'returning_loan';
}

/** The verb on a status button: what the registrar does to move the loan there. */
export const STATUS_ACTIONS: Record<LoanStatus, string> = {
  proposed: 'Propose',
  approved: 'Approve',
  agreed: 'Mark agreed',
  in_transit: 'Dispatch (in transit)',
  on_loan: 'Mark on loan',
  returned: 'Mark returned',
  declined: 'Decline',
  cancelled: 'Cancel the loan',
};
