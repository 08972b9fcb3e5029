import { QueryTypes, type Transaction } from 'sequelize';
import { db } from '../db';
import { Print } from '../models';
import { notFound } from '../errors';

/**
 * Why a print cannot be deleted, or null when it can: the one rule the delete itself applies
 * (inside its transaction) and the print page asks before it offers the command.
 */
export async function deletionRefusal(id: string, transaction?: Transaction): Promise<string | null> {
  const [onLoans] = await db().query<{ n: number }>('SELECT count(*)::int AS n FROM loan_objects WHERE print_id = $1', {
    bind: [id], type: QueryTypes.SELECT, transaction,
  });
  if (onLoans.n > 0) return 'This print is on a loan, which keeps it on its checklist. Take it off the loan first (possible until the loan is in transit).';
  const [kept] = await db().query<{ n: number }>(
    `SELECT (SELECT count(*) FROM images WHERE print_id = $1) + (SELECT count(*) FROM condition_reports WHERE print_id = $1)
          + (SELECT count(*) FROM measurement_sessions WHERE print_id = $1) AS n`,
    { bind: [id], type: QueryTypes.SELECT, transaction },
  );
  if (Number(kept.n) > 0) {
    return 'This print has images, condition reports or measurements, which are kept for good. Set its status to deaccessioned instead of deleting it.';
  }
  return null;
}

/** Whether the print may be deleted now, and why not. */
export async function printDeletion(id: string): Promise<{ ok: boolean; reason: string | null }> {
  if ((await Print.count({ where: { id } })) === 0) throw notFound('The print');
  const reason = await deletionRefusal(id);
  return { ok: reason === null, reason };
}
