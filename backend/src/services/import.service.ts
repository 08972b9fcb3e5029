import { QueryTypes, type Transaction } from 'sequelize';
import type { Logger } from 'pino';
import type { ImportMode, ImportRow, ImportRowsQuery } from '@toneledger/common/schemas/catalogue';
import { db } from '../db';
import { ImportJobModel, User } from '../models';
import { QUEUES, type JobQueue } from '../jobs/queue';
import { AppError, conflict, notFound } from '../errors';
import { presentImport } from '../presenters/catalogue.presenter';
import type { AuditActor } from './audit.service';
import { readCsv, type ReadFile } from './import-csv';
import { checkImport, type Plan } from './import-check.service';
import { writePlan } from './import-commit.service';
import { loadExisting, loadLookups } from './import-lookups';

export { MAX_IMPORT_ROWS } from './import-csv';

/**
 * CSV import of prints (and, in a second file, their process histories), as a job in two steps:
 * check every row and show what it would do — create, update with its changes, or nothing — with
 * the problems by row and column (nothing written); then, once a person has chosen the mode,
 * write every row in one transaction. Both steps run as pg-boss jobs (inline, in this process, when
 * the app has no queue) with progress on the import row, which the client polls. A job carries only
 * the import's id: the row holds the files, the plan's fingerprint, the mode and who committed. When
 * the workers start they queue again every import left checking or committing by a stopped server:
 * a check writes nothing but its preview, and a commit interrupted half-way has written nothing
 * (one transaction, which also sets the row to committed), so both simply run again. Each job first
 * looks at the row's status, so a job that runs twice does its work once.
 */

export const MAX_IMPORT_BYTES = 20 * 1024 * 1024;
const MAX_REPORTED_ERRORS = 1000;

async function progress(id: string, values: Record<string, unknown>) {
  // Outside any transaction, so a poller sees it while a commit is still open.
  await ImportJobModel.update(values, { where: { id } });
}

function readFiles(job: ImportJobModel): { prints: ReadFile; steps: ReadFile | null } {
  return { prints: readCsv(job.source, 'prints'), steps: job.stepsSource ? readCsv(job.stepsSource, 'steps') : null };
}

const accessionsOf = (prints: ReadFile) => [...new Set(prints.rows.map((r) => (r.cells.accession_number ?? '').trim().toLowerCase()).filter(Boolean))];

async function saveRows(id: string, plan: Plan, transaction: Transaction) {
  const BATCH = 1000;
  // A check run again after an interruption replaces what an earlier run stored.
  await db().query('DELETE FROM import_rows WHERE import_id = $1', { bind: [id], transaction });
  for (let i = 0; i < plan.rows.length; i += BATCH) {
    await db().getQueryInterface().bulkInsert(
      'import_rows',
      plan.rows.slice(i, i + BATCH).map((r) => ({ import_id: id, row: r.row, accession_number: r.accessionNumber, action: r.action, changes: JSON.stringify(r.changes) })),
      { transaction },
    );
  }
}

function summary(plan: Plan): string {
  const count = (action: string) => plan.rows.filter((r) => r.action === action).length;
  const [create, update, same] = [count('create'), count('update'), count('unchanged')];
  const parts = [`${create} new ${create === 1 ? 'print' : 'prints'}`, `${update} ${update === 1 ? 'update' : 'updates'}`];
  if (same) parts.push(`${same} unchanged`);
  return `Ready: ${parts.join(', ')}.`;
}

async function validateJob(id: string) {
  const job = await ImportJobModel.findByPk(id);
  if (job?.status !== 'validating') return;
  try {
    const files = readFiles(job);
    await progress(id, { totalRows: files.prints.rows.length, stepRows: files.steps?.rows.length ?? 0 });
    const [lookups, existing] = await Promise.all([loadLookups(), loadExisting(accessionsOf(files.prints))]);
    const plan = checkImport(files.prints, files.steps, lookups, existing);
    const errorCount = plan.issues.length;
    const counts = {
      toCreate: plan.rows.filter((r) => r.action === 'create').length,
      toUpdate: plan.rows.filter((r) => r.action === 'update').length,
      unchangedRows: plan.rows.filter((r) => r.action === 'unchanged').length,
    };
    await db().transaction(async (t) => {
      // The row's lock makes a second run of the same check (a job queued again) wait, then find it done.
      const [still] = await ImportJobModel.update({ status: 'validating' }, { where: { id, status: 'validating' }, transaction: t });
      if (!still) return;
      if (!errorCount) await saveRows(id, plan, t);
      await ImportJobModel.update({
        processedRows: files.prints.rows.length, errors: plan.issues.slice(0, MAX_REPORTED_ERRORS), errorCount, newMakers: plan.newMakers,
        ignoredColumns: plan.ignoredColumns, planHash: plan.hash, ...counts, status: errorCount ? 'invalid' : 'ready',
        message: errorCount ? `${errorCount} problem(s) in the files. Nothing was written.` : summary(plan),
        finishedAt: errorCount ? new Date() : null,
      }, { where: { id }, transaction: t });
    });
  } catch (err) {
    const details = (err as { details?: { message: string }[] }).details;
    await ImportJobModel.update(
      { status: 'invalid', message: details?.map((d) => d.message).join(' ') ?? 'The file could not be read as CSV.', finishedAt: new Date() },
      { where: { id, status: 'validating' } },
    );
  }
}

