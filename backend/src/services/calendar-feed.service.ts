import ical from 'ical-generator';
import { QueryTypes } from 'sequelize';
import { db } from '../db';
import { notFound } from '../errors';
import { feedOwner } from './reminders.service';

/**
 * A person's calendar (RFC 5545) behind a secret address: one all-day VEVENT per planned round assigned
 * to them. The UID comes from the round's id (so a calendar program updates the event in place), the
 * SEQUENCE from the round's version (it rises with every change) and DTSTAMP from the round's last
 * change (RFC 5545 §3.8.7.2: without METHOD, the time the information was last revised). Written by
 * ical-generator, which folds lines at 75 octets and separates them with CRLF.
 */

interface RoundRow { id: string; title: string; planned_on: string; notes: string | null; version: number; updated_at: Date; created_at: Date }
interface ItemRow { round_id: string; print_id: string; accession_number: string; title: string | null; due_on: string | null }

/** `token` as it comes in the path: with or without the `.ics` ending. */
export async function calendarFeed(rawToken: string, publicUrl: string): Promise<string> {
  const token = rawToken.replace(/\.ics$/, '');
  const owner = await feedOwner(token);
  if (!owner) throw notFound('This calendar address');
  const rounds = await db().query<RoundRow>(
    `SELECT id, title, planned_on::text AS planned_on, notes, version, updated_at, created_at FROM inspection_rounds
     WHERE assignee_id = $1 AND status = 'planned' ORDER BY planned_on, id`,
    { bind: [owner.id], type: QueryTypes.SELECT },
  );
  const items = rounds.length
    ? await db().query<ItemRow>(
        `SELECT i.round_id, i.print_id, p.accession_number, p.title, s.due_on::text AS due_on
         FROM inspection_round_items i JOIN prints p ON p.id = i.print_id LEFT JOIN print_schedules s ON s.print_id = i.print_id
         WHERE i.round_id = ANY($1::uuid[]) ORDER BY i.round_id, i.position`,
        { bind: [rounds.map((r) => r.id)], type: QueryTypes.SELECT },
      )
    : [];
  const host = new URL(publicUrl).hostname;
  const link = (path: string) => new URL(path, publicUrl).toString();
  const cal = ical({ prodId: { company: 'Toneledger', product: 'Inspection rounds', language: 'EN' }, name: `Inspection rounds: ${owner.name}` });
  for (const r of rounds) {
    const prints = items.filter((i) => i.round_id === r.id);
    const lines = prints.map((p) => `- ${p.accession_number}${p.title ? ` ${p.title}` : ''}${p.due_on ? ` (due ${p.due_on})` : ''}: ${link(`/catalogue/prints/${p.print_id}`)}`);
    cal.createEvent({
      id: `round-${r.id}@${host}`,
      // A calendar date has no time zone: midnight UTC of the day, written as a DATE from its UTC parts.
      start: new Date(`${r.planned_on}T00:00:00Z`),
      allDay: true,
      summary: `Inspection round: ${r.title} (${prints.length} ${prints.length === 1 ? 'print' : 'prints'})`,
      description: [r.notes, `Prints to check:`, ...lines, '', `The round: ${link(`/inspections/rounds/${r.id}`)}`].filter((l) => l !== null).join('\n'),
      url: link(`/inspections/rounds/${r.id}`),
      sequence: r.version - 1,
      stamp: r.updated_at,
      created: r.created_at,
      lastModified: r.updated_at,
    });
  }
  // RFC 5545 §3.1 ends every content line with CRLF, the last (END:VCALENDAR) too; the generator leaves it off.
  const text = cal.toString();
  return text.endsWith('\r\n') ? text : `${text}\r\n`;
}
