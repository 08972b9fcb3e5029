import type pg from 'pg';
import type { ObjectStore } from '@toneledger/storage/object-store';
import type { Env } from './config/env';
import type { OidcClient } from './auth/oidc-client';
import type { Mailer } from './services/mail.service';

/** What the app is built from; tests and the start script each assemble their own. */
export interface AppDeps {
  env: Env;
  pool: pg.Pool;
  store: ObjectStore;
  oidc: OidcClient;
  mailer: Mailer;
  version: string;
}
