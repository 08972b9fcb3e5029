import { QueryTypes } from 'sequelize';
import { rolesWith } from '@toneledger/common/domain/roles';
import { isoWeek, isoWeekday, utcDay } from '@toneledger/common/domain/iso-week';
import { db } from '../db';
import type { OutgoingMail } from './mail.service';
import { DIGEST_DAYS_AHEAD, digestMessage, type DigestItem } from './digest-mail';

/**
 * The weekly digest. An hourly tick finds each person who may plan inspections (`schedule.write`) with
 * the digest on (the default) whose chosen weekday it is (UTC; Monday by default) and claims their row
 * for the ISO week with INSERT … ON CONFLICT (user_id, week) DO NOTHING RETURNING: however many servers
 * tick at once, one of them gets the row, so one message goes out. A week with nothing due is recorded
 * as `empty` and sends nothing. The send itself is a job (`sendDigest`), retried until it is sent.
 */

export interface DigestContext {
  mailer: { send(mail: OutgoingMail): Promise<{ messageId: string }> };
  publicUrl: string;
  /** The clock; tests set it. */
  now: () => Date;
}

interface Candidate { id: string; name: string; email: string }

/** Prints overdue or due within 30 days of `today`, deaccessioned prints left out. */
async function dueItems(today: string): Promise<DigestItem[]> {
  const rows = await db().query<{ print_id: string; accession_number: string; title: string | null; due_on: string; path_label: string | null }>(
    `SELECT s.print_id, p.accession_number, p.title, s.due_on::text AS due_on, l.path_label
     FROM print_schedules s JOIN prints p ON p.id = s.print_id LEFT JOIN locations l ON l.id = p.location_id
     WHERE s.due_on <= $1::date + $2::int AND p.status <> 'deaccessioned'
     ORDER BY s.due_on, p.accession_number`,
    { bind: [today, DIGEST_DAYS_AHEAD], type: QueryTypes.SELECT },
  );
  return rows.map((r) => ({ printId: r.print_id, accessionNumber: r.accession_number, title: r.title, dueOn: r.due_on, locationLabel: r.path_label }));
}

/**
 * One tick: claims this week's digest for everyone due one now. Returns the ids of the claimed rows
 * that have something to send (their send jobs are for the caller to queue) and of those recorded empty.
 * Also hands back this week's rows left failed or unsent (a server stopped between claim and queue),
 * so the caller queues them again; a send job locks its row, so two jobs for one row send once.
 */
export async function digestTick(ctx: Pick<DigestContext, 'now'>): Promise<{ today: string; toSend: string[]; empty: string[]; again: string[] }> {
  const now = ctx.now();
  const week = isoWeek(now);
  const today = utcDay(now);
  const candidates = await db().query<Candidate>(
    `SELECT u.id, u.name, u.email FROM users u LEFT JOIN reminder_preferences p ON p.user_id = u.id
     WHERE u.role = ANY($1::text[]) AND u.email IS NOT NULL
       AND coalesce(p.digest_enabled, true) AND coalesce(p.digest_weekday, 1) = $2
       AND NOT EXISTS (SELECT 1 FROM digest_sends d WHERE d.user_id = u.id AND d.week = $3)
     ORDER BY u.id`,
    { bind: [rolesWith('schedule.write'), isoWeekday(now), week], type: QueryTypes.SELECT },
  );
  const toSend: string[] = [];
  const empty: string[] = [];
  let items: DigestItem[] | null = null;
  for (const c of candidates) {
    const [claimed] = await db().query<{ id: string }>(
      `INSERT INTO digest_sends (user_id, week) VALUES ($1, $2) ON CONFLICT (user_id, week) DO NOTHING RETURNING id`,
      { bind: [c.id, week], type: QueryTypes.SELECT },
    );
    if (!claimed) continue; // another server has it
    items ??= await dueItems(today);
    if (items.length === 0) {
      await db().query(`UPDATE digest_sends SET status = 'empty' WHERE id = $1`, { bind: [claimed.id] });
      empty.push(claimed.id);
    } else {
      toSend.push(claimed.id);
    }
  }
  const again = await db().query<{ id: string }>(
    `SELECT id FROM digest_sends WHERE week = $1 AND (status = 'failed' OR (status = 'sending' AND created_at < now() - interval '15 minutes'))`,
    { bind: [week], type: QueryTypes.SELECT },
  );
  return { today, toSend, empty, again: again.map((r) => r.id) };
}

/**
 * Sends one claimed digest. The row is locked (SKIP LOCKED: a second job for the same row finds it busy
 * and does nothing) and must still be unsent; the message is built afresh. A refusal by the mail server
 * marks the row failed with attempts + 1 and the error, and is thrown again so the job is retried.
 * Returns what happened: 'sent', 'empty' (nothing due any more), or 'skipped' (sent already or busy).
 * `today` is the day of the tick that claimed it (carried in the job, so every server words it alike).
 */
export async function sendDigest(sendId: string, ctx: DigestContext, today = utcDay(ctx.now())): Promise<'sent' | 'empty' | 'skipped'> {
  let failure: unknown = null;
  const outcome = await db().transaction(async (transaction) => {
    const [row] = await db().query<{ id: string; week: string; name: string; email: string | null }>(
      `SELECT d.id, d.week, u.name, u.email FROM digest_sends d JOIN users u ON u.id = d.user_id
       WHERE d.id = $1 AND d.status IN ('sending', 'failed') FOR UPDATE OF d SKIP LOCKED`,
      { bind: [sendId], type: QueryTypes.SELECT, transaction },
    );
    if (!row) return 'skipped' as const;
    const items = await dueItems(today);
    if (items.length === 0 || !row.email) {
      await db().query(`UPDATE digest_sends SET status = 'empty', attempts = attempts + 1 WHERE id = $1`, { bind: [row.id], transaction });
      return 'empty' as const;
    }
    const message = digestMessage({ name: row.name, week: row.week, today, items, publicUrl: ctx.publicUrl });
    try {
      const sent = await ctx.mailer.send({ to: row.email, subject: message.subject, text: message.text, html: message.html });
      await db().query(
        `UPDATE digest_sends SET status = 'sent', attempts = attempts + 1, overdue = $2, due = $3, message_id = $4, sent_at = now()
         WHERE id = $1`,
        { bind: [row.id, message.overdue, message.due, sent.messageId], transaction },
      );
      return 'sent' as const;
    } catch (err) {
      failure = err;
      await db().query(
        `UPDATE digest_sends SET status = 'failed', attempts = attempts + 1, overdue = $2, due = $3, last_error = $4 WHERE id = $1`,
        { bind: [row.id, message.overdue, message.due, err instanceof Error ? err.message.slice(0, 1000) : String(err)], transaction },
      );
      return 'failed' as const;
    }
  });
  if (outcome === 'failed') throw failure;
  return outcome;
}
