import { ACQUISITION_FIELDS, ENTRY_FIELDS, acquisitionLabelOf, entryLabelOf } from '@toneledger/common/fields/procedures';
import {
  acquisitionInputSchema, acquisitionSchema, entryInputSchema, entrySchema, type Acquisition, type ObjectEntry,
} from '@toneledger/common/schemas/acquisitions';
import { ACQUISITION_METHOD, ENTRY_REASON } from '@toneledger/common/schemas/procedure-vocab';
import { DateInput, NumberInput, SelectInput, TextAreaInput, TextInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { SubmitCancel } from '@/components/form/submit-cancel';
import { changesOnly } from '@/lib/forms/stale-edit';
import { useRecordEdit } from '@/lib/forms/use-record-edit';
import { NOTHING_TO_SAVE, useSchemaForm } from '@/lib/forms/use-schema-form';
import { useUpdateAcquisition, useUpdateEntry } from '@/features/acquisitions/api';

const blank = (v: string | null) => v ?? '';

/** What the entry form's controls hold: text, codes, '' for empty. */
export function entryToValues(e: ObjectEntry) {
  return {
    enteredOn: e.enteredOn, depositor: e.depositor, depositorContact: blank(e.depositorContact), reason: e.reason as string,
    objectCount: String(e.objectCount), objectsDescription: e.objectsDescription, returnBy: blank(e.returnBy), notes: blank(e.notes),
  };
}

/** What the acquisition form's controls hold (the entry it follows is not changed here). */
export function acquisitionToValues(a: Acquisition) {
  return {
    source: a.source, method: a.method as string, approvedOn: blank(a.approvedOn), acquiredOn: a.acquiredOn,
    titleDocument: blank(a.titleDocument), funds: blank(a.funds), notes: blank(a.notes),
  };
}

const ENTRY_REVIEW = ENTRY_FIELDS.map((f) => ({ key: f.key, label: f.label }));
const ACQUISITION_REVIEW = ACQUISITION_FIELDS.map((f) => ({ key: f.key, label: f.label }));

/**
 * Edits an object entry: checked whole with the create schema, sent as the changed fields with the
 * version the form opened (PATCH), so a change saved by someone else in between is reviewed, not overwritten.
 */
export function EntryEditForm({ entry, onDone }: { entry: ObjectEntry; onDone: () => void }) {
  const save = useUpdateEntry();
  const form = useSchemaForm({ schema: entryInputSchema, defaultValues: entryToValues(entry) });
  const edit = useRecordEdit(form, {
    record: entry, recordSchema: entrySchema, toValues: entryToValues, fields: ENTRY_REVIEW,
    describe: (key, v) => (key === 'reason' ? ENTRY_REASON.labels[v.reason as keyof typeof ENTRY_REASON.labels] ?? v.reason : String(v[key as keyof typeof v] ?? '')),
  });
  return (
    <SchemaForm
      form={form}
      edit={edit}
      subject={`entry ${entry.entryNumber}`}
      failureTitle="The entry was not saved."
      aria-label={`Edit entry ${entry.entryNumber}`}
      className="my-3 gap-3 rounded border border-paper-300 bg-white p-4 print:hidden"
      onValid={(body, values) => {
        const base = edit.base ?? entry;
        const changed = edit.changed(values);
        if (changed.length === 0) { form.setNotice(NOTHING_TO_SAVE); return; }
        save.mutate({ id: entry.id, body: changesOnly(body, changed, base.version) as never }, { onSuccess: (saved) => { edit.saved(saved); onDone(); }, onError: edit.failed });
      }}
    >
      <h2 className="text-lg">Edit entry {entry.entryNumber}</h2>
      <p className="text-sm text-ink-700">The entry number stays; the date of entry stays in its year.</p>
      <DateInput name="enteredOn" label={entryLabelOf('enteredOn')} />
      <TextInput name="depositor" label={entryLabelOf('depositor')} />
      <TextAreaInput name="depositorContact" label={entryLabelOf('depositorContact')} rows={2} />
      <SelectInput name="reason" label={entryLabelOf('reason')} options={ENTRY_REASON.options} />
      <NumberInput name="objectCount" label={entryLabelOf('objectCount')} inputMode="numeric" />
      <TextAreaInput name="objectsDescription" label={entryLabelOf('objectsDescription')} rows={3} />
      <DateInput name="returnBy" label={entryLabelOf('returnBy')} />
      <TextAreaInput name="notes" label={entryLabelOf('notes')} rows={2} />
      <SubmitCancel label="Save the entry" busy={save.isPending} busyLabel="Saving…" onCancel={onDone} />
    </SchemaForm>
  );
}

/** Edits an acquisition the same way (changed fields and the version, through PATCH). */
export function AcquisitionEditForm({ acquisition, onDone }: { acquisition: Acquisition; onDone: () => void }) {
  const save = useUpdateAcquisition();
  const form = useSchemaForm({ schema: acquisitionInputSchema, defaultValues: acquisitionToValues(acquisition) });
  const edit = useRecordEdit(form, {
    record: acquisition, recordSchema: acquisitionSchema, toValues: acquisitionToValues, fields: ACQUISITION_REVIEW,
    describe: (key, v) => (key === 'method' ? ACQUISITION_METHOD.labels[v.method as keyof typeof ACQUISITION_METHOD.labels] ?? v.method : String(v[key as keyof typeof v] ?? '')),
  });
  return (
    <SchemaForm
      form={form}
      edit={edit}
      subject="this acquisition"
      failureTitle="The acquisition was not saved."
      aria-label="Edit acquisition"
      className="mt-2 gap-3"
      onValid={(body, values) => {
        const base = edit.base ?? acquisition;
        const changed = edit.changed(values);
        if (changed.length === 0) { form.setNotice(NOTHING_TO_SAVE); return; }
        save.mutate({ id: acquisition.id, body: changesOnly(body, changed, base.version) as never }, { onSuccess: (saved) => { edit.saved(saved); onDone(); }, onError: edit.failed });
      }}
    >
      <TextInput name="source" label={acquisitionLabelOf('source')} />
      <SelectInput name="method" label={acquisitionLabelOf('method')} options={ACQUISITION_METHOD.options} />
      <DateInput name="approvedOn" label={acquisitionLabelOf('approvedOn')} />
      <DateInput name="acquiredOn" label={acquisitionLabelOf('acquiredOn')} />
      <TextInput name="titleDocument" label={acquisitionLabelOf('titleDocument')} />
      <TextInput name="funds" label={acquisitionLabelOf('funds')} />
      <TextAreaInput name="notes" label={acquisitionLabelOf('notes')} rows={2} />
      <SubmitCancel label="Save the acquisition" busy={save.isPending} busyLabel="Saving…" onCancel={onDone} size="sm" />
    </SchemaForm>
  );
}
