import { QueryTypes } from 'sequelize';
import { can, type Role } from '@toneledger/common/domain/roles';
import type { TimelineEntry } from '@toneledger/common/schemas/images';
import { VIEW_TYPE_LABELS } from '@toneledger/common/schemas/images';
import { CONDITION_CONTEXT_LABELS, GRADE_LABELS } from '@toneledger/common/schemas/condition';
import { excerpt } from '@toneledger/common/domain/excerpt';
import { db } from '../db';
import { Print } from '../models';
import { notFound } from '../errors';
import { printHistory } from './print.service';

const q = <T extends object>(sql: string, bind: unknown[]) => db().query<T>(sql, { bind, type: QueryTypes.SELECT });
const iso = (d: Date | string) => new Date(d).toISOString();
const dayStart = (d: string) => `${d}T12:00:00.000Z`;

/** Everything that happened to one print, newest first; each kind only for the roles that may read it. */
export async function printTimeline(printId: string, role: Role | null): Promise<TimelineEntry[]> {
  if ((await Print.count({ where: { id: printId } })) === 0) throw notFound('The print');
  const out: TimelineEntry[] = [];
  const staff = can(role, 'catalogue.read_restricted');

  if (staff) {
    for (const h of await printHistory(printId, role)) {
      if (h.action === 'print.moved') continue;
      out.push({ at: h.at, kind: 'catalogue', title: h.summary, detail: null, actorName: h.actorName, link: null });
    }
    const moves = await q<{ moved_at: Date; moved_by_name: string | null; reason: string; to_label: string; from_label: string | null }>(
      `SELECT m.moved_at, m.moved_by_name, m.reason, t.path_label AS to_label, f.path_label AS from_label
         FROM movements m JOIN locations t ON t.id = m.to_location_id LEFT JOIN locations f ON f.id = m.from_location_id
        WHERE m.print_id = $1`,
      [printId],
    );
    for (const m of moves) {
      out.push({ at: iso(m.moved_at), kind: 'movement', title: `Moved to ${m.to_label}`, detail: m.from_label ? `From ${m.from_label}. ${m.reason}` : m.reason, actorName: m.moved_by_name, link: null });
    }
  }

  if (can(role, 'condition.read')) {
    const reports = await q<{ id: string; examined_on: string; examiner_name: string; context: keyof typeof CONDITION_CONTEXT_LABELS; grade: keyof typeof GRADE_LABELS | null; status: string; signed_at: Date | null }>(
      'SELECT id, to_char(examined_on, \'YYYY-MM-DD\') AS examined_on, examiner_name, context, grade, status, signed_at FROM condition_reports WHERE print_id = $1',
      [printId],
    );
    for (const r of reports) {
      const grade = r.grade ? `, ${GRADE_LABELS[r.grade].toLowerCase()}` : '';
      out.push({
        at: dayStart(r.examined_on), kind: 'condition',
        title: `Condition ${r.status === 'signed' ? 'report' : 'report (draft)'}${grade}`,
        detail: CONDITION_CONTEXT_LABELS[r.context], actorName: r.examiner_name, link: `/condition/reports/${r.id}`,
      });
    }
    const addenda = await q<{ report_id: string; written_at: Date; author_name: string; text: string }>(
      'SELECT a.report_id, a.written_at, a.author_name, a.text FROM addenda a JOIN condition_reports r ON r.id = a.report_id WHERE r.print_id = $1',
      [printId],
    );
    for (const a of addenda) {
      out.push({ at: iso(a.written_at), kind: 'addendum', title: 'Addendum to a condition report', detail: excerpt(a.text, 200), actorName: a.author_name, link: `/condition/reports/${a.report_id}` });
    }
    // Treatments: the proposal, and the work once done (as the conservator dated it).
    const treatments = await q<{ id: string; status: string; proposed_on: string; completed_on: string | null; chosen_method: string; conservator_name: string }>(
      `SELECT id, status, to_char(proposed_on, 'YYYY-MM-DD') AS proposed_on, to_char(completed_on, 'YYYY-MM-DD') AS completed_on, chosen_method, conservator_name FROM treatments WHERE print_id = $1`,
      [printId],
    );
    for (const tr of treatments) {
      out.push({ at: dayStart(tr.proposed_on), kind: 'condition', title: 'Treatment proposed', detail: excerpt(tr.chosen_method, 200), actorName: tr.conservator_name, link: `/condition/treatments/${tr.id}` });
      if (tr.completed_on && (tr.status === 'done' || tr.status === 'signed')) {
        out.push({ at: dayStart(tr.completed_on), kind: 'condition', title: tr.status === 'signed' ? 'Treatment done (signed record)' : 'Treatment done', detail: null, actorName: tr.conservator_name, link: `/condition/treatments/${tr.id}` });
      }
    }
  }

  if (can(role, 'images.read')) {
    const images = await q<{ id: string; view_type: keyof typeof VIEW_TYPE_LABELS; captured_on: string | null; uploaded_at: Date; uploaded_by_name: string | null; withdrawn_at: Date | null; withdrawn_by_name: string | null; withdrawn_reason: string | null }>(
      `SELECT id, view_type, to_char(captured_on, 'YYYY-MM-DD') AS captured_on, uploaded_at, uploaded_by_name, withdrawn_at, withdrawn_by_name, withdrawn_reason
         FROM images WHERE print_id = $1 ${staff ? '' : 'AND withdrawn_at IS NULL'}`,
      [printId],
    );
    for (const i of images) {
      out.push({
        at: i.captured_on ? dayStart(i.captured_on) : iso(i.uploaded_at), kind: 'image', title: `Image: ${VIEW_TYPE_LABELS[i.view_type]}`,
        detail: i.captured_on ? `Captured ${i.captured_on}` : null, actorName: i.uploaded_by_name, link: null,
      });
      if (i.withdrawn_at && staff) out.push({ at: iso(i.withdrawn_at), kind: 'image', title: 'Image withdrawn', detail: i.withdrawn_reason, actorName: i.withdrawn_by_name, link: null });
    }
    if (staff) {
      const problems = await q<{ checked_at: Date; outcome: string; detail: string | null }>(
        `SELECT f.checked_at, f.outcome, f.detail FROM fixity_checks f JOIN images i ON i.id = f.image_id WHERE i.print_id = $1 AND f.outcome <> 'match'`,
        [printId],
      );
      for (const f of problems) out.push({ at: iso(f.checked_at), kind: 'fixity', title: `Fixity check: ${f.outcome}`, detail: f.detail, actorName: null, link: null });
    }
  }
  return out.sort((a, b) => (a.at < b.at ? 1 : a.at > b.at ? -1 : 0));
}
