import { useId, type FormHTMLAttributes, type ReactNode } from 'react';
import { FormProvider, useFormState, useWatch, type FieldValues } from 'react-hook-form';
import type { z } from 'zod';
import { ErrorSummary, type LabelFor } from '@/components/form/error-summary';
import { SchemaFormContext } from '@/components/form/form-context';
import { StaleEditReview } from '@/components/form/stale-edit-review';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { flattenFormErrors } from '@/lib/forms/field-errors';
import type { RecordEdit } from '@/lib/forms/use-record-edit';
import type { SchemaFormApi } from '@/lib/forms/use-schema-form';

export interface SchemaFormProps<S extends z.ZodType, V extends FieldValues> extends Omit<FormHTMLAttributes<HTMLFormElement>, 'onSubmit'> {
  form: SchemaFormApi<S, V>;
  onValid: (body: z.output<S>, values: V) => unknown;
  /** A person's name for a field path the field's own label does not give (rows of a list). */
  labelFor?: LabelFor;
  /** Maps a form field to the contract's path for its limits, where the two differ. */
  schemaPath?: (name: string) => string;
  /** The edit of a saved record: shows the stale-edit review when someone saved in between. */
  edit?: RecordEdit<{ version: number }, V>;
  /** What the review calls the record: "this print", "this draft". */
  subject?: string;
  /** The title over a failure that belongs to no field. */
  failureTitle?: string;
  children: ReactNode;
}

function Review<V extends FieldValues>({ edit, subject, form }: { edit: RecordEdit<{ version: number }, V>; subject: string; form: SchemaFormApi<z.ZodType, V> }) {
  // The "Yours" column follows the form as the person keeps typing.
  useWatch({ control: form.control });
  if (!edit.conflict) return null;
  return (
    <StaleEditReview
      subject={subject}
      rows={edit.rows(form.getValues())}
      lastChangedBy={edit.conflict.lastChangedBy}
      lastChangedAt={edit.conflict.lastChangedAt}
      currentVersion={edit.conflict.current.version}
      onReapply={edit.reapply}
      onDiscard={edit.discard}
    />
  );
}

function Summary<V extends FieldValues>({ form, labelFor }: { form: SchemaFormApi<z.ZodType, V>; labelFor?: LabelFor }) {
  const { errors } = useFormState({ control: form.control });
  return <ErrorSummary errors={flattenFormErrors(errors)} labelFor={labelFor} focusRequest={form.focusRequest} />;
}

/**
 * A form on a schema form: the stale-edit review, a note, the error summary and a failure that
 * belongs to no field, all above the fields, in that order, for every form alike.
 */
export function SchemaForm<S extends z.ZodType, V extends FieldValues>(props: SchemaFormProps<S, V>) {
  const { form, onValid, labelFor, schemaPath, edit, subject = 'this record', failureTitle = 'Not saved.', children, className = '', ...rest } = props;
  const idPrefix = `f${useId().replace(/[^a-zA-Z0-9_-]/g, '')}`;
  const anyForm = form as unknown as SchemaFormApi<z.ZodType, V>;
  return (
    <FormProvider {...form}>
      <SchemaFormContext.Provider value={{ idPrefix, schema: form.schema, schemaPath }}>
        <form noValidate onSubmit={form.submit(onValid)} className={`flex flex-col ${className}`} {...rest}>
          {edit ? <Review edit={edit} subject={subject} form={anyForm} /> : null}
          {form.notice ? (
            <Notice tone="info" role="status">
              <p>{form.notice}</p>
            </Notice>
          ) : null}
          <Summary form={anyForm} labelFor={labelFor} />
          {form.failure ? <ErrorNotice error={form.failure} title={failureTitle} /> : null}
          {children}
        </form>
      </SchemaFormContext.Provider>
    </FormProvider>
  );
}
