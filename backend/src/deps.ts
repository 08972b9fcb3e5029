import type pg from 'pg';
import type { ObjectStore } from '@toneledger/storage/object-store';
import type { Env } from './config/env';
import type { OidcClient } from './auth/oidc-client';
import type { Mailer } from './services/mail.service';
import type { JobQueue } from './jobs/queue';

/** What the app is built from; tests and the start script each assemble their own. */
export interface AppDeps {
  env: Env;
  pool: pg.Pool;
  store: ObjectStore;
  oidc: OidcClient;
  mailer: Mailer;
  version: string;
  /** Background jobs; null only where no queue is wanted (work then runs inline). */
  queue: JobQueue | null;
}
