import { useState } from 'react';
import type { FieldValues } from 'react-hook-form';
import type { z } from 'zod';
import { staleEditDetailsSchema } from '@toneledger/common/schemas/catalogue';
import { isApiError } from '@/lib/api-client';
import { changedKeys, rebase, staleRows, type ReviewValue, type StaleField } from '@/lib/forms/stale-edit';
import type { SchemaFormApi } from '@/lib/forms/use-schema-form';

export interface RecordEditOptions<R extends { version: number }, V extends FieldValues> {
  /** The record the form opened; null while creating one. */
  record: R | null;
  /** Reads the record a 409 carries (`details.current`). */
  recordSchema: z.ZodType<R>;
  toValues: (record: R) => V;
  /** The fields the form edits, in form order, with their labels. */
  fields: readonly StaleField[];
  /** The values as compared (default: as they are). Leave out what the request does not carry, such as row keys. */
  comparable?: (values: V) => Record<string, unknown>;
  /** How a field's value reads to a person (names rather than ids); default: its text. */
  describe?: (key: string, values: V) => ReviewValue;
  /** Called when the form moves onto the saved version after a stale-edit review (re-apply or discard), so the page around it can show that version too. */
  onCurrent?: (record: R) => void;
}

export interface Conflict<R> {
  current: R;
  lastChangedBy: string | null;
  lastChangedAt: string | null;
}

function describeText(value: unknown): ReviewValue {
  if (value === null || value === undefined) return '';
  if (typeof value === 'string') return value;
  if (typeof value === 'number' || typeof value === 'boolean') return String(value);
  return JSON.stringify(value);
}

/**
 * Editing a saved record with a schema form: what the form opened (`base`), which fields differ from
 * it, and the review when someone saved in between (a 409 with the current record). The review
 * lists every field changed on either side; re-applying puts the person's edits on top of the saved
 * version, discarding loads the saved version. Either way nothing is saved until the person saves.
 */
export function useRecordEdit<R extends { version: number }, V extends FieldValues, S extends z.ZodType>(
  form: SchemaFormApi<S, V>,
  options: RecordEditOptions<R, V>,
) {
  const { recordSchema, toValues, fields } = options;
  const comparable = options.comparable ?? ((values: V) => values as Record<string, unknown>);
  const describe = options.describe ?? ((key: string, values: V) => describeText((values as Record<string, unknown>)[key]));
  const [base, setBase] = useState<R | null>(options.record);
  const [conflict, setConflict] = useState<Conflict<R> | null>(null);

  function opened(): V | null {
    return base ? toValues(base) : null;
  }

  /** Takes a failed save that is a stale edit; false for anything else. */
  function catchConflict(error: unknown): boolean {
    if (!base || !isApiError(error) || error.code !== 'conflict') return false;
    const details = staleEditDetailsSchema.safeParse(error.details);
    const current = details.success ? recordSchema.safeParse(details.data.current) : null;
    if (!details.success || !current?.success) return false;
    setConflict({ current: current.data, lastChangedBy: details.data.lastChangedBy, lastChangedAt: details.data.lastChangedAt });
    return true;
  }

  return {
    base,
    conflict,
    /** The fields that differ from the record the form opened. */
    changed(values: V): string[] {
      const start = opened();
      return start ? changedKeys(fields, start, values, comparable) : fields.map((f) => f.key);
    },
    /** After a save: the form now edits this version. */
    saved(record: R) {
      setBase(record);
      setConflict(null);
      form.reset(toValues(record));
    },
    catchConflict,
    /** A failed save: a stale edit shows the review beside what was typed; any other failure goes to the form (field messages, the summary). */
    failed(error: unknown): void {
      if (!catchConflict(error)) form.serverError(error);
    },
    rows(mine: V) {
      const start = opened();
      if (!conflict || !start) return [];
      return staleRows({ fields, opened: start, saved: toValues(conflict.current), mine, comparable, describe });
    },
    reapply() {
      const start = opened();
      if (!conflict || !start) return;
      const mine = form.getValues();
      const saved = toValues(conflict.current);
      const both = staleRows({ fields, opened: start, saved, mine, comparable, describe }).filter((r) => r.theyChanged && r.youChanged);
      form.reset(rebase(fields, start, saved, mine, comparable));
      setBase(conflict.current);
      options.onCurrent?.(conflict.current);
      setConflict(null);
      form.setFailure(null);
      form.setNotice(
        `Your edits are now on top of version ${conflict.current.version}.` +
          (both.length ? ` You and ${conflict.lastChangedBy ?? 'the other person'} both changed: ${both.map((r) => r.label).join(', ')}; your values are in the form.` : '') +
          ' Check the form, then save again.',
      );
    },
    discard() {
      if (!conflict) return;
      form.reset(toValues(conflict.current));
      setBase(conflict.current);
      options.onCurrent?.(conflict.current);
      setConflict(null);
      form.setFailure(null);
      form.setNotice(`The form now shows version ${conflict.current.version}. Your edits were discarded.`);
    },
  };
}

export type RecordEdit<R extends { version: number }, V extends FieldValues> = ReturnType<typeof useRecordEdit<R, V, z.ZodType>>;
