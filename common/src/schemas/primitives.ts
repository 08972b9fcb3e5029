import { z } from 'zod';

/** A record id (UUID). */
export const id = z.string().uuid({ message: 'Not a record id' });
/** `:id` in a path. */
export const idParamsSchema = z.object({ id });
/**
 * A calendar date that exists, as YYYY-MM-DD: 2024-02-31 is refused, with one message, worded by
 * the product's error map ("Enter a real date, as YYYY-MM-DD"). Year 0000 is refused too: the
 * calendar has no year 0 and PostgreSQL cannot store it. Every date input goes through this schema.
 */
export const isoDate = z.iso.date().refine((v) => !v.startsWith('0000'), { message: 'Enter a real date, as YYYY-MM-DD' });

/** Largest UTC offset in use anywhere (+14:00, Line Islands; the most negative is −12:00), in minutes. */
const MAX_UTC_OFFSET_MINUTES = 14 * 60;

/** The UTC offset of an ISO date-time in minutes (0 for Z or none), or null when it cannot be one (minutes over 59, hours over 23). */
function utcOffsetMinutes(dateTime: string): number | null {
  const m = /([+-])(\d{2}):?(\d{2})?$/.exec(dateTime.replace(/^\d{4}-\d{2}-\d{2}T?/, ''));
  if (!m) return 0;
  const hours = Number(m[2]);
  const minutes = Number(m[3] ?? 0);
  if (hours > 23 || minutes > 59) return null;
  return (m[1] === '-' ? -1 : 1) * (hours * 60 + minutes);
}

/**
 * A date and time with a UTC offset (ISO 8601: 2024-06-01T10:00:00Z, 2024-06-01T12:00:00+02:00), on a
 * real calendar date. An offset beyond ±14:00 is not a real one and is refused, as is year 0000.
 * Every date-time input goes through this schema.
 */
export const isoDateTime = z.iso
  .datetime({ offset: true })
  .refine((v) => !v.startsWith('0000'), { message: 'Enter a real date and time' })
  .refine((v) => {
    const offset = utcOffsetMinutes(v);
    return offset !== null && Math.abs(offset) <= MAX_UTC_OFFSET_MINUTES;
  }, { message: 'Enter a real UTC offset, at most 14 hours from UTC (±14:00)' });
/** `?version=N` on a delete: the version the user saw. */
export const versionQuerySchema = z.object({ version: z.coerce.number().int().min(1) });
/** `{ version }`: the version the user saw, for an action on a record. */
export const versionBodySchema = z.object({ version: z.number().int().min(1) });
/** A POST that carries nothing. */
export const emptyBodySchema = z.object({}).optional();
/** `{ id }` answered by a delete. */
export const deletedSchema = z.object({ id: z.string() });
