import net from 'node:net';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import { chmodSync, mkdtempSync, rmSync, existsSync, readFileSync, writeFileSync, mkdirSync } from 'node:fs';
import os from 'node:os';
import { fileURLToPath } from 'node:url';
import { startPostgres, type LocalPostgres } from './postgres';
import { startMailSink, type MailSink } from './mail-sink';
import { startLocalS3, LOCAL_S3_CREDENTIALS, type LocalS3 } from '../storage/src/local-s3';
import { startDevIdentityProvider, type DevIdentityProvider } from '../backend/src/auth/dev-identity-provider';
import { DEMO_ACCOUNTS } from '../backend/src/seed/demo-accounts';
import { TEST_ONLY_ACCOUNTS } from '../backend/test/accounts';

export const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

export type Mode = 'development' | 'test';

export interface LocalServices {
  /** Environment for the app: every service the app needs, pointing at the local ones. */
  env: Record<string, string>;
  stop(): Promise<void>;
}

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

const num = (v: string | undefined, d: number) => (v ? Number(v) : d);

/** A session secret kept in the data folder, so a restart keeps everyone signed in. */
function devSecret(dir: string): string {
  const file = path.join(dir, 'session-secret');
  if (existsSync(file)) return readFileSync(file, 'utf8').trim();
  const secret = randomBytes(32).toString('hex');
  mkdirSync(dir, { recursive: true });
  writeFileSync(file, secret, { mode: 0o600 });
  return secret;
}

/**
 * Starts PostgreSQL, s3rver, the identity provider and the mail sink on loopback.
 * Development keeps its data in .data/ and storage/.data/ at fixed ports (overridable);
 * tests use fresh temporary folders and free ports, so they never touch the demo.
 */
export async function startLocalServices(mode: Mode, log: (m: string) => void): Promise<LocalServices> {
  const test = mode === 'test';
  const e = process.env;
  const tmp = test ? mkdtempSync(path.join(os.tmpdir(), 'toneledger-test-')) : null;
  // mkdtemp makes a 700 folder; the postgres user must be able to enter it.
  if (tmp) chmodSync(tmp, 0o755);
  const appPort = test ? num(e.TONELEDGER_TEST_APP_PORT, await freePort()) : num(e.PORT, 4010);
  const publicUrl = e.PUBLIC_URL ?? `http://localhost:${appPort}`;
  const stops: (() => Promise<void>)[] = [];
  const stop = async () => {
    for (const s of stops.reverse()) {
      try {
        await s();
      } catch (err) {
        log(`stop failed: ${(err as Error).message}`);
      }
    }
    if (tmp) rmSync(tmp, { recursive: true, force: true });
  };

  try {
    const pgPort = test ? await freePort() : num(e.TONELEDGER_PG_PORT, 54329);
    const pgBase = test ? path.join(tmp!, 'pg') : path.resolve(ROOT, e.TONELEDGER_DATA_DIR ?? '.data', 'pg');
    const postgres: LocalPostgres = await startPostgres({
      baseDir: pgBase,
      port: pgPort,
      database: test ? 'toneledger_test' : 'toneledger',
      log,
      fallbackKey: test ? 'test' : 'dev',
    });
    stops.push(() => postgres.stop());
    log(`PostgreSQL on 127.0.0.1:${pgPort}`);

    const bucket = 'toneledger';
    const s3: LocalS3 = await startLocalS3({
      port: test ? await freePort() : num(e.TONELEDGER_S3_PORT, 4012),
      directory: test ? path.join(tmp!, 's3') : path.resolve(ROOT, 'storage/.data'),
      bucket,
    });
    stops.push(() => s3.stop());
    log(`Local S3 on ${s3.endpoint}`);

    const clientId = 'toneledger-local';
    const origins = [publicUrl, ...(e.ALLOWED_ORIGINS ?? '').split(',').filter(Boolean)];
    const idp: DevIdentityProvider = await startDevIdentityProvider({
      port: test ? await freePort() : num(e.TONELEDGER_IDP_PORT, 4011),
      clientId,
      redirectUris: origins.map((o) => new URL('/auth/callback', o).href),
      postLogoutRedirectUris: origins.map((o) => new URL('/signed-out', o).href),
      accounts: test ? [...DEMO_ACCOUNTS, ...TEST_ONLY_ACCOUNTS] : DEMO_ACCOUNTS,
    });
    stops.push(() => idp.stop());
    log(`Identity provider on ${idp.issuer}`);

    const mail: MailSink = await startMailSink({
      smtpPort: test ? await freePort() : num(e.TONELEDGER_SMTP_PORT, 4025),
      apiPort: test ? await freePort() : num(e.TONELEDGER_MAIL_API_PORT, 4026),
    });
    stops.push(() => mail.stop());
    log(`Mail sink on ${mail.smtpUrl}`);

    return {
      env: {
        NODE_ENV: mode,
        PORT: String(appPort),
        PUBLIC_URL: publicUrl,
        DATABASE_URL: postgres.url,
        S3_ENDPOINT: s3.endpoint,
        S3_BUCKET: bucket,
        S3_ACCESS_KEY_ID: LOCAL_S3_CREDENTIALS.accessKeyId,
        S3_SECRET_ACCESS_KEY: LOCAL_S3_CREDENTIALS.secretAccessKey,
        S3_FORCE_PATH_STYLE: 'true',
        OIDC_ISSUER: idp.issuer,
        OIDC_CLIENT_ID: clientId,
        OIDC_ALLOW_INSECURE: 'true',
        SMTP_URL: mail.smtpUrl,
        MAIL_SINK_API: mail.apiUrl,
        SESSION_SECRET: test ? randomBytes(32).toString('hex') : devSecret(path.resolve(ROOT, '.data')),
        TONELEDGER_PG_DATA: postgres.dataDir,
      },
      stop,
    };
  } catch (err) {
    await stop();
    throw err;
  }
}
