import { makerInputSchema, makerSchema, type Maker } from '@toneledger/common/schemas/catalogue';
import { SchemaForm } from '@/components/form/schema-form';
import { TextAreaInput, TextInput } from '@/components/form/fields';
import { useSaveMaker } from '@/features/reference/api/save-maker';
import { FormActions } from '@/features/reference/components/form-actions';
import { fieldList } from '@/lib/forms/stale-edit';
import { useRecordForm } from '@/features/reference/components/use-record-form';

const LABELS = { name: 'Name', lifeDates: 'Life dates', notes: 'Notes' };

function toValues(maker: Maker | null) {
  return { name: maker?.name ?? '', lifeDates: maker?.lifeDates ?? '', notes: maker?.notes ?? '' };
}

export function MakerForm({ maker, onSaved, onCancel }: { maker: Maker | null; onSaved: (maker: Maker, created: boolean) => void; onCancel: () => void }) {
  const save = useSaveMaker();
  const { form, edit, onValid, saving } = useRecordForm({ record: maker, schema: makerInputSchema, recordSchema: makerSchema, toValues, fields: fieldList(LABELS), save, onSaved });
  return (
    <SchemaForm form={form} edit={edit} onValid={onValid} className="gap-3">
      <TextInput name="name" label={LABELS.name} required />
      <TextInput name="lifeDates" label={LABELS.lifeDates} hint="As known, e.g. 1921–1998 or active 1950s" />
      <TextAreaInput name="notes" label={LABELS.notes} />
      <FormActions saving={saving} onCancel={onCancel} />
    </SchemaForm>
  );
}
