import type { Transaction } from 'sequelize';
import { z } from 'zod';
import {
  DEFAULT_GRADE_DEFINITIONS, conditionTermInputSchema, conditionTermUpdateSchema, type GradeDefinitions, type ObservationInput, type ReportInput,
} from '@toneledger/common/schemas/condition';
import type { FieldIssue } from '@toneledger/common/schemas/envelope';
import { db } from '../db';
import { Addendum, ConditionReport, ConditionTerm, Image, Loan, LoanObject, Observation, Print, Setting } from '../models';
import { getCatalogueSettings } from './settings.service';
import { conflict, forbidden, notFound, validationFailed } from '../errors';
import { presentReport, presentTerm, type LoadedReport } from '../presenters/condition.presenter';
import { recordAudit } from './audit.service';
import { checkOffRounds } from './round.service';
import { markScheduleStale } from './schedule-stale';
import { assertPrintEditable } from './print-lock';
import { writeAddendum } from './addenda';
import { changedFields, rethrowUnique, staleEdit } from './versioning';

/** Who is acting: every condition write is attributed to a signed-in person. */
export interface Actor {
  id: string;
  name: string;
}

// ── Settings: the written definition of each overall grade ──

const SETTINGS_KEY = 'condition';

export interface ConditionSettings {
  grades: GradeDefinitions;
}

export async function getConditionSettings(transaction?: Transaction): Promise<ConditionSettings> {
  const row = await Setting.findByPk(SETTINGS_KEY, { transaction });
  const stored = (row?.value as Partial<ConditionSettings> | undefined)?.grades ?? {};
  return { grades: { ...DEFAULT_GRADE_DEFINITIONS, ...stored } };
}

export async function putConditionSettings(next: ConditionSettings, actor: Actor, requestId: string | null): Promise<ConditionSettings> {
  return db().transaction(async (t) => {
    const before = await getConditionSettings(t);
    await Setting.upsert({ key: SETTINGS_KEY, value: next }, { transaction: t });
    await recordAudit({ actor, action: 'settings.updated', entityType: 'settings', entityId: SETTINGS_KEY, before, after: next, requestId }, t);
    return next;
  });
}

// ── The deterioration vocabulary ──

/** Active terms first, each group in vocabulary order; inactive ones only when asked for. */
export async function listTerms(includeInactive: boolean) {
  const rows = await ConditionTerm.findAll({
    where: includeInactive ? {} : { active: true },
    order: [['active', 'DESC'], ['position', 'ASC'], ['label', 'ASC']],
  });
  return rows.map(presentTerm);
}

export async function createTerm(input: z.infer<typeof conditionTermInputSchema>, actor: Actor, requestId: string | null) {
  return db().transaction(async (t) => {
    const last = (await ConditionTerm.max<number, ConditionTerm>('position', { transaction: t })) ?? 0;
    let term: ConditionTerm;
    try {
      term = await ConditionTerm.create(
        { code: input.code, label: input.label, description: input.description ?? null, active: true, builtIn: false, position: last + 1 },
        { transaction: t },
      );
    } catch (err) {
      rethrowUnique(err, 'code', 'The vocabulary already has a term with this code.');
    }
    await recordAudit({ actor, action: 'condition_term.created', entityType: 'condition_term', entityId: term.code, after: presentTerm(term), requestId }, t);
    return presentTerm(term);
  });
}

export async function updateTerm(code: string, update: z.infer<typeof conditionTermUpdateSchema>, actor: Actor, requestId: string | null) {
  return db().transaction(async (t) => {
    const term = await ConditionTerm.findByPk(code, { transaction: t, lock: t.LOCK.UPDATE });
    if (!term) throw notFound('The condition term');
    const before = presentTerm(term);
    const values: Partial<Pick<ConditionTerm, 'label' | 'description' | 'active'>> = {};
    if (update.label !== undefined) values.label = update.label;
    if (update.description !== undefined) values.description = update.description;
    if (update.active !== undefined) values.active = update.active;
    await term.update(values, { transaction: t });
    const after = presentTerm(term);
    if (changedFields(before, after).length) {
      await recordAudit({ actor, action: 'condition_term.updated', entityType: 'condition_term', entityId: code, before, after, requestId }, t);
    }
    return after;
  });
}

