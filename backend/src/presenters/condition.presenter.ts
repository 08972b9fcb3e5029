import type {
  ConditionReport as ReportDto, ConditionTerm as TermDto, Observation as ObservationDto,
} from '@toneledger/common/schemas/condition';
import type { ReportLoan } from '@toneledger/common/schemas/condition';
import type { Addendum, ConditionReport, ConditionTerm, Loan, Observation, Print } from '../models';
import { presentConditions } from './loan.presenter';

const iso = (d: Date) => d.toISOString();

export function presentTerm(t: ConditionTerm): TermDto {
  return { code: t.code, label: t.label, description: t.description, active: t.active, builtIn: t.builtIn };
}

export type LoadedObservation = Observation & { term?: ConditionTerm | null };
export type LoadedReport = ConditionReport & {
  print?: Print | null;
  observations?: LoadedObservation[];
  addenda?: Addendum[];
  loan?: Loan | null;
};

/**
 * The loan a report was made for, as its printed form fills it in: for a loan out the institution
 * (`institutionName`, from the catalogue settings) lends and the other institution borrows; for a
 * loan in the reverse.
 */
export function presentReportLoan(loan: Loan, institutionName: string): ReportLoan {
  const out = loan.direction === 'out';
  return {
    id: loan.id, reference: loan.reference, direction: loan.direction, otherInstitution: loan.otherInstitution, venue: loan.venue,
    lender: out ? institutionName : loan.otherInstitution, borrower: out ? loan.otherInstitution : institutionName,
    dispatchOn: loan.dispatchOn, opensOn: loan.opensOn, closesOn: loan.closesOn, returnOn: loan.returnOn, conditions: presentConditions(loan),
  };
}

export function presentObservation(o: LoadedObservation): ObservationDto {
  return {
    id: o.id, position: o.position, termCode: o.termCode, termLabel: o.term?.label ?? o.termCode,
    side: o.side as ObservationDto['side'], area: o.area as ObservationDto['area'], extent: o.extent as ObservationDto['extent'],
    extentPercent: o.extentPercent, severity: o.severity as ObservationDto['severity'], notes: o.notes,
    region: o.region && o.regionImageId ? { imageId: o.regionImageId, shape: o.region.shape, points: o.region.points } : null,
  };
}

/** The whole report: the print it is about, its observations in order, its addenda oldest first, the loan it was made for. */
export function presentReport(r: LoadedReport, institutionName: string): ReportDto {
  if (!r.print) throw new Error('presentReport needs the print loaded');
  const observations = [...(r.observations ?? [])].sort((a, b) => a.position - b.position);
  const addenda = [...(r.addenda ?? [])].sort((a, b) => a.writtenAt.getTime() - b.writtenAt.getTime() || a.id.localeCompare(b.id));
  return {
    id: r.id, printId: r.printId, accessionNumber: r.print.accessionNumber, printTitle: r.print.title,
    examinedOn: r.examinedOn, examinerId: r.examinerId, examinerName: r.examinerName,
    context: r.context as ReportDto['context'], grade: r.grade as ReportDto['grade'],
    summary: r.summary, recommendations: r.recommendations, nextCheckOn: r.nextCheckOn,
    status: r.status, signedAt: r.signedAt ? iso(r.signedAt) : null,
    observations: observations.map(presentObservation),
    addenda: addenda.map((a) => ({ id: a.id, writtenAt: iso(a.writtenAt), authorName: a.authorName, text: a.text })),
    loan: r.loan ? presentReportLoan(r.loan, institutionName) : null,
    version: r.version, createdAt: iso(r.createdAt), updatedAt: iso(r.updatedAt),
  };
}
