import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseEnv } from './env';

const base = {
  DATABASE_URL: 'postgres://db.example/x', S3_BUCKET: 'bucket', S3_ACCESS_KEY_ID: 'k', S3_SECRET_ACCESS_KEY: 's',
  OIDC_ISSUER: 'https://id.example', OIDC_CLIENT_ID: 'c', SMTP_URL: 'smtp://mail.example', SESSION_SECRET: 'x'.repeat(32),
};

describe('the environment', () => {
  it('gives the image retention and the fixity schedule their defaults, and reads them when set', () => {
    expect(parseEnv(base)).toMatchObject({ IMAGE_RETENTION_DAYS: 90, TONELEDGER_FIXITY_CRON: '30 2 * * *' });
    expect(parseEnv({ ...base, IMAGE_RETENTION_DAYS: '30', TONELEDGER_FIXITY_CRON: '0 4 * * 0' })).toMatchObject({ IMAGE_RETENTION_DAYS: 30, TONELEDGER_FIXITY_CRON: '0 4 * * 0' });
  });

  it('refuses a retention under a day and a schedule that is not five cron fields', () => {
    expect(() => parseEnv({ ...base, IMAGE_RETENTION_DAYS: '0' })).toThrow(/IMAGE_RETENTION_DAYS/);
    expect(() => parseEnv({ ...base, TONELEDGER_FIXITY_CRON: 'nightly' })).toThrow(/TONELEDGER_FIXITY_CRON/);
  });

  it('is read only here: no other server module reads process.env', () => {
    const src = path.resolve(import.meta.dirname, '..');
    const files = readdirSync(src, { recursive: true, encoding: 'utf8' })
      .filter((f) => f.endsWith('.ts') && !f.endsWith('.test.ts') && !f.startsWith(`config${path.sep}`));
    const readers = files.filter((f) => /process\.env\b/.test(readFileSync(path.join(src, f), 'utf8')));
    expect(readers).toEqual([]);
  });
});
