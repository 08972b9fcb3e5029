import type { Excursion } from '@toneledger/common/schemas/climate';

const one = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 1, minimumFractionDigits: 1 });
const two = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 2, minimumFractionDigits: 2 });

export const formatC = (v: number | null) => (v === null ? '—' : `${one.format(v)} °C`);
export const formatRh = (v: number | null) => (v === null ? '—' : `${one.format(v)} %`);
/** A share 0–1 as a percentage of the covered time. */
export const formatShare = (v: number | null) => (v === null ? '—' : `${one.format(v * 100)} %`);
/** Relative permanence: "1.81×" the reference climate's. */
export const formatPermanence = (v: number | null) => (v === null ? '—' : `${two.format(v)}×`);

/** A length of time in words: "45 min", "3 h 20 min", "2 d 4 h". */
export function formatMinutes(m: number): string {
  const total = Math.round(m);
  if (total < 60) return `${total} min`;
  const days = Math.floor(total / 1440);
  const hours = Math.floor((total % 1440) / 60);
  const mins = total % 60;
  if (days > 0) return hours ? `${days} d ${hours} h` : `${days} d`;
  return mins ? `${hours} h ${mins} min` : `${hours} h`;
}

/** "Temperature above", "RH below". */
export function excursionLabel(e: Pick<Excursion, 'quantity' | 'direction'>): string {
  return `${e.quantity === 'temperature' ? 'Temperature' : 'RH'} ${e.direction}`;
}

export const formatPeak = (e: Pick<Excursion, 'quantity' | 'peak'>) => (e.quantity === 'temperature' ? formatC(e.peak) : formatRh(e.peak));

/** A date-time as it reads in the browser's zone: "12 Mar 2026, 14:05". */
export function formatWhen(iso: string | null): string {
  if (!iso) return '—';
  return new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' }).format(new Date(iso));
}

/** The browser's IANA zone, offered as the mapping's time zone. */
export function browserTimeZone(): string {
  try {
    return Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC';
  } catch {
    return 'UTC';
  }
}
