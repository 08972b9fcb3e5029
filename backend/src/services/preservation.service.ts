import { createReadStream, createWriteStream } from 'node:fs';
import { mkdtemp, rm, stat } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import type { Response } from 'express';
import type { ObjectStore } from '@toneledger/storage/object-store';
import { can, type Role } from '@toneledger/common/domain/roles';
import type { BagExportStart, BagJob, BagProblem } from '@toneledger/common/schemas/preservation';
import { db } from '../db';
import { conflict, forbidden, notFound } from '../errors';
import { QUEUES, type JobQueue } from '../jobs/queue';
import { recordAudit } from './audit.service';
import { getCatalogueSettings } from './settings.service';
import { writeBag } from './bag/bag-export';
import { checkBag } from './bag/bag-check';
import { BagContentError, NotEmptyError, importBag } from './bag/bag-import';
import { withConnection } from './bag/connection';

/** The largest bag an import accepts. */
export const MAX_BAG_BYTES = 200 * 1024 ** 3;

export interface BagActor {
  id: string;
  name: string;
  role: Role;
}

export interface BagRunner {
  queue: JobQueue | null;
  store: ObjectStore;
  log: { error(obj: object, msg: string): void };
}

interface JobRow {
  id: string; kind: 'export' | 'import'; scope: 'collection' | 'selection'; selection: BagJob['selection']; with_images: boolean;
  status: BagJob['status']; stage: string | null; done: number; total: number; object_key: string | null; size_bytes: number | string | null;
  payload_oxum: string | null; file_count: number | null; problems: BagProblem[]; error: string | null; created_by: string | null;
  created_by_name: string | null; created_at: Date; started_at: Date | null; finished_at: Date | null;
}

const rows = <T extends object = object>(sql: string, bind: unknown[] = []) => db().query<T>(sql, { bind, type: QueryTypes.SELECT }) as unknown as Promise<T[]>;

function present(r: JobRow): BagJob {
  return {
    id: r.id, kind: r.kind, scope: r.scope, selection: r.selection ?? null, withImages: r.with_images, status: r.status, stage: r.stage,
    done: r.done, total: r.total, sizeBytes: r.size_bytes === null ? null : Number(r.size_bytes), payloadOxum: r.payload_oxum, fileCount: r.file_count,
    problems: r.problems ?? [], error: r.error, createdByName: r.created_by_name, createdAt: r.created_at.toISOString(),
    startedAt: r.started_at?.toISOString() ?? null, finishedAt: r.finished_at?.toISOString() ?? null,
    downloadable: r.kind === 'export' && r.status === 'done' && r.object_key !== null,
  };
}

async function update(id: string, set: Record<string, unknown>) {
  const keys = Object.keys(set);
  await db().query(`UPDATE bag_jobs SET ${keys.map((k, i) => `${k} = $${i + 2}`).join(', ')} WHERE id = $1`, {
    bind: [id, ...keys.map((k) => (k === 'problems' || k === 'selection' ? JSON.stringify(set[k]) : set[k]))],
  });
}

async function load(id: string): Promise<JobRow | null> {
  return (await rows<JobRow>('SELECT * FROM bag_jobs WHERE id = $1', [id]))[0] ?? null;
}

/** A job the actor may see: administrators see every one, registrars their own exports. */
async function visible(id: string, actor: BagActor): Promise<JobRow> {
  const job = await load(id);
  if (!job || (!can(actor.role, 'collection.export') && (job.kind !== 'export' || job.created_by !== actor.id))) throw notFound('The bag');
  return job;
}

/** Jobs running in this process (no queue, as in tests), so tests can wait for them. */
const running = new Set<Promise<void>>();
export async function settleBagJobs(): Promise<void> {
  while (running.size) await Promise.all([...running]);
}
function background(work: Promise<void>) {
  running.add(work);
  void work.finally(() => running.delete(work));
}

