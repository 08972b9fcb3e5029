/** Calendar dates are formatted once, in lib/format.ts, for every feature. */
export { formatDay, todayIso } from '@/lib/format';

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
