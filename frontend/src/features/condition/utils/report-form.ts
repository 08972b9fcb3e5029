import {
  CONDITION_CONTEXT_LABELS,
  GRADE_LABELS,
  reportInputSchema,
  type ConditionReport,
  type ConditionTerm,
  type Grade,
  type Region,
  type ReportInput,
} from '@toneledger/common/schemas/condition';
import type { ReportUpdate } from '@/features/condition/api/save-report';
import { formatDay } from '@/features/condition/utils/format';
import { issuesToErrors, type Checked, type FieldErrors } from '@/lib/form-errors';

export { serverIssuesToErrors } from '@/lib/form-errors';
export type { Checked, FieldErrors };

/** One observation as the form holds it; `key` only keeps React rows stable while reordering. */
export interface ObservationDraft {
  key: string;
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
  observations: ObservationDraft[];
}

export const REPORT_FIELDS = ['examinedOn', 'context', 'grade', 'summary', 'recommendations', 'nextCheckOn', 'observations'] as const;
export type ReportField = (typeof REPORT_FIELDS)[number];

export const FIELD_LABELS: Record<ReportField, string> = {
  examinedOn: 'Examined on',
  context: 'Context',
  grade: 'Overall grade',
  summary: 'Summary',
  recommendations: 'Recommendations',
  nextCheckOn: 'Next check',
  observations: 'Observations',
};

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

let counter = 0;
const nextKey = () => `obs-${(counter += 1)}`;

export function newObservation(): ObservationDraft {
  return { key: nextKey(), termCode: '', side: 'recto', area: 'image', extent: 'localised', extentPercent: '', severity: 'slight', notes: '', region: null };
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
        key: nextKey(),
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

function rawObservation(o: ObservationDraft) {
  return {
    termCode: o.termCode,
    side: o.side,
    area: o.area,
    extent: o.extent,
    extentPercent: o.extent === 'percentage' ? o.extentPercent.trim() : null,
    severity: o.severity,
    notes: o.notes,
    region: o.region,
  };
}

function raw(values: ReportFormValues) {
  return {
    examinedOn: values.examinedOn,
    context: values.context,
    grade: values.grade === '' ? null : values.grade,
    summary: values.summary,
    recommendations: values.recommendations,
    nextCheckOn: values.nextCheckOn === '' ? null : values.nextCheckOn,
    observations: values.observations.map(rawObservation),
  };
}

/** The field a value of the form compares by (observations without their row keys). */
function comparable(values: ReportFormValues, field: ReportField): string {
  if (field === 'observations') return JSON.stringify(values.observations.map(rawObservation));
  return values[field];
}

export function changedFields(base: ReportFormValues, values: ReportFormValues): ReportField[] {
  return REPORT_FIELDS.filter((field) => comparable(base, field) !== comparable(values, field));
}

/** The whole form checked with the schema the server uses. */
export function checkReport(values: ReportFormValues): Checked<ReportInput> {
  const result = reportInputSchema.safeParse(raw(values));
  return result.success ? { ok: true, data: result.data } : { ok: false, errors: issuesToErrors(result.error.issues) };
}

/** The form checked whole; the update carries only the fields changed since `base`, on its version. */
export function checkUpdate(base: ReportFormValues, values: ReportFormValues, version: number): Checked<ReportUpdate> {
  const checked = checkReport(values);
  if (!checked.ok) return checked;
  const update: Record<string, unknown> = { version };
  const parsed = checked.data as Record<string, unknown>;
  for (const field of changedFields(base, values)) update[field] = parsed[field] ?? null;
  return { ok: true, data: update as ReportUpdate };
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

export interface StaleChange {
  field: ReportField;
  label: string;
  opened: string;
  now: string;
  alsoChangedByYou: boolean;
}

/** What changed between the version the form opened and the version saved since. */
export function staleChanges(opened: ConditionReport, current: ConditionReport, mine: ReportFormValues, terms: ConditionTerm[] = []): StaleChange[] {
  const before = reportToValues(opened);
  const now = reportToValues(current);
  return REPORT_FIELDS.filter((field) => comparable(before, field) !== comparable(now, field)).map((field) => ({
    field,
    label: FIELD_LABELS[field],
    opened: describeField(before, field, terms),
    now: describeField(now, field, terms),
    alsoChangedByYou: comparable(mine, field) !== comparable(before, field),
  }));
}

/** The person's edits on top of the current version: fields they changed keep their values. */
export function rebaseValues(opened: ConditionReport, current: ConditionReport, mine: ReportFormValues): ReportFormValues {
  const before = reportToValues(opened);
  const now = reportToValues(current);
  const next: ReportFormValues = { ...mine };
  for (const field of REPORT_FIELDS) {
    if (comparable(mine, field) === comparable(before, field)) (next as unknown as Record<string, unknown>)[field] = now[field];
  }
  return next;
}