async function dispatch(runner: BagRunner, kind: 'export' | 'import', id: string) {
  // A bag of a large collection takes longer than pg-boss's default 15 minutes before it takes a job for lost.
  if (runner.queue) await runner.queue.boss.send(kind === 'export' ? QUEUES.bagExport : QUEUES.bagImport, { jobId: id }, { expireInSeconds: 12 * 3600, retryLimit: 1 });
  else background((kind === 'export' ? runExport(id, runner.store) : runImport(id, runner.store)).catch((err) => runner.log.error({ err, bagJob: id }, `bag ${kind} failed`)));
}

export async function startExport(body: BagExportStart, actor: BagActor, requestId: string | null, runner: BagRunner): Promise<BagJob> {
  if (body.scope === 'collection' && !can(actor.role, 'collection.export')) throw forbidden('Only an administrator exports the whole collection; export a selection from the catalogue list.');
  const selection = body.scope === 'selection' ? body.selection : null;
  const [row] = await rows<JobRow>(
    `INSERT INTO bag_jobs (kind, scope, selection, with_images, created_by, created_by_name) VALUES ('export', $1, $2, $3, $4, $5) RETURNING *`,
    [body.scope, selection ? JSON.stringify(selection) : null, body.withImages, actor.id, actor.name],
  );
  await recordAudit({ actor, action: `${body.scope}.exported`, entityType: 'bag', entityId: row.id, after: { scope: body.scope, selection, withImages: body.withImages }, requestId });
  await dispatch(runner, 'export', row.id);
  return present(row);
}

export async function listBagJobs(actor: BagActor): Promise<BagJob[]> {
  const all = can(actor.role, 'collection.export');
  return (await rows<JobRow>(
    `SELECT * FROM bag_jobs ${all ? '' : "WHERE kind = 'export' AND created_by = $1"} ORDER BY created_at DESC LIMIT 50`, all ? [] : [actor.id],
  )).map(present);
}

export async function getBagJob(id: string, actor: BagActor): Promise<BagJob> {
  return present(await visible(id, actor));
}

/** Streams a finished bag from object storage; audited. */
export async function sendBag(id: string, actor: BagActor, requestId: string | null, store: ObjectStore, res: Response): Promise<void> {
  const job = await visible(id, actor);
  if (job.kind !== 'export' || job.status !== 'done' || !job.object_key) throw conflict('This bag is not ready to download.');
  const head = await store.head(job.object_key);
  if (!head) throw notFound('The bag file');
  await recordAudit({ actor, action: 'bag.downloaded', entityType: 'bag', entityId: id, requestId });
  res.setHeader('Content-Type', 'application/x-tar');
  res.setHeader('Content-Length', String(head.size));
  res.setHeader('Content-Disposition', `attachment; filename="${path.basename(job.object_key)}"`);
  const body = await store.get(job.object_key);
  await new Promise<void>((resolve, reject) => {
    body.on('error', reject);
    res.on('close', resolve);
    body.pipe(res);
  });
}

