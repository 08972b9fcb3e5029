const formats = new Map<number, Intl.NumberFormat>();

function formatWith(fractionDigits: number, value: number): string {
  let format = formats.get(fractionDigits);
  if (!format) {
    format = new Intl.NumberFormat('en-GB', { maximumFractionDigits: fractionDigits });
    formats.set(fractionDigits, format);
  }
  return format.format(value);
}

/** A quantity with as many decimals as a balance or cylinder would show: 260, 72.8, 8, 0.125. */
export function formatQuantity(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const size = Math.abs(value);
  return formatWith(size >= 100 ? 1 : size >= 10 ? 2 : size >= 1 ? 3 : 4, value);
}

/** A scale factor, e.g. "×4" or "×0.5". */
export function formatFactor(factor: number): string {
  return `×${formatWith(3, factor)}`;
}

/** A number typed into a field, or null when it is empty or not a number. */
export function readNumber(text: string): number | null {
  const trimmed = text.trim().replace(',', '.');
  if (trimmed === '') return null;
  const value = Number(trimmed);
  return Number.isFinite(value) ? value : null;
}
