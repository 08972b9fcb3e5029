import { QueryTypes, type Transaction } from 'sequelize';
import type { DisplayPeriodInput } from '@toneledger/common/domain/light-dose';
import { db } from '../db';

/** A display period as read for presenting and for summing light: with its print, exhibition and venue names. */
export interface DisplayRow {
  id: string;
  print_id: string;
  accession_number: string;
  print_title: string;
  exhibition_id: string;
  exhibition_title: string;
  venue_id: string | null;
  venue_name: string | null;
  starts_on: string;
  ends_on: string;
  lux: number;
  hours_per_day: number;
  days_open: number[];
  closed_dates: string[];
  uv: number | null;
  case_or_frame: string | null;
  mount_notes: string | null;
  version: number;
}

const SELECT = `
  SELECT d.id, d.print_id, p.accession_number, p.title AS print_title, d.exhibition_id, e.title AS exhibition_title,
         d.venue_id, v.name AS venue_name, to_char(d.starts_on, 'YYYY-MM-DD') AS starts_on, to_char(d.ends_on, 'YYYY-MM-DD') AS ends_on,
         d.lux::float8 AS lux, d.hours_per_day::float8 AS hours_per_day, d.days_open::int[] AS days_open,
         ARRAY(SELECT to_char(c, 'YYYY-MM-DD') FROM unnest(d.closed_dates) c ORDER BY c) AS closed_dates,
         d.uv::float8 AS uv, d.case_or_frame, d.mount_notes, d.version
    FROM display_periods d
    JOIN prints p ON p.id = d.print_id
    JOIN exhibitions e ON e.id = d.exhibition_id
    LEFT JOIN exhibition_venues v ON v.id = d.venue_id`;

/** Display periods by id, by print or by exhibition, in date order. */
export async function loadDisplays(
  by: { ids?: readonly string[]; printIds?: readonly string[]; exhibitionId?: string },
  transaction?: Transaction,
): Promise<DisplayRow[]> {
  const where: string[] = [];
  const bind: unknown[] = [];
  if (by.ids) { bind.push(by.ids); where.push(`d.id = ANY ($${bind.length}::uuid[])`); }
  if (by.printIds) { bind.push(by.printIds); where.push(`d.print_id = ANY ($${bind.length}::uuid[])`); }
  if (by.exhibitionId) { bind.push(by.exhibitionId); where.push(`d.exhibition_id = $${bind.length}`); }
  if (!where.length) throw new Error('loadDisplays needs a filter');
  return db().query<DisplayRow>(`${SELECT} WHERE ${where.join(' AND ')} ORDER BY d.starts_on, d.id`, {
    bind, transaction, type: QueryTypes.SELECT,
  });
}

/** The period as the light functions take it. */
export function periodOf(r: DisplayRow): DisplayPeriodInput {
  return { id: r.id, start: r.starts_on, end: r.ends_on, lux: r.lux, hoursPerDay: r.hours_per_day, daysOpen: r.days_open, closedDates: r.closed_dates };
}

/** Today's date in UTC, 'YYYY-MM-DD' (the light figures count whole UTC days). */
export function todayIso(): string {
  return new Date().toISOString().slice(0, 10);
}