/** The bag's folder: the institution's name made safe, the date and the job. */
function bagRoot(institution: string, id: string): string {
  const name = institution.replace(/[^A-Za-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 40) || 'collection';
  return `${name}-${new Date().toISOString().slice(0, 10)}-${id.slice(0, 8)}`;
}

/** The export job: the bag to a temporary file (flat memory), then streamed into object storage. */
export async function runExport(id: string, store: ObjectStore): Promise<void> {
  const job = await load(id);
  if (!job || job.status === 'done') return;
  await update(id, { status: 'running', stage: 'Starting', started_at: new Date(), error: null });
  const workDir = await mkdtemp(path.join(os.tmpdir(), 'toneledger-bag-'));
  try {
    const settings = await getCatalogueSettings();
    const root = bagRoot(settings.institutionName, id);
    const file = path.join(workDir, 'bag.tar');
    const role: Role = (await rows<{ role: Role }>('SELECT role FROM users WHERE id = $1', [job.created_by]))[0]?.role ?? 'registrar';
    const result = await withConnection((c) => writeBag(c, createWriteStream(file), {
      selection: job.selection, withImages: job.with_images, role, store, workDir, root,
      progress: (stage, done, total) => update(id, { stage, done, total }),
    }, {
      institution: settings.institutionName,
      description: job.scope === 'collection' ? 'The whole collection' : 'A selection of the collection',
      query: job.selection ? JSON.stringify(job.selection) : 'all prints',
    }));
    await update(id, { stage: 'Storing the bag' });
    const { size } = await stat(file);
    const key = `bags/exports/${root}.tar`;
    await store.put(key, createReadStream(file), { contentType: 'application/x-tar', contentLength: size });
    await update(id, {
      status: 'done', stage: null, object_key: key, size_bytes: size, payload_oxum: result.payloadOxum, file_count: result.files,
      problems: result.problems, finished_at: new Date(),
    });
  } catch (err) {
    await update(id, { status: 'failed', error: `The bag could not be written: ${(err as Error).message}`, finished_at: new Date() });
    throw err;
  } finally {
    await rm(workDir, { recursive: true, force: true });
  }
}

/** Refuses an import into an installation that holds prints (409). */
export async function assertEmptyInstallation(): Promise<void> {
  if ((await rows('SELECT 1 FROM prints LIMIT 1')).length) {
    throw conflict('This installation already holds prints: a bag is brought only into an empty installation.');
  }
}

/** Keeps the uploaded bag in object storage (any server's worker can read it) and queues its import. */
export async function startImport(file: { path: string; size: number; name: string }, actor: BagActor, requestId: string | null, runner: BagRunner): Promise<BagJob> {
  await assertEmptyInstallation();
  const [row] = await rows<JobRow>(
    `INSERT INTO bag_jobs (kind, scope, created_by, created_by_name, size_bytes, stage) VALUES ('import', 'collection', $1, $2, $3, 'Receiving the bag') RETURNING *`,
    [actor.id, actor.name, file.size],
  );
  const key = `bags/imports/${row.id}.tar`;
  await runner.store.put(key, createReadStream(file.path), { contentType: 'application/x-tar', contentLength: file.size });
  await update(row.id, { object_key: key, stage: 'Queued' });
  await recordAudit({ actor, action: 'collection.import_started', entityType: 'bag', entityId: row.id, after: { fileName: file.name, sizeBytes: file.size }, requestId });
  await dispatch(runner, 'import', row.id);
  return present((await load(row.id))!);
}

/** The import job: the whole bag checked first (nothing written if any problem), then written in one transaction. */
export async function runImport(id: string, store: ObjectStore): Promise<void> {
  const job = await load(id);
  if (!job || job.status === 'done' || !job.object_key) return;
  await update(id, { status: 'running', stage: 'Checking the bag', started_at: new Date(), error: null, problems: [] });
  try {
    const check = await checkBag(await store.get(job.object_key));
    if (check.problems.length) {
      await update(id, {
        status: 'failed', stage: null, problems: check.problems.slice(0, 500), finished_at: new Date(),
        error: `The bag did not pass its check (${check.problems.length} problem${check.problems.length === 1 ? '' : 's'}); nothing was written.`,
      });
      return;
    }
    const total = Number(check.info.get('Toneledger-Prints')?.[0] ?? 0);
    await update(id, { stage: 'Writing records', total, payload_oxum: `${check.payloadOctets}.${check.payloadFiles}`, file_count: check.payloadFiles });
    const source = await store.get(job.object_key);
    const counts = await withConnection((c) => importBag(c, source, check.root, store, (done) => update(id, { done })));
    await recordAudit({ actor: { id: job.created_by, name: job.created_by_name }, action: 'collection.imported', entityType: 'bag', entityId: id, after: counts });
    await store.delete(job.object_key).catch(() => {});
    await update(id, { status: 'done', stage: null, done: counts.prints, finished_at: new Date() });
  } catch (err) {
    const problem = err instanceof BagContentError ? [err.problem] : [];
    const message = err instanceof NotEmptyError || err instanceof BagContentError ? err.message : `The bag could not be written; nothing was kept: ${(err as Error).message}`;
    await update(id, { status: 'failed', stage: null, problems: problem, error: message, finished_at: new Date() });
    if (!(err instanceof NotEmptyError || err instanceof BagContentError)) throw err;
  }
}
