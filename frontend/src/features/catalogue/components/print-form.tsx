import { useQueryClient } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { printInputSchema, printSchema, type Print } from '@toneledger/common/schemas/catalogue';
import { SchemaForm } from '@/components/form/schema-form';
import { Button, buttonClasses } from '@/components/ui/button';
import type { FieldErrors } from '@/lib/forms/field-errors';
import { useMe } from '@/lib/auth';
import { printKeys } from '@/lib/prints-api';
import { changesOnly } from '@/lib/forms/stale-edit';
import { useRecordEdit } from '@/lib/forms/use-record-edit';
import { NOTHING_TO_SAVE, useSchemaForm } from '@/lib/forms/use-schema-form';
import { useEnclosures, useMakers, usePapers } from '@/lib/reference-api';
import { useCatalogueSettings } from '@/lib/settings-api';
import { useCreatePrint } from '@/features/catalogue/api/create-print';
import { useUpdatePrint } from '@/features/catalogue/api/update-print';
import { PrintFormFields, accessionProblem, dateMadeProblem } from '@/features/catalogue/components/print-form-fields';
import {
  PRINT_FORM_FIELDS,
  describeCode,
  emptyPrintValues,
  printToValues,
  printValuesToBody,
  readableBody,
  type PrintField,
  type PrintFormValues,
} from '@/features/catalogue/utils/print-form';

export type PrintFormProps =
  | { mode: 'create'; onSaved: (print: Print) => void; cancelTo: string }
  | { mode: 'edit'; print: Print; onSaved: (print: Print) => void; cancelTo: string };

/** On edit the location is not a field: it changes by a recorded move. */
const editSchema = printInputSchema.omit({ locationId: true });

/**
 * Create or edit a print. Checked on submit with the schema the server uses; every field keeps
 * what was typed whatever the server answers. On edit only changed fields are sent, on top of the
 * version the form opened; if someone saved in between, the stale-edit review shows what changed and
 * lets the person re-apply their edits to the current version.
 */
export function PrintForm(props: PrintFormProps) {
  const opened = props.mode === 'edit' ? props.print : null;
  const settings = useCatalogueSettings();
  const makers = useMakers();
  const papers = usePapers();
  const enclosures = useEnclosures();
  const create = useCreatePrint();
  const update = useUpdatePrint();
  const mutation = props.mode === 'create' ? create : update;
  const pattern = settings.data?.accessionPattern;
  const role = useMe().role;

  const form = useSchemaForm({
    schema: props.mode === 'create' ? printInputSchema : editSchema,
    defaultValues: opened ? printToValues(opened) : emptyPrintValues(),
    toBody: (values: PrintFormValues) => readableBody(printValuesToBody(values), role),
    // The accession pattern (a setting) and EDTF dates are checked here, as they are typed.
    check: (values: PrintFormValues): FieldErrors => {
      const errors: FieldErrors = {};
      const accession = accessionProblem(pattern, values.accessionNumber, edit.base?.accessionNumber ?? null);
      if (accession) errors.accessionNumber = accession;
      const date = dateMadeProblem(values.dateMade);
      if (date) errors.dateMade = date;
      return errors;
    },
  });

  function describe(key: string, values: PrintFormValues): string {
    const value = values[key as PrintField];
    if (value === '') return '';
    if (key === 'makerId') return makers.data?.data.find((m) => m.id === value)?.name ?? value;
    if (key === 'paperId') return papers.data?.data.find((p) => p.id === value)?.label ?? value;
    if (key === 'enclosureId') return enclosures.data?.data.find((e) => e.id === value)?.name ?? value;
    return describeCode(key as PrintField, value);
  }

  const queryClient = useQueryClient();
  const edit = useRecordEdit(form, {
    record: opened, recordSchema: printSchema, toValues: printToValues, fields: PRINT_FORM_FIELDS, describe,
    // The page's heading reads the print from the cache: after the review it names the version the form now edits.
    onCurrent: (current) => queryClient.setQueryData(printKeys.detail(current.id), current),
  });

  function onValid(body: Record<string, unknown>, values: PrintFormValues) {
    mutation.reset();
    if (!edit.base) {
      create.mutate(body as never, { onSuccess: props.onSaved, onError: form.serverError });
      return;
    }
    const changed = edit.changed(values);
    if (changed.length === 0) {
      form.setNotice(NOTHING_TO_SAVE);
      return;
    }
    update.mutate(
      { id: edit.base.id, update: changesOnly(body, changed, edit.base.version) as never },
      {
        onSuccess: props.onSaved,
        onError: edit.failed,
      },
    );
  }

  return (
    <SchemaForm
      form={form}
      edit={edit}
      subject="this print"
      onValid={onValid}
      aria-label={props.mode === 'create' ? 'New print' : 'Edit print'}
      className="max-w-5xl gap-5"
    >
      <PrintFormFields creating={props.mode === 'create'} print={edit.base} pattern={pattern} />
      <div className="flex items-center gap-3">
        <Button type="submit" variant="primary" disabled={mutation.isPending || edit.conflict !== null}>
          {mutation.isPending ? 'Saving…' : 'Save'}
        </Button>
        <Link to={props.cancelTo} className={buttonClasses('quiet', 'md', 'no-underline')}>
          Cancel
        </Link>
      </div>
    </SchemaForm>
  );
}
