import type { Loan } from '@toneledger/common/schemas/loans';

const number = new Intl.NumberFormat('en-GB');

function range(min: number | null, max: number | null, unit: string): string | null {
  if (min != null && max != null) return `${number.format(min)}–${number.format(max)} ${unit}`;
  if (min != null) return `at least ${number.format(min)} ${unit}`;
  if (max != null) return `at most ${number.format(max)} ${unit}`;
  return null;
}

/** The conditions a lender asks for, one plain sentence each; empty when none are recorded (a loan's page, the printed loan report). */
export function describeConditions(c: Loan['conditions']): string[] {
  const lines: string[] = [];
  if (c.maxLux != null) lines.push(`Illuminance at most ${number.format(c.maxLux)} lux`);
  if (c.maxAnnualLuxHours != null) lines.push(`At most ${number.format(c.maxAnnualLuxHours)} lux-hours a year`);
  const temperature = range(c.temperatureMinC, c.temperatureMaxC, '°C');
  if (temperature) lines.push(`Temperature ${temperature}`);
  const rh = range(c.rhMinPercent, c.rhMaxPercent, '% RH');
  if (rh) lines.push(`Relative humidity ${rh}`);
  if (c.noAlkalineBufferedMounts) lines.push('No alkaline-buffered mounts or enclosures');
  if (c.other) lines.push(c.other);
  return lines;
}
