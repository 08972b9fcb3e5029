import { useState, type FormEvent } from 'react';
import type { UseMutationResult } from '@tanstack/react-query';
import type { z } from 'zod';
import { staleEditDetailsSchema } from '@toneledger/common/schemas/catalogue';
import type { FieldIssue } from '@toneledger/common/schemas/envelope';
import { isApiError } from '@/lib/api-client';
import type { SaveRequest } from '@/features/reference/api/save-reference';

/** Field path (`name`, `ingredients.1.amount`) → message. */
export type FieldErrors = Record<string, string>;

export interface StaleRow {
  field: string;
  /** The value this form started from. */
  was: unknown;
  /** The value saved since, by someone else. */
  theirs: unknown;
  /** The value in this form now. */
  yours: unknown;
  theyChanged: boolean;
  youChanged: boolean;
}

/** Someone saved the record after this form loaded it; the save was refused (409). */
export interface StaleEdit<R> {
  current: R;
  lastChangedBy: string | null;
  lastChangedAt: string | null;
  rows: StaleRow[];
}

type Draft = Record<string, unknown>;

export interface RecordFormOptions<R extends { id: string; version: number }, D extends Draft> {
  /** The record being edited, or null to create one. */
  record: R | null;
  toDraft: (record: R | null) => D;
  /** The draft as a request body with the same keys; checked with `schema` before it is sent. */
  toBody: (draft: D) => Record<string, unknown>;
  schema: z.ZodType;
  /** To read the record the server returns with a stale-edit conflict. */
  recordSchema: z.ZodType<R>;
  save: UseMutationResult<R, Error, SaveRequest>;
  /** Checks beyond the schema (e.g. an EDTF date); returns field errors, empty when fine. */
  validate?: (draft: D) => FieldErrors;
  onSaved?: (record: R, created: boolean) => void;
}

function same(a: unknown, b: unknown): boolean {
  return JSON.stringify(a ?? null) === JSON.stringify(b ?? null);
}

/** Keys whose values differ between two objects. */
export function changedKeys(a: Record<string, unknown>, b: Record<string, unknown>): string[] {
  return Object.keys({ ...a, ...b }).filter((key) => !same(a[key], b[key]));
}

export function errorsFromIssues(issues: Array<Pick<FieldIssue, 'path' | 'message'>>): FieldErrors {
  const errors: FieldErrors = {};
  for (const issue of issues) {
    const path = issue.path || '';
    if (!(path in errors)) errors[path] = issue.message;
  }
  return errors;
}

/**
 * State and submit logic shared by the reference forms. New records are POSTed whole; edits send
 * only the fields that changed, with the version they were based on, so a stale edit can be
 * re-applied on top of what someone else saved without overwriting their other fields.
 * Typed values are never thrown away on an error.
 */
export function useRecordForm<R extends { id: string; version: number }, D extends Draft>(options: RecordFormOptions<R, D>) {
  const { toDraft, toBody, schema, recordSchema, save, validate, onSaved } = options;
  const [base, setBase] = useState<R | null>(options.record);
  const [draft, setDraft] = useState<D>(() => toDraft(options.record));
  const [errors, setErrors] = useState<FieldErrors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [stale, setStale] = useState<StaleEdit<R> | null>(null);
  const [notice, setNotice] = useState<string | null>(null);

  function set<K extends keyof D>(key: K, value: D[K]) {
    setDraft((current) => ({ ...current, [key]: value }));
    setNotice(null);
    setErrors((current) => {
      const prefix = String(key);
      const next = Object.fromEntries(Object.entries(current).filter(([path]) => path !== prefix && !path.startsWith(`${prefix}.`)));
      return Object.keys(next).length === Object.keys(current).length ? current : next;
    });
  }

  function update(updater: (current: D) => D) {
    setDraft(updater);
    setNotice(null);
  }

  function submit(event?: FormEvent) {
    event?.preventDefault();
    setFormError(null);
    setNotice(null);
    const parsed = schema.safeParse(toBody(draft));
    const problems = {
      ...(parsed.success ? {} : errorsFromIssues(parsed.error.issues.map((issue) => ({ path: issue.path.map(String).join('.'), message: issue.message })))),
      ...validate?.(draft),
    };
    if (!parsed.success || Object.keys(problems).length > 0) {
      setErrors(problems);
      return;
    }
    setErrors({});
    const data = parsed.data as Record<string, unknown>;
    let request: SaveRequest;
    if (base) {
      const changed = changedKeys(toBody(toDraft(base)), toBody(draft));
      if (changed.length === 0) {
        setNotice('Nothing to save: no field has changed.');
        return;
      }
      const body: Record<string, unknown> = { version: base.version };
      for (const key of changed) body[key] = data[key] ?? null;
      request = { id: base.id, body };
    } else {
      request = { id: null, body: data };
    }
    save.mutate(request, {
      onSuccess: (record) => {
        setBase(record);
        setDraft(toDraft(record));
        setStale(null);
        onSaved?.(record, request.id === null);
      },
      onError: (error) => {
        if (isApiError(error)) {
          const issues = error.fieldIssues;
          // Validation problems, and a duplicate (409 with the field that must be unique).
          if (issues.length > 0 && (error.code === 'validation_failed' || error.code === 'conflict')) {
            setErrors(errorsFromIssues(issues));
            return;
          }
          if (error.code === 'conflict' && base) {
            const details = staleEditDetailsSchema.safeParse(error.details);
            const current = details.success ? recordSchema.safeParse(details.data.current) : null;
            if (details.success && current?.success) {
              const was = toDraft(base);
              const theirs = toDraft(current.data);
              // Compared as request bodies, so form-only details (row keys, spacing) do not count.
              const [wasBody, theirsBody, yoursBody] = [toBody(was), toBody(theirs), toBody(draft)];
              const fields = Object.keys({ ...wasBody, ...theirsBody, ...yoursBody });
              setStale({
                current: current.data,
                lastChangedBy: details.data.lastChangedBy,
                lastChangedAt: details.data.lastChangedAt,
                rows: fields
                  .map((field) => ({
                    field,
                    was: was[field],
                    theirs: theirs[field],
                    yours: draft[field],
                    theyChanged: !same(wasBody[field], theirsBody[field]),
                    youChanged: !same(wasBody[field], yoursBody[field]),
                  }))
                  .filter((row) => row.theyChanged || row.youChanged),
              });
              return;
            }
          }
        }
        setFormError(error.message);
      },
    });
  }

  /** Puts this form's own changes on top of the version saved since; the user then saves again. */
  function reapply() {
    if (!stale) return;
    const next = { ...toDraft(stale.current) } as Record<string, unknown>;
    for (const row of stale.rows) if (row.youChanged) next[row.field] = row.yours;
    setDraft(next as D);
    setBase(stale.current);
    setStale(null);
    setNotice('Your changes are now applied to the latest saved version. Check them, then save.');
  }

  /** Drops this form's changes and shows the version saved since. */
  function discardMine() {
    if (!stale) return;
    setDraft(toDraft(stale.current));
    setBase(stale.current);
    setStale(null);
    setNotice('Showing the latest saved version; your changes were discarded.');
  }

  return {
    draft,
    set,
    update,
    base,
    isNew: base === null,
    errors,
    formError,
    stale,
    notice,
    saving: save.isPending,
    submit,
    reapply,
    discardMine,
  };
}

export type RecordForm<R extends { id: string; version: number }, D extends Draft> = ReturnType<typeof useRecordForm<R, D>>;