/** Where a commit that fails unexpectedly is logged (the request's logger). */
export type ImportLog = Pick<Logger, 'error'>;

async function commitJob(id: string, log: ImportLog) {
  const job = await ImportJobModel.findByPk(id);
  if (job?.status !== 'committing' || !job.mode) return;
  const { mode, commitRequestId: requestId } = job;
  const committer = job.committedBy ? await User.findByPk(job.committedBy) : null;
  const actor: AuditActor = { id: committer?.id ?? null, name: committer?.name ?? null };
  try {
    const done = await db().transaction(async (t) => {
      // One import at a time, and no two commits of the same file.
      await db().query('SELECT pg_advisory_xact_lock(727003)', { transaction: t });
      // A second run of the same commit (a job queued again) finds it done and writes nothing.
      const [{ status }] = await db().query<{ status: string }>('SELECT status FROM imports WHERE id = $1', { bind: [id], type: QueryTypes.SELECT, transaction: t });
      if (status !== 'committing') return null;
      const files = readFiles(job);
      // One after the other on the transaction's connection.
      const lookups = await loadLookups(t);
      const existing = await loadExisting(accessionsOf(files.prints), t, true);
      const plan = checkImport(files.prints, files.steps, lookups, existing);
      const first = plan.issues[0];
      if (first) throw conflict(`Row ${first.row} of the ${first.file} file no longer passes its checks (${first.message}). Check the file again.`);
      if (plan.hash !== job.planHash) throw conflict('The catalogue has changed since the file was checked. Upload the file again to see what it would do now.');
      if (mode === 'create_only' && plan.rows.some((r) => r.action !== 'create')) throw conflict('Some rows match prints already in the catalogue.');
      const done = await writePlan(plan, { importId: id, fileName: job.fileName, actor, requestId, progress: (n) => progress(id, { processedRows: n }) }, t);
      // In the same transaction as the prints: the row says committed exactly when they were written.
      const message = `${done.created} ${done.created === 1 ? 'print' : 'prints'} created, ${done.updated} updated.`;
      await ImportJobModel.update(
        { status: 'committed', createdPrints: done.created, updatedPrints: done.updated, message, finishedAt: new Date() },
        { where: { id }, transaction: t },
      );
      return done;
    });
    if (!done) return;
  } catch (err) {
    // A refusal of ours is said as it is; anything else (a database error…) is logged in full and never shown.
    if (!(err instanceof AppError)) log.error({ err, importId: id, requestId }, 'import commit failed');
    const message = err instanceof AppError
      ? `Nothing was imported: ${err.message}`
      : `Nothing was imported: the catalogue could not save the file, so no print was created or changed. Try again; if it fails again, give your administrator these references: import ${id}${requestId ? `, request ${requestId}` : ''}.`;
    await ImportJobModel.update({ status: 'failed', message, finishedAt: new Date() }, { where: { id, status: 'committing' } });
  }
}

/** Jobs running in this process, so tests and shutdown can wait for them. */
const running = new Set<Promise<void>>();
function background(work: Promise<void>) {
  running.add(work);
  void work.finally(() => running.delete(work));
}
export async function settleImports(): Promise<void> {
  await Promise.all([...running]);
}

export interface ImportFiles {
  prints: { name: string; text: string };
  steps: { name: string; text: string } | null;
}

/** Where the check and the commit run: pg-boss jobs, or in this process when the app has no queue. */
export interface ImportRunner {
  queue: JobQueue | null;
  /** Receives a commit's unexpected failure in full when it runs in this process (the request's logger). */
  log: ImportLog;
}

