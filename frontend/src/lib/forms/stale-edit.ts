/**
 * Someone saved a record while a form had it open (a 409 with the record as it is now). These
 * functions compare three versions of the form's values, field by field: as the form opened, as
 * saved since, and as typed, and put the typed edits on top of the saved version.
 */

/** How a value reads in the review: text, or lines (a list of steps). '' reads as empty. */
export type ReviewValue = string | string[];

export interface StaleField {
  key: string;
  label: string;
}

export interface StaleRow {
  key: string;
  label: string;
  opened: ReviewValue;
  saved: ReviewValue;
  yours: ReviewValue;
  /** Someone else changed it since the form opened. */
  theyChanged: boolean;
  /** The person changed it in the form. */
  youChanged: boolean;
}

export interface StaleInput<V> {
  fields: readonly StaleField[];
  opened: V;
  saved: V;
  mine: V;
  /** The values as compared: the request's view of them (row keys and spacing left out). */
  comparable: (values: V) => Record<string, unknown>;
  describe: (key: string, values: V) => ReviewValue;
}

export function same(a: unknown, b: unknown): boolean {
  return JSON.stringify(a ?? null) === JSON.stringify(b ?? null);
}

/** Keys of `fields` whose values differ between two sets of values. */
export function changedKeys<V>(fields: readonly StaleField[], before: V, after: V, comparable: (values: V) => Record<string, unknown>): string[] {
  const [a, b] = [comparable(before), comparable(after)];
  return fields.filter((f) => !same(a[f.key], b[f.key])).map((f) => f.key);
}

/** Every field that someone else or the person changed, in form order. */
export function staleRows<V>({ fields, opened, saved, mine, comparable, describe }: StaleInput<V>): StaleRow[] {
  const theirs = new Set(changedKeys(fields, opened, saved, comparable));
  const yours = new Set(changedKeys(fields, opened, mine, comparable));
  return fields
    .filter((f) => theirs.has(f.key) || yours.has(f.key))
    .map((f) => ({
      key: f.key,
      label: f.label,
      opened: describe(f.key, opened),
      saved: describe(f.key, saved),
      yours: describe(f.key, mine),
      theyChanged: theirs.has(f.key),
      youChanged: yours.has(f.key),
    }));
}

/**
 * The person's edits on top of the saved version: a field they changed keeps their value, every
 * other field takes the saved value. Nothing typed is lost, nothing saved since is overwritten
 * unless the person changed that same field.
 */
export function rebase<V extends object>(fields: readonly StaleField[], opened: V, saved: V, mine: V, comparable: (values: V) => Record<string, unknown>): V {
  const next = { ...saved } as Record<string, unknown>;
  for (const key of changedKeys(fields, opened, mine, comparable)) next[key] = (mine as Record<string, unknown>)[key];
  return next as V;
}

/** Only the fields that changed, from a checked body, on the version the edit started from. */
export function changesOnly(body: object, keys: readonly string[], version: number): Record<string, unknown> {
  const update: Record<string, unknown> = { version };
  for (const key of keys) update[key] = (body as Record<string, unknown>)[key] ?? null;
  return update;
}

/** The fields of a form from its labels, in the order written (form order). */
export function fieldList<K extends string>(labels: Record<K, string>): StaleField[] {
  return (Object.entries(labels) as [K, string][]).map(([key, label]) => ({ key, label }));
}
