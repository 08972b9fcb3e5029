import { createHash, randomBytes } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import type { z } from 'zod';
import type { CalendarFeed, DigestSend, Reminders } from '@toneledger/common/schemas/inspections';
import type { digestListQuerySchema, remindersInputSchema } from '@toneledger/common/schemas/inspections';
import { db } from '../db';
import { recordAudit, type AuditActor } from './audit.service';

/** A person's reminders: the weekly digest (on by default, on Mondays) and the secret calendar feed. */

export const DEFAULT_DIGEST = { digestEnabled: true, digestWeekday: 1 } as const;

/** Bytes of randomness in a feed token (256 bits), written as base64url: 43 characters. */
const TOKEN_BYTES = 32;

/** The SHA-256 of a feed token, hex: the only form kept in the database. */
export function tokenHash(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

interface PrefRow { digest_enabled: boolean; digest_weekday: number; calendar_token_created_at: Date | null }
interface LastRow { week: string; status: string; sent_at: Date | null }

export async function getReminders(userId: string): Promise<Reminders> {
  const [pref] = await db().query<PrefRow>(
    'SELECT digest_enabled, digest_weekday, calendar_token_created_at FROM reminder_preferences WHERE user_id = $1',
    { bind: [userId], type: QueryTypes.SELECT },
  );
  const [last] = await db().query<LastRow>(
    'SELECT week, status, sent_at FROM digest_sends WHERE user_id = $1 ORDER BY week DESC LIMIT 1',
    { bind: [userId], type: QueryTypes.SELECT },
  );
  return {
    digestEnabled: pref?.digest_enabled ?? DEFAULT_DIGEST.digestEnabled,
    digestWeekday: pref?.digest_weekday ?? DEFAULT_DIGEST.digestWeekday,
    calendarFeed: pref?.calendar_token_created_at ? { createdAt: pref.calendar_token_created_at.toISOString() } : null,
    lastDigest: last ? { week: last.week, status: last.status, sentAt: last.sent_at?.toISOString() ?? null } : null,
  };
}

export async function saveReminders(
  actor: AuditActor & { id: string }, input: z.infer<typeof remindersInputSchema>, requestId: string,
): Promise<Reminders> {
  const before = await getReminders(actor.id);
  await db().transaction(async (transaction) => {
    await db().query(
      `INSERT INTO reminder_preferences (user_id, digest_enabled, digest_weekday) VALUES ($1, $2, $3)
       ON CONFLICT (user_id) DO UPDATE SET digest_enabled = EXCLUDED.digest_enabled, digest_weekday = EXCLUDED.digest_weekday, updated_at = now()`,
      { bind: [actor.id, input.digestEnabled, input.digestWeekday], transaction },
    );
    await recordAudit({
      actor, action: 'reminders.updated', entityType: 'user', entityId: actor.id, requestId,
      before: { digestEnabled: before.digestEnabled, digestWeekday: before.digestWeekday }, after: input,
    }, transaction);
  });
  return getReminders(actor.id);
}

/**
 * Makes a new feed token (crypto random, base64url) and keeps only its SHA-256, replacing any earlier
 * one in the same statement, so the old address stops working at once. The address is answered once.
 */
export async function rotateFeed(actor: AuditActor & { id: string }, publicUrl: string, requestId: string): Promise<CalendarFeed> {
  const token = randomBytes(TOKEN_BYTES).toString('base64url');
  const createdAt = await db().transaction(async (transaction) => {
    const [row] = await db().query<{ created_at: Date }>(
      `INSERT INTO reminder_preferences (user_id, calendar_token_sha256, calendar_token_created_at) VALUES ($1, $2, now())
       ON CONFLICT (user_id) DO UPDATE SET calendar_token_sha256 = EXCLUDED.calendar_token_sha256,
         calendar_token_created_at = EXCLUDED.calendar_token_created_at, updated_at = now()
       RETURNING calendar_token_created_at AS created_at`,
      { bind: [actor.id, tokenHash(token)], type: QueryTypes.SELECT, transaction },
    );
    await recordAudit({ actor, action: 'calendar_feed.made', entityType: 'user', entityId: actor.id, requestId }, transaction);
    return row!.created_at;
  });
  return { url: new URL(`/api/calendar/${token}.ics`, publicUrl).toString(), createdAt: createdAt.toISOString() };
}

export async function revokeFeed(actor: AuditActor & { id: string }, requestId: string): Promise<void> {
  await db().transaction(async (transaction) => {
    await db().query(
      `UPDATE reminder_preferences SET calendar_token_sha256 = NULL, calendar_token_created_at = NULL, updated_at = now()
       WHERE user_id = $1 AND calendar_token_sha256 IS NOT NULL`,
      { bind: [actor.id], transaction },
    );
    await recordAudit({ actor, action: 'calendar_feed.ended', entityType: 'user', entityId: actor.id, requestId }, transaction);
  });
}

/** The person a feed token belongs to, looked up by its hash; null for an unknown or ended token. */
export async function feedOwner(token: string): Promise<{ id: string; name: string } | null> {
  const [row] = await db().query<{ id: string; name: string }>(
    `SELECT u.id, u.name FROM reminder_preferences p JOIN users u ON u.id = p.user_id WHERE p.calendar_token_sha256 = $1`,
    { bind: [tokenHash(token)], type: QueryTypes.SELECT },
  );
  return row ?? null;
}

interface DigestRow {
  id: string; user_id: string; name: string; email: string | null; week: string; status: DigestSend['status']; attempts: number;
  last_error: string | null; overdue: number; due: number; sent_at: Date | null; created_at: Date;
}

/** Every digest sent or tried, newest first (administrators). */
export async function listDigests(query: z.infer<typeof digestListQuerySchema>): Promise<{ data: DigestSend[]; pagination: { page: number; pageSize: number; total: number } }> {
  const where = query.status ? 'WHERE d.status = $1' : '';
  const filter = query.status ? [query.status] : [];
  const [{ n }] = await db().query<{ n: number }>(`SELECT count(*)::int AS n FROM digest_sends d ${where}`, { bind: filter, type: QueryTypes.SELECT });
  const rows = await db().query<DigestRow>(
    `SELECT d.id, d.user_id, u.name, u.email, d.week, d.status, d.attempts, d.last_error, d.overdue, d.due, d.sent_at, d.created_at
     FROM digest_sends d JOIN users u ON u.id = d.user_id ${where}
     ORDER BY d.created_at DESC, d.id LIMIT ${query.pageSize} OFFSET ${(query.page - 1) * query.pageSize}`,
    { bind: filter, type: QueryTypes.SELECT },
  );
  return {
    data: rows.map((r) => ({
      id: r.id, user: { id: r.user_id, name: r.name, email: r.email }, week: r.week, status: r.status, attempts: r.attempts,
      lastError: r.last_error, overdue: r.overdue, due: r.due, sentAt: r.sent_at?.toISOString() ?? null, createdAt: r.created_at.toISOString(),
    })),
    pagination: { page: query.page, pageSize: query.pageSize, total: n },
  };
}
