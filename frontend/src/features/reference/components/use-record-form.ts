import type { UseMutationResult } from '@tanstack/react-query';
import type { FieldValues } from 'react-hook-form';
import type { z } from 'zod';
import type { FieldErrors } from '@/lib/forms/field-errors';
import { changesOnly, type ReviewValue, type StaleField } from '@/lib/forms/stale-edit';
import { useRecordEdit } from '@/lib/forms/use-record-edit';
import { NOTHING_TO_SAVE, useSchemaForm } from '@/lib/forms/use-schema-form';
import type { SaveRequest } from '@/features/reference/api/save-reference';

export interface RecordFormOptions<R extends { id: string; version: number }, V extends FieldValues, S extends z.ZodType> {
  /** The record being edited, or null to create one. */
  record: R | null;
  /** The contract's create schema; an edit is checked whole with it, then only changed fields are sent. */
  schema: S;
  /** To read the record the server returns with a stale-edit conflict. */
  recordSchema: z.ZodType<R>;
  /** The values of the controls for a record (null: a new one). */
  toValues: (record: R | null) => V;
  /** The fields the form edits, in form order, with their labels (for the stale-edit review). */
  fields: readonly StaleField[];
  toBody?: (values: V) => unknown;
  comparable?: (values: V) => Record<string, unknown>;
  describe?: (key: string, values: V) => ReviewValue;
  check?: (values: V) => FieldErrors;
  save: UseMutationResult<R, Error, SaveRequest>;
  onSaved?: (record: R, created: boolean) => void;
}

/**
 * The reference forms on the one form system. New records are POSTed whole; edits send only the
 * fields that changed, with the version they were based on, so a stale edit can be re-applied on
 * top of what someone else saved without overwriting their other fields.
 */
export function useRecordForm<R extends { id: string; version: number }, V extends FieldValues, S extends z.ZodType>(options: RecordFormOptions<R, V, S>) {
  const { record, schema, recordSchema, toValues, fields, toBody, comparable, describe, check, save, onSaved } = options;
  const form = useSchemaForm({ schema, defaultValues: toValues(record), toBody, check });
  const edit = useRecordEdit(form, { record, recordSchema, toValues: (r: R) => toValues(r), fields, comparable, describe });

  function onValid(body: z.output<S>, values: V) {
    let request: SaveRequest;
    if (edit.base) {
      const changed = edit.changed(values);
      if (changed.length === 0) {
        form.setNotice(NOTHING_TO_SAVE);
        return;
      }
      request = { id: edit.base.id, body: changesOnly(body as object, changed, edit.base.version) };
    } else {
      request = { id: null, body: body as Record<string, unknown> };
    }
    save.mutate(request, {
      onSuccess: (saved) => {
        edit.saved(saved);
        onSaved?.(saved, request.id === null);
      },
      onError: edit.failed,
    });
  }

  return { form, edit, onValid, saving: save.isPending };
}
