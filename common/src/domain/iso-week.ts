/**
 * ISO 8601 week dates for the weekly digest: the week a day falls in ("2026-W49") and its weekday
 * (1 = Monday … 7 = Sunday), both taken in UTC so every server agrees whatever its own time zone.
 */

const DAY_MS = 86_400_000;

/** ISO weekday of the UTC day of `at`: 1 = Monday … 7 = Sunday. */
export function isoWeekday(at: Date): number {
  const d = at.getUTCDay();
  return d === 0 ? 7 : d;
}

/**
 * The ISO week holding the UTC day of `at`, as "YYYY-Www". The week belongs to the year of its
 * Thursday, so the first days of January can fall in the last week of the year before and the last
 * days of December in week 1 of the next.
 */
export function isoWeek(at: Date): string {
  const day = Date.UTC(at.getUTCFullYear(), at.getUTCMonth(), at.getUTCDate());
  const thursday = new Date(day + (4 - isoWeekday(at)) * DAY_MS);
  const year = thursday.getUTCFullYear();
  const week = Math.floor((thursday.getTime() - Date.UTC(year, 0, 1)) / DAY_MS / 7) + 1;
  return `${year}-W${String(week).padStart(2, '0')}`;
}

/** The UTC calendar day of `at` as 'YYYY-MM-DD', plus `days`. */
export function utcDay(at: Date, days = 0): string {
  return new Date(Date.UTC(at.getUTCFullYear(), at.getUTCMonth(), at.getUTCDate()) + days * DAY_MS).toISOString().slice(0, 10);
}
