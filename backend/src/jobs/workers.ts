import type { Logger } from 'pino';
import type { ObjectStore } from '@toneledger/storage/object-store';
import { QUEUES, type JobQueue } from './queue';
import { fixitySweep, makeDerivatives, purgeWithdrawn } from '../services/image.service';
import { resumeImports, runImportJob } from '../services/import.service';
import { recomputeJob, resumeLightRecompute } from '../services/light-recompute.service';
import { markUnscheduled, processStale, resumeScheduleRecompute, scheduleRecomputeJob } from '../services/schedule-jobs';
import { startDigestWorkers } from './digest-workers';
import { runExport, runImport } from '../services/preservation.service';
import type { DigestContext } from '../services/digest.service';

export interface WorkerSettings {
  /** When the fixity sweep runs (cron, UTC): env TONELEDGER_FIXITY_CRON. */
  fixityCron: string;
  /** Days a withdrawn image is kept before the purge: env IMAGE_RETENTION_DAYS. */
  retentionDays: number;
  /** The weekly digest's mailer, the app's address for its links, and the clock. */
  digest?: DigestContext;
}

/**
 * The server's workers: derivatives on upload, a nightly fixity sweep, the purge of withdrawn images
 * past retention, and the check and commit of CSV imports (queued again here when a stopped server
 * left them unfinished), and the recompute of light categories and warnings after a change of the light
 * settings (queued again when left running), and the weekly digest (an hourly tick and its sends).
 */
export async function startWorkers(queue: JobQueue, store: ObjectStore, logger: Logger, settings: WorkerSettings): Promise<void> {
  const { boss } = queue;
  await boss.work<{ imageId: string }>(QUEUES.derivatives, { batchSize: 1, pollingIntervalSeconds: 1 }, async ([job]) => {
    await makeDerivatives(store, job.data.imageId);
  });
  await boss.work(QUEUES.fixity, { batchSize: 1, pollingIntervalSeconds: 5 }, async () => {
    const result = await fixitySweep(store);
    logger.info(result, 'fixity sweep finished');
  });
  await boss.work(QUEUES.purge, { batchSize: 1, pollingIntervalSeconds: 30 }, async () => {
    const purged = await purgeWithdrawn(store, settings.retentionDays);
    if (purged) logger.info({ purged }, 'withdrawn images purged after retention');
  });
  for (const [queueName, kind] of [[QUEUES.importCheck, 'check'], [QUEUES.importCommit, 'commit']] as const) {
    await boss.work<{ importId: string }>(queueName, { batchSize: 1, pollingIntervalSeconds: 1 }, async ([job]) => {
      await runImportJob(kind, job.data.importId, logger);
    });
  }
  await boss.work<{ generation: number }>(QUEUES.lightRecompute, { batchSize: 1, pollingIntervalSeconds: 1 }, async ([job]) => {
    await recomputeJob(job.data.generation);
  });
  if (await resumeLightRecompute(queue)) logger.warn('a light recompute left running by a stopped server was queued again');
  // The next-inspection dates: marks of changed inputs worked off, and the full recompute (queued again when left running).
  await boss.work(QUEUES.scheduleUpdate, { batchSize: 1, pollingIntervalSeconds: 1 }, async () => {
    await processStale();
  });
  await boss.work(QUEUES.scheduleRecompute, { batchSize: 1, pollingIntervalSeconds: 1 }, async () => {
    await scheduleRecomputeJob();
  });
  if (await resumeScheduleRecompute(queue)) logger.warn('a full recompute of inspection dates left running by a stopped server was queued again');
  const unscheduled = await markUnscheduled(queue);
  if (unscheduled) logger.info({ prints: unscheduled }, 'prints without an inspection date marked for the schedule job');
  const resumed = await resumeImports(queue);
  if (resumed.checks + resumed.commits) logger.warn(resumed, 'imports left unfinished by a stopped server were queued again');
  await boss.schedule(QUEUES.fixity, settings.fixityCron, {}, { tz: 'UTC' });
  await boss.schedule(QUEUES.purge, '15 3 * * *', {}, { tz: 'UTC' });
  if (settings.digest) await startDigestWorkers(queue, settings.digest, logger);
  // Preservation packages: a bag written or brought in (a job run again after a crash starts over; an import's transaction left nothing).
  await boss.work<{ jobId: string }>(QUEUES.bagExport, { batchSize: 1, pollingIntervalSeconds: 2 }, async ([job]) => {
    await runExport(job.data.jobId, store);
  });
  await boss.work<{ jobId: string }>(QUEUES.bagImport, { batchSize: 1, pollingIntervalSeconds: 2 }, async ([job]) => {
    await runImport(job.data.jobId, store);
  });
}
