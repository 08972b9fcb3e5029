import {
  CONDITION_CONTEXT_LABELS,
  GRADE_LABELS,
  type ConditionReport,
  type ConditionTerm,
  type Grade,
  type Region,
} from '@toneledger/common/schemas/condition';
import { fieldList } from '@/lib/forms/stale-edit';
import { formatDay } from '@/features/condition/utils/format';

/** One observation as the form holds it. */
export interface ObservationValues {
  termCode: string;
  side: string;
  area: string;
  extent: string;
  extentPercent: string;
  severity: string;
  notes: string;
  region: Region | null;
}

export interface ReportFormValues {
  examinedOn: string;
  context: string;
  grade: '' | Grade;
  summary: string;
  recommendations: string;
  nextCheckOn: string;
  observations: ObservationValues[];
}

export type ReportField = keyof ReportFormValues;

export const FIELD_LABELS: Record<ReportField, string> = {
  examinedOn: 'Examined on',
  context: 'Context',
  nextCheckOn: 'Next check',
  grade: 'Overall grade',
  observations: 'Observations',
  summary: 'Summary',
  recommendations: 'Recommendations',
};

/** The report's fields in form order, with their labels (for the stale-edit review). */
export const REPORT_FORM_FIELDS = fieldList(FIELD_LABELS);

export const OBSERVATION_LABELS: Record<string, string> = {
  termCode: 'Observed',
  side: 'Side',
  area: 'Area',
  extent: 'Extent',
  extentPercent: 'Percentage affected',
  severity: 'Severity',
  notes: 'Notes',
  region: 'Region',
  'region.imageId': 'Region',
  'region.points': 'Region',
};

export function newObservation(): ObservationValues {
  return { termCode: '', side: 'recto', area: 'image', extent: 'localised', extentPercent: '', severity: 'slight', notes: '', region: null };
}

export function emptyReportValues(today: string): ReportFormValues {
  return { examinedOn: today, context: 'routine', grade: '', summary: '', recommendations: '', nextCheckOn: '', observations: [] };
}

export function reportToValues(report: ConditionReport): ReportFormValues {
  return {
    examinedOn: report.examinedOn,
    context: report.context,
    grade: report.grade ?? '',
    summary: report.summary ?? '',
    recommendations: report.recommendations ?? '',
    nextCheckOn: report.nextCheckOn ?? '',
    observations: [...report.observations]
      .sort((a, b) => a.position - b.position)
      .map((o) => ({
        termCode: o.termCode,
        side: o.side,
        area: o.area,
        extent: o.extent,
        extentPercent: o.extentPercent === null ? '' : String(o.extentPercent),
        severity: o.severity,
        notes: o.notes ?? '',
        region: o.region,
      })),
  };
}

/** An observation as sent: a percentage only with the percentage extent. */
function observationBody(o: ObservationValues) {
  return { ...o, extentPercent: o.extent === 'percentage' ? o.extentPercent.trim() : null };
}

/**
 * The form's values as the request body: no grade and no next check are null; text and figures go
 * as typed, for the schema to trim and read.
 */
export function reportValuesToBody(values: ReportFormValues) {
  return {
    ...values,
    grade: values.grade === '' ? null : values.grade,
    nextCheckOn: values.nextCheckOn === '' ? null : values.nextCheckOn,
    observations: values.observations.map(observationBody),
  };
}

/** A readable label for an error's path: "Observation 3 · Observed". */
export function errorLabel(path: string): string | null {
  if (path in FIELD_LABELS) return FIELD_LABELS[path as ReportField];
  const match = /^observations\.(\d+)(?:\.(.+))?$/.exec(path);
  if (match) {
    const what = match[2] ? (OBSERVATION_LABELS[match[2]] ?? match[2]) : null;
    return `Observation ${Number(match[1]) + 1}${what ? ` · ${what}` : ''}`;
  }
  return null;
}

/** How a field of the form reads to a person. */
export function describeField(values: ReportFormValues, field: ReportField, terms: ConditionTerm[] = []): string {
  switch (field) {
    case 'examinedOn':
    case 'nextCheckOn':
      return values[field] ? formatDay(values[field]) : '';
    case 'context':
      return CONDITION_CONTEXT_LABELS[values.context as keyof typeof CONDITION_CONTEXT_LABELS] ?? values.context;
    case 'grade':
      return values.grade ? GRADE_LABELS[values.grade] : '';
    case 'observations': {
      const n = values.observations.length;
      if (n === 0) return 'none';
      const names = values.observations.map((o) => terms.find((t) => t.code === o.termCode)?.label ?? (o.termCode || 'not chosen'));
      return `${n} ${n === 1 ? 'observation' : 'observations'}: ${names.join(', ')}`;
    }
    default:
      return values[field];
  }
}