async function runCheck(runner: ImportRunner, id: string) {
  if (runner.queue) await runner.queue.send(QUEUES.importCheck, { importId: id });
  else background(validateJob(id));
}

async function runCommit(runner: ImportRunner, id: string) {
  if (runner.queue) await runner.queue.send(QUEUES.importCommit, { importId: id });
  else background(commitJob(id, runner.log));
}

/** The workers' side: one queued check or commit, found on its import row by id. */
export async function runImportJob(kind: 'check' | 'commit', importId: string, log: ImportLog): Promise<void> {
  if (kind === 'check') await validateJob(importId);
  else await commitJob(importId, log);
}

/**
 * When the workers start: every import a stopped server left checking or committing is queued
 * again (a check stored nothing final, an interrupted commit wrote nothing). Returns how many.
 */
export async function resumeImports(queue: JobQueue): Promise<{ checks: number; commits: number }> {
  const open = await ImportJobModel.findAll({ attributes: ['id', 'status'], where: { status: ['validating', 'committing'] }, order: [['createdAt', 'ASC']] });
  const runner = { queue, log: { error: () => {} } };
  for (const job of open) await (job.status === 'validating' ? runCheck(runner, job.id) : runCommit(runner, job.id));
  return { checks: open.filter((j) => j.status === 'validating').length, commits: open.filter((j) => j.status === 'committing').length };
}

export async function startImport(files: ImportFiles, actor: AuditActor, runner: ImportRunner) {
  const job = await ImportJobModel.create({
    fileName: files.prints.name, source: files.prints.text, stepsFileName: files.steps?.name ?? null, stepsSource: files.steps?.text ?? null,
    status: 'validating', createdBy: actor.id, message: null, finishedAt: null,
  });
  await runCheck(runner, job.id);
  return presentImport(job);
}

async function findImport(id: string) {
  const job = await ImportJobModel.findByPk(id, { attributes: { exclude: ['source', 'stepsSource'] } });
  if (!job) throw notFound('The import');
  return job;
}

export async function getImport(id: string) {
  return presentImport(await findImport(id));
}

/** A page of what the checked file's rows would do, in file order (optionally only creates, updates or unchanged rows). */
export async function listImportRows(id: string, query: ImportRowsQuery): Promise<{ rows: ImportRow[]; total: number }> {
  await findImport(id);
  const filter = query.action ? 'AND action = $2' : '';
  const bind = query.action ? [id, query.action] : [id];
  const [rows, [{ n }]] = await Promise.all([
    db().query<{ row: number; accession_number: string; action: ImportRow['action']; changes: ImportRow['changes'] }>(
      `SELECT row, accession_number, action, changes FROM import_rows WHERE import_id = $1 ${filter} ORDER BY row LIMIT ${query.pageSize} OFFSET ${(query.page - 1) * query.pageSize}`,
      { bind, type: QueryTypes.SELECT },
    ),
    db().query<{ n: number }>(`SELECT count(*)::int AS n FROM import_rows WHERE import_id = $1 ${filter}`, { bind, type: QueryTypes.SELECT }),
  ]);
  return { rows: rows.map((r) => ({ row: r.row, accessionNumber: r.accession_number, action: r.action, changes: r.changes })), total: n };
}

/**
 * Starts writing a checked file. `create_only` refuses a file with rows that match prints already
 * in the catalogue (409, nothing written); `create_or_update` updates them. `log` receives a failure
 * of the write in full (the job's message only says that nothing was imported, with the job's and
 * the request's ids).
 */
export async function commitImport(id: string, mode: ImportMode, actor: AuditActor, requestId: string | null, runner: ImportRunner) {
  const job = await findImport(id);
  if (job.status === 'ready' && mode === 'create_only' && job.toUpdate + job.unchangedRows > 0) {
    const n = job.toUpdate + job.unchangedRows;
    throw conflict(`${n} ${n === 1 ? 'row matches a print' : 'rows match prints'} already in the catalogue. Choose "create or update", or take ${n === 1 ? 'it' : 'them'} out of the file.`);
  }
  const [n] = await ImportJobModel.update(
    { status: 'committing', processedRows: 0, mode, committedBy: actor.id, commitRequestId: requestId },
    { where: { id, status: 'ready' } },
  );
  if (n === 0) {
    const now = await getImport(id);
    throw conflict(`This import is ${now.status}; only a checked file that is ready can be imported.`);
  }
  await runCommit(runner, id);
  return getImport(id);
}
