import { QueryTypes } from 'sequelize';
import type { ConditionWork, ReportSummary } from '@toneledger/common/schemas/condition';
import { db } from '../db';

/** How many signed reports each list of the condition area's opening page shows. */
const RECENT = 10;

interface Row {
  id: string; print_id: string; accession_number: string; title: string; examined_on: string; examiner_name: string; context: string;
  grade: string | null; status: 'draft' | 'signed'; signed_at: Date | null; updated_at: Date;
}

const present = (r: Row): ReportSummary => ({
  id: r.id, printId: r.print_id, accessionNumber: r.accession_number, printTitle: r.title, examinedOn: r.examined_on, examinerName: r.examiner_name,
  context: r.context as ReportSummary['context'], grade: r.grade as ReportSummary['grade'], status: r.status,
  signedAt: r.signed_at ? r.signed_at.toISOString() : null, updatedAt: r.updated_at.toISOString(),
});

const SELECT = `SELECT r.id, r.print_id, p.accession_number, p.title, to_char(r.examined_on, 'YYYY-MM-DD') AS examined_on, r.examiner_name, r.context,
  r.grade, r.status, r.signed_at, r.updated_at FROM condition_reports r JOIN prints p ON p.id = r.print_id`;

/**
 * The condition area's opening page for the signed-in person: every draft of theirs still to finish
 * (the one left longest first), their latest signed reports, and the latest signed reports by anyone.
 */
export async function conditionWork(actorId: string): Promise<ConditionWork> {
  const run = (sql: string, replacements: Record<string, unknown>) => db().query<Row>(sql, { type: QueryTypes.SELECT, replacements });
  const [myDrafts, mySigned, recent] = await Promise.all([
    run(`${SELECT} WHERE r.status = 'draft' AND r.examiner_id = :actorId ORDER BY r.updated_at ASC, r.id`, { actorId }),
    run(`${SELECT} WHERE r.status = 'signed' AND r.examiner_id = :actorId ORDER BY r.signed_at DESC, r.id LIMIT :limit`, { actorId, limit: RECENT }),
    run(`${SELECT} WHERE r.status = 'signed' ORDER BY r.signed_at DESC, r.id LIMIT :limit`, { limit: RECENT }),
  ]);
  return { myDrafts: myDrafts.map(present), mySigned: mySigned.map(present), recent: recent.map(present) };
}
