import { useState, type BaseSyntheticEvent } from 'react';
import { useForm, type DefaultValues, type FieldError, type FieldValues, type Resolver, type UseFormReturn } from 'react-hook-form';
import { toNestErrors } from '@hookform/resolvers';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { applyFieldErrors, fieldIssuesOf, flattenFormErrors, serverFieldErrors, type FieldErrors } from '@/lib/forms/field-errors';

export interface SchemaFormOptions<S extends z.ZodType, V extends FieldValues> {
  /** The contract's request schema: the same one the server validates with. */
  schema: S;
  /** What the controls hold when the form opens (text in text boxes, codes in selects). */
  defaultValues: V;
  /**
   * The form's values as the request body, where the controls hold something the schema does not
   * take as it is (a yes/no/unknown choice for a boolean, rows the form keeps but does not send).
   * Text to number and empty to null are the schema's work (its preprocess and coerce).
   */
  toBody?: (values: V) => unknown;
  /** A body path as the form field that shows it, where the two differ (e.g. rows left out of the body). */
  fieldFor?: (path: string, values: V) => string;
  /**
   * Checks the schema cannot make in the browser (a pattern from the settings, an EDTF date), or a
   * plainer word for a field the schema names only as a record id: field errors, empty when fine.
   * They come before the schema's message for the same field.
   */
  check?: (values: V) => FieldErrors;
}

export interface SchemaFormApi<S extends z.ZodType, V extends FieldValues> extends UseFormReturn<V, unknown, z.output<S>> {
  schema: S;
  /** A note shown above the form (nothing to save, re-applied on a newer version…). */
  notice: string | null;
  setNotice: (notice: string | null) => void;
  /** A failure that belongs to no field (the server unreachable, refused), shown with its request id. */
  failure: unknown;
  setFailure: (failure: unknown) => void;
  /** Grows each time the error summary should take focus. */
  focusRequest: number;
  /** A submit handler: checks with the schema, then calls `onValid` with the request body and the form's values. */
  submit: (onValid: (body: z.output<S>, values: V) => unknown) => (event?: BaseSyntheticEvent) => Promise<void>;
  /** Shows field errors (from a check outside the schema, or the server) and moves focus to the summary. */
  showErrors: (errors: FieldErrors) => void;
  /** Puts a failed request where it belongs: its field issues on their fields, anything else as the failure. */
  serverError: (error: unknown) => void;
}

/**
 * A form on the contract's own schema: react-hook-form with the zod resolver. The values the
 * controls hold go through `toBody` (when given) and the schema; the schema's parsed output is what
 * `submit` hands over, so a form never converts or checks fields by itself. Problems come back in the
 * product's words (see common/src/schemas/messages.ts), one per field, and clear once the field is
 * corrected (the form checks again on each change after the first submit).
 */
export function useSchemaForm<S extends z.ZodType, V extends FieldValues>(options: SchemaFormOptions<S, V>): SchemaFormApi<S, V> {
  const { schema, toBody, fieldFor, check } = options;
  const [notice, setNotice] = useState<string | null>(null);
  const [failure, setFailure] = useState<unknown>(null);
  const [focusRequest, setFocusRequest] = useState(0);

  const zod = zodResolver(schema as never, undefined, { mode: 'sync' }) as unknown as Resolver<FieldValues, unknown, z.output<S>>;
  const resolver: Resolver<V, unknown, z.output<S>> = async (values, context, resolverOptions) => {
    // Everything is read from the values as they are now: a later keystroke must not change this check.
    const body = (toBody ? toBody(values) : structuredClone(values)) as FieldValues;
    const extra = check?.(values) ?? {};
    const result = await zod(body, context, resolverOptions as never);
    if (!fieldFor && Object.keys(extra).length === 0) return result as never;
    // The form's own checks say more than the schema about the same field, so they come first.
    const found: FieldErrors = { ...extra };
    for (const [path, message] of Object.entries(flattenFormErrors(result.errors))) {
      const field = fieldFor ? fieldFor(path, values) : path;
      if (!(field in found)) found[field] = message;
    }
    if (Object.keys(found).length === 0) return result as never;
    const flat = Object.fromEntries(Object.entries(found).map(([path, message]) => [path, { type: 'validate', message } satisfies FieldError]));
    return { values: {}, errors: toNestErrors(flat, resolverOptions as never) } as never;
  };

  const form = useForm<V, unknown, z.output<S>>({
    defaultValues: options.defaultValues as DefaultValues<V>,
    resolver,
    mode: 'onSubmit',
    reValidateMode: 'onChange',
    shouldFocusError: false,
  });

  const requestFocus = () => setFocusRequest((n) => n + 1);

  function showErrors(errors: FieldErrors) {
    applyFieldErrors(form.setError, errors);
    requestFocus();
  }

  return {
    ...form,
    schema,
    notice,
    setNotice,
    failure,
    setFailure,
    focusRequest,
    submit: (onValid) => (event) => {
      setNotice(null);
      setFailure(null);
      return form.handleSubmit(
        async (body) => {
          await onValid(body, form.getValues());
        },
        requestFocus,
      )(event);
    },
    showErrors,
    serverError: (error) => {
      const issues = fieldIssuesOf(error);
      if (issues.length > 0) {
        const values = form.getValues();
        showErrors(serverFieldErrors(issues, fieldFor ? (path) => fieldFor(path, values) : undefined));
        return;
      }
      setFailure(error);
    },
  };
}

/** What an edit form says when nothing differs from the record it opened. */
export const NOTHING_TO_SAVE = 'Nothing to save: no field has changed.';