// ── Reports ──

const ENTITY = 'condition_report';
const LOCKED = 'Signed reports are locked; add an addendum.';
const NOT_AUTHOR = 'Only the author can change a draft';

const INCLUDE = [
  { model: Print, as: 'print' },
  { model: Observation, as: 'observations', include: [{ model: ConditionTerm, as: 'term' }] },
  { model: Addendum, as: 'addenda' },
  { model: Loan, as: 'loan' },
];

/** The report as the API answers it; a report made for a loan names the institution as lender or borrower. */
async function present(r: LoadedReport) {
  return presentReport(r, r.loan ? (await getCatalogueSettings()).institutionName : '');
}

/** A report made for a loan is about one of the loan's prints. */
async function loanIssues(printId: string, loanId: string | null | undefined, t: Transaction): Promise<FieldIssue[]> {
  if (!loanId) return [];
  if (!(await Loan.findByPk(loanId, { attributes: ['id'], transaction: t }))) return [{ path: 'loanId', message: 'No such loan', code: 'not_found' }];
  if (!(await LoanObject.findOne({ where: { loanId, printId }, transaction: t }))) {
    return [{ path: 'loanId', message: 'This print is not on that loan; add it to the loan first', code: 'not_on_loan' }];
  }
  return [];
}

export async function loadReport(id: string, transaction?: Transaction): Promise<LoadedReport> {
  const r = (await ConditionReport.findByPk(id, { include: INCLUDE, transaction })) as LoadedReport | null;
  if (!r) throw notFound('The condition report');
  return r;
}

export async function getReport(id: string) {
  return present(await loadReport(id));
}

/** Every report on a print, newest examination first; drafts included, marked by their status. */
export async function listReports(printId: string) {
  if ((await Print.count({ where: { id: printId } })) === 0) throw notFound('The print');
  const rows = (await ConditionReport.findAll({
    where: { printId },
    include: INCLUDE,
    order: [['examinedOn', 'DESC'], ['createdAt', 'DESC']],
  })) as LoadedReport[];
  const institutionName = (await getCatalogueSettings()).institutionName;
  return rows.map((r) => presentReport(r, institutionName));
}

/** What the audit trail keeps of a report: everything the examiner wrote, with the print it is about. */
function snapshot(r: LoadedReport) {
  const { version: _v, createdAt: _c, updatedAt: _u, loan, ...rest } = presentReport(r, '');
  return { ...rest, loanId: loan?.id ?? null } as Record<string, unknown>;
}

/** A YYYY-MM-DD that names a real day. */
function isRealDate(s: string): boolean {
  const d = new Date(`${s}T00:00:00Z`);
  return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s;
}

/** The latest date it is anywhere on Earth now (UTC+14), so an examiner far east of the server is never refused today. */
function latestToday(): string {
  return new Date(Date.now() + 14 * 3_600_000).toISOString().slice(0, 10);
}

function dateIssues(examinedOn: string, nextCheckOn: string | null): FieldIssue[] {
  const issues: FieldIssue[] = [];
  const examinedOk = isRealDate(examinedOn);
  if (!examinedOk) issues.push({ path: 'examinedOn', message: 'Not a real date', code: 'invalid_date' });
  else if (examinedOn > latestToday()) issues.push({ path: 'examinedOn', message: 'An examination cannot be in the future', code: 'future' });
  if (nextCheckOn !== null) {
    if (!isRealDate(nextCheckOn)) issues.push({ path: 'nextCheckOn', message: 'Not a real date', code: 'invalid_date' });
    else if (examinedOk && nextCheckOn < examinedOn) {
      issues.push({ path: 'nextCheckOn', message: 'The next check cannot be before the examination', code: 'before_examination' });
    }
  }
  return issues;
}

