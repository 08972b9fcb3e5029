import PgBoss from 'pg-boss';
import type { Logger } from 'pino';

/** Background work, in PostgreSQL through pg-boss. */
export const QUEUES = {
  derivatives: 'image-derivatives',
  fixity: 'fixity-sweep',
  purge: 'image-purge',
  importCheck: 'import-check',
  importCommit: 'import-commit',
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
  for (const q of Object.values(QUEUES)) await boss.createQueue(q);
  return {
    boss,
    send: (name, data) => boss.send(name, data, { retryLimit: 3, retryDelay: 5, retryBackoff: true }),
    stop: () => boss.stop({ graceful: true, wait: true, timeout: 10_000 }),
  };
}
