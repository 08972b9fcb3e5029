import PgBoss from 'pg-boss';
import type { Logger } from 'pino';

/** Background work, in PostgreSQL through pg-boss. */
export const QUEUES = {
  derivatives: 'image-derivatives',
  fixity: 'fixity-sweep',
  purge: 'image-purge',
  importCheck: 'import-check',
  importCommit: 'import-commit',
  lightRecompute: 'light-recompute',
  scheduleUpdate: 'schedule-update',
  scheduleRecompute: 'schedule-recompute',
  digestTick: 'digest-tick',
  digestSend: 'digest-send',
  bagExport: 'bag-export',
  bagImport: 'bag-import',
} as const;
export type QueueName = (typeof QUEUES)[keyof typeof QUEUES];

export interface JobQueue {
  send(name: QueueName, data: object): Promise<string | null>;
  boss: PgBoss;
  stop(): Promise<void>;
}

export async function startQueue(connectionString: string, logger: Logger): Promise<JobQueue> {
  const boss = new PgBoss({ connectionString, schema: 'pgboss', max: 4 });
  boss.on('error', (err) => logger.error({ err }, 'job queue error'));
  await boss.start();
  for (const q of Object.values(QUEUES)) await createQueueOnce(boss, q);
  return {
    boss,
    send: (name, data) => boss.send(name, data, { retryLimit: 3, retryDelay: 5, retryBackoff: true }),
    stop: () => boss.stop({ graceful: true, wait: true, timeout: 10_000 }),
  };
}

/**
 * Creating a queue does nothing when it exists, but servers started together on a new database
 * create the same queue at the same moment and PostgreSQL may end one of them as a deadlock victim
 * (40P01): that one tries again and finds the queue made.
 */
async function createQueueOnce(boss: PgBoss, name: QueueName): Promise<void> {
  for (let attempt = 1; ; attempt++) {
    try {
      await boss.createQueue(name);
      return;
    } catch (err) {
      if ((err as { code?: string }).code !== '40P01' || attempt >= 5) throw err;
    }
  }
}