/** Each observation names an active term, and any region is drawn on a current image of the same print. */
async function observationIssues(printId: string, observations: ObservationInput[], t: Transaction): Promise<FieldIssue[]> {
  if (!observations.length) return [];
  const codes = [...new Set(observations.map((o) => o.termCode))];
  const active = new Set(
    (await ConditionTerm.findAll({ where: { code: codes, active: true }, attributes: ['code'], transaction: t })).map((x) => x.code),
  );
  const imageIds = [...new Set(observations.flatMap((o) => (o.region ? [o.region.imageId] : [])))];
  const images = new Map(
    (imageIds.length ? await Image.findAll({ where: { id: imageIds }, attributes: ['id', 'printId', 'withdrawnAt'], transaction: t }) : []).map((i) => [i.id, i]),
  );
  const issues: FieldIssue[] = [];
  observations.forEach((o, i) => {
    if (!active.has(o.termCode)) issues.push({ path: `observations.${i}.termCode`, message: 'Not an active term of the vocabulary', code: 'not_found' });
    if (o.region) {
      const path = `observations.${i}.region.imageId`;
      const image = images.get(o.region.imageId);
      if (!image) issues.push({ path, message: 'No such image', code: 'not_found' });
      else if (image.printId !== printId) issues.push({ path, message: 'The image is of another print', code: 'other_print' });
      else if (image.withdrawnAt) issues.push({ path, message: 'The image has been withdrawn', code: 'withdrawn' });
    }
  });
  return issues;
}

function observationRow(reportId: string, position: number, o: ObservationInput) {
  return {
    reportId, position, termCode: o.termCode, side: o.side, area: o.area, extent: o.extent, extentPercent: o.extentPercent ?? null,
    severity: o.severity, notes: o.notes ?? null,
    region: o.region ? { shape: o.region.shape, points: o.region.points } : null,
    regionImageId: o.region?.imageId ?? null,
  };
}

export async function createReport(printId: string, input: ReportInput, actor: Actor, requestId: string | null) {
  return db().transaction(async (t) => {
    if ((await Print.count({ where: { id: printId }, transaction: t })) === 0) throw notFound('The print');
    await assertPrintEditable(printId, t);
    const issues = [
      ...dateIssues(input.examinedOn, input.nextCheckOn ?? null), ...(await observationIssues(printId, input.observations, t)),
      ...(await loanIssues(printId, input.loanId, t)),
    ];
    if (issues.length) throw validationFailed(issues);
    const report = await ConditionReport.create(
      {
        printId, examinedOn: input.examinedOn, examinerId: actor.id, examinerName: actor.name, context: input.context, grade: input.grade ?? null,
        summary: input.summary ?? null, recommendations: input.recommendations ?? null, nextCheckOn: input.nextCheckOn ?? null, signedAt: null,
        loanId: input.loanId ?? null,
      },
      { transaction: t },
    );
    await Observation.bulkCreate(input.observations.map((o, i) => observationRow(report.id, i + 1, o)), { transaction: t });
    const after = await loadReport(report.id, t);
    await recordAudit({ actor, action: 'condition_report.created', entityType: ENTITY, entityId: report.id, after: snapshot(after), requestId }, t);
    return present(after);
  });
}

/**
 * Locks a draft for a change by its author at the version they loaded. A signed report is
 * refused before anything else: nobody may change it, and the answer says what to do instead.
 */
async function lockDraft(id: string, version: number, actor: Actor, t: Transaction): Promise<LoadedReport> {
  const row = await ConditionReport.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE });
  if (!row) throw notFound('The condition report');
  await assertPrintEditable(row.printId, t);
  if (row.status === 'signed') throw conflict(LOCKED);
  if (row.examinerId !== actor.id) throw forbidden(NOT_AUTHOR);
  const loaded = await loadReport(id, t);
  if (row.version !== version) throw await staleEdit(ENTITY, id, await present(loaded), t);
  return loaded;
}

