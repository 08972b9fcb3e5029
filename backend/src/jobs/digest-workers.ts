import type { Logger } from 'pino';
import { QUEUES, type JobQueue } from './queue';
import { digestTick, sendDigest, type DigestContext } from '../services/digest.service';

export interface DigestJobOptions {
  /** When the tick runs (cron, UTC): every hour by default, so each person's weekday is caught on the day. */
  cron?: string;
  /** pg-boss retry of a failed send: first delay in seconds (doubling), and how many times. */
  retryDelaySeconds?: number;
  retryLimit?: number;
  /** false in tests that run the tick themselves. */
  schedule?: boolean;
}

/** Queues the send of each claimed digest (and of this week's failed or unsent ones again). */
export async function runDigestTick(queue: JobQueue, ctx: Pick<DigestContext, 'now'>, options: DigestJobOptions = {}) {
  const result = await digestTick(ctx);
  for (const sendId of [...result.toSend, ...result.again]) {
    await queue.boss.send(QUEUES.digestSend, { sendId, today: result.today }, {
      retryLimit: options.retryLimit ?? 8, retryDelay: options.retryDelaySeconds ?? 30, retryBackoff: true,
    });
  }
  return result;
}

/** The weekly digest's workers: the hourly tick and the sends, each send retried by pg-boss until it goes. */
export async function startDigestWorkers(queue: JobQueue, ctx: DigestContext, logger: Logger, options: DigestJobOptions = {}): Promise<void> {
  const { boss } = queue;
  await boss.work(QUEUES.digestTick, { batchSize: 1, pollingIntervalSeconds: 5 }, async () => {
    const result = await runDigestTick(queue, ctx, options);
    if (result.toSend.length + result.empty.length + result.again.length) logger.info({ ...result }, 'weekly digests claimed');
  });
  await boss.work<{ sendId: string; today?: string }>(QUEUES.digestSend, { batchSize: 1, pollingIntervalSeconds: 1 }, async ([job]) => {
    try {
      await sendDigest(job.data.sendId, ctx, job.data.today);
    } catch (err) {
      logger.warn({ err, sendId: job.data.sendId }, 'a weekly digest was not sent; it will be tried again');
      throw err;
    }
  });
  if (options.schedule ?? true) await boss.schedule(QUEUES.digestTick, options.cron ?? '7 * * * *', {}, { tz: 'UTC' });
}
