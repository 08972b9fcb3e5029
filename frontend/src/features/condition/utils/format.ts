const day = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium' });

/** A calendar date (YYYY-MM-DD) as people read it, without shifting it through a time zone. */
export function formatDay(iso: string | null | undefined): string {
  if (!iso) return '—';
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(iso);
  if (!match) return iso;
  return day.format(new Date(Number(match[1]), Number(match[2]) - 1, Number(match[3])));
}

/** Today as YYYY-MM-DD in the person's own time zone. */
export function todayIso(now: Date = new Date()): string {
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${now.getFullYear()}-${pad(now.getMonth() + 1)}-${pad(now.getDate())}`;
}

export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(0)} KB`;
  return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
}

export function formatExposure(seconds: number | null): string | null {
  if (seconds === null) return null;
  if (seconds >= 1) return `${seconds} s`;
  return `1/${Math.round(1 / seconds)} s`;
}