export type ReportChanges = Partial<ReportInput> & { version: number };

export async function updateReport(id: string, update: ReportChanges, actor: Actor, requestId: string | null) {
  const { version, observations, ...changes } = update;
  return db().transaction(async (t) => {
    const before = await lockDraft(id, version, actor, t);
    const examinedOn = changes.examinedOn ?? before.examinedOn;
    const nextCheckOn = changes.nextCheckOn !== undefined ? changes.nextCheckOn : before.nextCheckOn;
    const issues = [
      ...dateIssues(examinedOn, nextCheckOn), ...(observations ? await observationIssues(before.printId, observations, t) : []),
      ...(await loanIssues(before.printId, changes.loanId, t)),
    ];
    if (issues.length) throw validationFailed(issues);
    const values: Record<string, unknown> = {};
    for (const key of ['examinedOn', 'context', 'grade', 'summary', 'recommendations', 'nextCheckOn', 'loanId'] as const) {
      if (changes[key] !== undefined) values[key] = changes[key];
    }
    await ConditionReport.update({ ...values, version: before.version + 1 }, { where: { id }, transaction: t });
    if (observations) {
      await Observation.destroy({ where: { reportId: id }, transaction: t });
      await Observation.bulkCreate(observations.map((o, i) => observationRow(id, i + 1, o)), { transaction: t });
    }
    const after = await loadReport(id, t);
    const b = snapshot(before);
    const a = snapshot(after);
    if (changedFields(b, a).length) await recordAudit({ actor, action: 'condition_report.updated', entityType: ENTITY, entityId: id, before: b, after: a, requestId }, t);
    return present(after);
  });
}

/** Throws a draft away. The whole draft, observations included, stays in the audit trail. */
export async function discardReport(id: string, version: number, actor: Actor, requestId: string | null) {
  await db().transaction(async (t) => {
    const before = await lockDraft(id, version, actor, t);
    await recordAudit(
      { actor, action: 'condition_report.discarded', entityType: ENTITY, entityId: id, before: snapshot(before), after: { printId: before.printId }, requestId },
      t,
    );
    await ConditionReport.destroy({ where: { id }, transaction: t });
  });
}

/**
 * Signs a draft: from here on the report and its observations are locked; corrections go in addenda.
 * `signedAt` is now, except for the demo seed, which signs its invented past reports when they were.
 */
export async function signReport(id: string, version: number, actor: Actor, requestId: string | null, signedAt: Date = new Date()) {
  return db().transaction(async (t) => {
    const before = await lockDraft(id, version, actor, t);
    if (!before.grade) throw validationFailed([{ path: 'grade', message: 'Give an overall grade before signing', code: 'required' }], 'A report needs an overall grade to be signed.');
    await ConditionReport.update({ status: 'signed', signedAt, version: before.version + 1 }, { where: { id }, transaction: t });
    const after = await loadReport(id, t);
    await checkOffRounds(after, t);
    await markScheduleStale(t, { printIds: [before.printId] });
    await recordAudit(
      { actor, action: 'condition_report.signed', entityType: ENTITY, entityId: id, before: { status: 'draft' }, after: snapshot(after), requestId },
      t,
    );
    return present(after);
  });
}

/** Any conservator may add to a signed report; the report itself stays as signed. */
export async function addAddendum(id: string, text: string, actor: Actor, requestId: string | null) {
  return db().transaction(async (t) => {
    const report = await ConditionReport.findByPk(id, { transaction: t });
    if (!report) throw notFound('The condition report');
    await assertPrintEditable(report.printId, t);
    if (report.status !== 'signed') throw conflict('This report is still a draft; edit the draft instead.');
    const addendum = await writeAddendum({ reportId: id }, text, actor, t);
    await recordAudit(
      {
        actor, action: 'condition_report.addendum_added', entityType: ENTITY, entityId: id,
        after: { printId: report.printId, addendum },
        requestId,
      },
      t,
    );
    return present(await loadReport(id, t));
  });
}
