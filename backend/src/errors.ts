import type { ErrorCode, FieldIssue } from '@toneledger/common/schemas/envelope';

/** A failure the client may see. Anything else becomes internal_error. */
export class AppError extends Error {
  constructor(
    readonly code: ErrorCode,
    readonly status: number,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'AppError';
  }
}

export const validationFailed = (issues: FieldIssue[], message = 'The request has invalid fields.') =>
  new AppError('validation_failed', 400, message, issues);
export const unauthenticated = (message = 'Sign in to continue.') => new AppError('unauthenticated', 401, message);
export const forbidden = (message = 'Your role does not allow this.') => new AppError('forbidden', 403, message);
export const notFound = (what = 'The resource') => new AppError('not_found', 404, `${what} was not found.`);
export const conflict = (message: string, details?: unknown) => new AppError('conflict', 409, message, details);
export const serviceUnavailable = (message: string) => new AppError('service_unavailable', 503, message);

/** Seconds a client is asked to wait (Retry-After) before trying again when the database is down. */
export const DATABASE_RETRY_AFTER_S = 5;

// PostgreSQL's codes for a server that is going or not there yet (class 08 connection exception,
// 57P01 admin_shutdown, 57P02 crash_shutdown, 57P03 cannot_connect_now, 53300 too_many_connections)
// and the socket errors of a server that cannot be reached.
const UNAVAILABLE_CODES = new Set(['57P01', '57P02', '57P03', '53300', 'ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'ENOTFOUND', 'EHOSTUNREACH', 'EAI_AGAIN']);
// Sequelize's ConnectionError and its subclasses (refused, acquire timeout, host not found or reachable, timed out).
const UNAVAILABLE_NAMES = new Set([
  'SequelizeConnectionError', 'SequelizeConnectionRefusedError', 'SequelizeConnectionAcquireTimeoutError', 'SequelizeHostNotFoundError',
  'SequelizeHostNotReachableError', 'SequelizeConnectionTimedOutError',
]);
// node-postgres ends a query on a connection the server dropped with these messages (no code).
const UNAVAILABLE_MESSAGES = /Connection terminated|connection error|timeout exceeded when trying to connect|the database system is (shutting down|starting up)/i;

/**
 * Whether an error means the database cannot be reached just now (stopped, restarting, connection
 * cut), from Sequelize, from node-postgres (the session store, pg-boss) or wrapped by either.
 */
export function isDatabaseUnavailable(err: unknown): boolean {
  const seen = new Set<unknown>();
  let e = err as { name?: unknown; code?: unknown; message?: unknown; parent?: unknown; original?: unknown; cause?: unknown } | undefined;
  const queue: unknown[] = [e];
  while (queue.length) {
    e = queue.shift() as typeof e;
    if (!e || typeof e !== 'object' || seen.has(e)) continue;
    seen.add(e);
    if (typeof e.name === 'string' && UNAVAILABLE_NAMES.has(e.name)) return true;
    if (typeof e.code === 'string' && (UNAVAILABLE_CODES.has(e.code) || /^08[0-9A-Z]{3}$/.test(e.code))) return true;
    if (typeof e.message === 'string' && UNAVAILABLE_MESSAGES.test(e.message)) return true;
    queue.push(e.parent, e.original, e.cause);
  }
  return false;
}

export const databaseUnavailable = () =>
  serviceUnavailable('The database (PostgreSQL) cannot be reached at the moment; try again shortly.');
