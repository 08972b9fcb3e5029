import { createHash } from 'node:crypto';
import type pg from 'pg';
import { AppError, conflict, validationFailed } from '../errors';

/** How long a key's first answer is replayed; older rows are ignored and swept. */
export const IDEMPOTENCY_WINDOW_HOURS = 24;
export const IDEMPOTENCY_HEADER = 'idempotency-key';
const KEY_PATTERN = /^[\x21-\x7e]{1,200}$/;

/** JSON with object keys sorted at every level: the same body always gives the same text. */
export function canonicalJson(value: unknown): string {
  if (value === undefined) return 'null';
  if (value === null || typeof value !== 'object') return JSON.stringify(value);
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  const entries = Object.entries(value as Record<string, unknown>)
    .filter(([, v]) => v !== undefined)
    .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
}

export function bodyHash(body: unknown): string {
  return createHash('sha256').update(canonicalJson(body ?? {})).digest('hex');
}

/** The header's value, or null when absent; a malformed key is a 400 naming the header. */
export function idempotencyKeyOf(header: string | string[] | undefined): string | null {
  if (header === undefined) return null;
  const value = Array.isArray(header) ? header[0] : header;
  if (value === undefined || !KEY_PATTERN.test(value)) {
    throw validationFailed(
      [{ path: 'headers.idempotency-key', message: 'Send 1 to 200 visible ASCII characters, e.g. a UUID', code: 'invalid_format' }],
      'The Idempotency-Key header is not valid.',
    );
  }
  return value;
}

export type Claim = { kind: 'new' } | { kind: 'replay'; status: number; response: unknown };

/** Where keys are kept. `mount()` claims a key before the handler and settles or releases it after. */
export interface IdempotencyStore {
  claim(userId: string, key: string, request: string, hash: string, attempt?: number): Promise<Claim>;
  settle(userId: string, key: string, status: number, response: unknown): Promise<void>;
  release(userId: string, key: string): Promise<void>;
}

const inProgress = () =>
  conflict('A request with this Idempotency-Key is still being handled; try again in a moment to get its answer.', {
    idempotency: 'in_progress',
  });
const mismatch = () =>
  new AppError(
    'unprocessable',
    422,
    'This Idempotency-Key was used for a different request; send a new key for a new request.',
    { idempotency: 'mismatch' },
  );

/** Keys in PostgreSQL (`idempotency_keys`): a claim is one autocommitted insert, seen at once by a concurrent retry. */
export function pgIdempotencyStore(pool: pg.Pool): IdempotencyStore {
  const window = `interval '${IDEMPOTENCY_WINDOW_HOURS} hours'`;
  return {
    async claim(userId, key, request, hash, attempt = 1): Promise<Claim> {
      // Expired rows are swept here: every key of every user older than the window.
      await pool.query(`DELETE FROM idempotency_keys WHERE created_at < now() - ${window}`);
      const inserted = await pool.query(
        `INSERT INTO idempotency_keys (user_id, key, request, body_hash) VALUES ($1, $2, $3, $4)
         ON CONFLICT (user_id, key) DO NOTHING RETURNING 1`,
        [userId, key, request, hash],
      );
      if (inserted.rowCount === 1) return { kind: 'new' };
      const { rows } = await pool.query<{ request: string; body_hash: string; status: number | null; response: unknown; expired: boolean }>(
        `SELECT request, body_hash, status, response, created_at < now() - ${window} AS expired
           FROM idempotency_keys WHERE user_id = $1 AND key = $2`,
        [userId, key],
      );
      const row = rows[0];
      // Released by a failed first request, or expired, since the insert: claim it once more.
      if ((!row || row.expired) && attempt === 1) {
        await pool.query(`DELETE FROM idempotency_keys WHERE user_id = $1 AND key = $2 AND created_at < now() - ${window}`, [userId, key]);
        return this.claim(userId, key, request, hash, 2);
      }
      if (!row || row.expired) throw inProgress();
      if (row.request !== request || row.body_hash !== hash) throw mismatch();
      if (row.status === null) throw inProgress();
      return { kind: 'replay', status: row.status, response: row.response };
    },
    async settle(userId, key, status, response) {
      await pool.query('UPDATE idempotency_keys SET status = $3, response = $4 WHERE user_id = $1 AND key = $2', [
        userId, key, status, JSON.stringify(response),
      ]);
    },
    async release(userId, key) {
      await pool.query('DELETE FROM idempotency_keys WHERE user_id = $1 AND key = $2 AND status IS NULL', [userId, key]);
    },
  };
}
