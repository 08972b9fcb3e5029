import { LIGHT_RESPONSIVITY } from '@toneledger/common/schemas/vocab';
import type { PrintLight } from '@toneledger/common/schemas/light';

const whole = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 0 });

/** Lux-hours with thousands separators: 12000 → "12,000 lx·h". */
export function formatLuxHours(luxHours: number): string {
  return `${whole.format(Math.round(luxHours))} lx·h`;
}

/** An axis label: 15000 → "15,000". */
export function formatAxisNumber(n: number): string {
  return whole.format(n);
}

/** Illuminance: 50 → "50 lx". */
export function formatLux(lux: number): string {
  return `${new Intl.NumberFormat('en-GB', { maximumFractionDigits: 1 }).format(lux)} lx`;
}

/** A ΔE00 figure or rate, two decimals: 0.8 → "0.80". */
export function formatDeltaE(n: number): string {
  return n.toFixed(2);
}

export function categoryLabel(code: string): string {
  return (LIGHT_RESPONSIVITY.labels as Record<string, string>)[code] ?? code;
}

/** Where the print's category comes from, in plain words. */
export function categorySourceText(light: Pick<PrintLight, 'categorySource' | 'overriddenBy' | 'overrideReason'>): string {
  if (light.categorySource === 'default') return 'default from process and toner';
  return `set by ${light.overriddenBy?.name ?? 'a conservator'}: ${light.overrideReason ?? 'no reason recorded'}`;
}

/** A budget figure, or "no limit". */
export function budgetText(value: number | null, format: (n: number) => string): string {
  return value === null ? 'no limit' : format(value);
}
