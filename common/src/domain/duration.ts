/**
 * Times of a bath as people write them: `m:ss` (`1:30`, `75:00` for a long wash) or whole seconds
 * (`90`). Shared by the contract (which accepts either) and the forms (which show m:ss).
 */

/** Seconds from `m:ss` or whole seconds; null for an empty text; undefined when the text is neither. */
export function parseDuration(text: string): number | null | undefined {
  const value = text.trim();
  if (value === '') return null;
  const clock = /^(\d+):([0-5]\d)$/.exec(value);
  if (clock) return Number(clock[1]) * 60 + Number(clock[2]);
  if (/^\d+$/.test(value)) return Number(value);
  return undefined;
}

/** Seconds as m:ss (minutes may exceed 59); '' for none. */
export function formatDuration(seconds: number | null | undefined): string {
  if (seconds === null || seconds === undefined) return '';
  const whole = Math.max(0, Math.round(seconds));
  return `${Math.floor(whole / 60)}:${String(whole % 60).padStart(2, '0')}`;
}
