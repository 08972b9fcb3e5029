/**
 * A figure as typed, for a schema that takes a number with no preprocess of its own: empty is null
 * ("not given"); anything else is the number, or the text itself when it is not one, so the schema
 * answers "Enter a number" under the field instead of the form guessing.
 */
export function typedNumber(value: string): number | string | null {
  const trimmed = value.trim();
  if (trimmed === '') return null;
  const n = Number(trimmed.replace(',', '.'));
  return Number.isFinite(n) ? n : value;
}
