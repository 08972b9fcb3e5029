import type { EdtfResult } from '@toneledger/common/domain/edtf';
import { formatDuration } from '@toneledger/common/domain/duration';
import type { CompatibilityCode } from '@toneledger/common/domain/compatibility';

/** Seconds as m:ss (minutes may exceed 59, e.g. 75:00 for a long wash). */
export const formatSeconds = formatDuration;

/** "about April 1968 · 1968-04-01 to 1968-04-30" for a parsed EDTF value. */
export function edtfSummary(result: Extract<EdtfResult, { ok: true }>): string {
  const { display, earliest, latest } = result.value;
  if (earliest && latest && earliest === latest) return `${display} · ${earliest}`;
  const from = earliest ?? 'an open start';
  const to = latest ?? 'an open end';
  return `${display} · ${from} to ${to}`;
}

/** "180 × 240 mm" (height × width, as museums give dimensions); a missing side is shown as "?". Null when neither is known. */
export function formatDimensions(height: number | null, width: number | null): string | null {
  if (width === null && height === null) return null;
  const side = (n: number | null) => (n === null ? '?' : new Intl.NumberFormat('en-GB', { maximumFractionDigits: 1 }).format(n));
  return `${side(height)} × ${side(width)} mm`;
}

export function yesNoUnknown(value: boolean | null | undefined): string {
  if (value === true) return 'Yes';
  if (value === false) return 'No';
  return 'Unknown';
}

/** Short names of the warning codes, for the list's indicator. */
export const WARNING_LABELS: Record<CompatibilityCode, string> = {
  prussian_blue_in_buffered_enclosure: 'Iron blue in an alkaline-buffered enclosure',
  buffering_unknown_for_prussian_blue: 'Iron blue in an enclosure of unknown buffering',
  enclosure_failed_pat: 'Enclosure failed the Photographic Activity Test',
  enclosure_without_pat: 'Enclosure has no Photographic Activity Test result',
  alkaline_after_bath_on_iron_blue: 'Alkaline after-bath on iron blue',
  over_light_budget: 'On display past its light budget',
};

export function warningLabel(code: string): string {
  return (WARNING_LABELS as Record<string, string>)[code] ?? code.replace(/_/g, ' ');
}

export function labelOf<T extends string>(labels: Record<T, string>, code: T | null | undefined): string {
  if (code === null || code === undefined) return '';
  return labels[code] ?? code;
}
