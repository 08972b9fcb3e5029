import { useWatch } from 'react-hook-form';
import { enclosureInputSchema, enclosureSchema, type Enclosure } from '@toneledger/common/schemas/catalogue';
import { PAT_RESULT, YES_NO_UNKNOWN } from '@toneledger/common/schemas/vocab';
import { SchemaForm } from '@/components/form/schema-form';
import { SelectInput, TextAreaInput, TextInput } from '@/components/form/fields';
import { useSaveEnclosure } from '@/features/reference/api/save-enclosure';
import { BUFFERED_HELP, BufferedNote, PAT_HELP } from '@/features/reference/components/enclosure-notes';
import { FormActions } from '@/features/reference/components/form-actions';
import { fieldList } from '@/lib/forms/stale-edit';
import { useRecordForm } from '@/features/reference/components/use-record-form';

type YesNoUnknown = (typeof YES_NO_UNKNOWN.codes)[number];

interface EnclosureValues {
  name: string;
  material: string;
  alkalineBuffered: YesNoUnknown;
  patResult: string;
  notes: string;
}

const LABELS: Record<keyof EnclosureValues, string> = {
  name: 'Name',
  material: 'Material',
  alkalineBuffered: 'Alkaline-buffered',
  patResult: 'Photographic Activity Test',
  notes: 'Notes',
};

export function bufferedToChoice(value: boolean | null): YesNoUnknown {
  return value === true ? 'yes' : value === false ? 'no' : 'unknown';
}

export function choiceToBuffered(choice: YesNoUnknown): boolean | null {
  return choice === 'yes' ? true : choice === 'no' ? false : null;
}

function toValues(enclosure: Enclosure | null): EnclosureValues {
  return {
    name: enclosure?.name ?? '',
    material: enclosure?.material ?? '',
    alkalineBuffered: enclosure ? bufferedToChoice(enclosure.alkalineBuffered) : 'unknown',
    patResult: enclosure?.patResult ?? 'not_tested',
    notes: enclosure?.notes ?? '',
  };
}

/** The body: the yes/no/unknown choice is the contract's true/false/null. */
function toBody(values: EnclosureValues) {
  return { ...values, alkalineBuffered: choiceToBuffered(values.alkalineBuffered) };
}

function describe(key: string, values: EnclosureValues): string {
  if (key === 'alkalineBuffered') return YES_NO_UNKNOWN.labels[values.alkalineBuffered];
  if (key === 'patResult') return PAT_RESULT.labels[values.patResult as keyof typeof PAT_RESULT.labels] ?? values.patResult;
  return String(values[key as keyof EnclosureValues] ?? '');
}

function Buffered() {
  return useWatch<EnclosureValues, 'alkalineBuffered'>({ name: 'alkalineBuffered' }) === 'yes' ? <BufferedNote /> : null;
}

export function EnclosureForm({
  enclosure,
  onSaved,
  onCancel,
}: {
  enclosure: Enclosure | null;
  onSaved: (enclosure: Enclosure, created: boolean) => void;
  onCancel: () => void;
}) {
  const save = useSaveEnclosure();
  const { form, edit, onValid, saving } = useRecordForm({
    record: enclosure,
    schema: enclosureInputSchema,
    recordSchema: enclosureSchema,
    toValues,
    toBody,
    describe,
    fields: fieldList(LABELS),
    save,
    onSaved,
  });
  return (
    <SchemaForm form={form} edit={edit} onValid={onValid} className="gap-3">
      <TextInput name="name" label={LABELS.name} hint="e.g. Four-flap folder, unbuffered" required />
      <TextInput name="material" label={LABELS.material} hint="e.g. cotton rag paper, polyester film, polypropylene" />
      <SelectInput name="alkalineBuffered" label={LABELS.alkalineBuffered} hint={BUFFERED_HELP} options={YES_NO_UNKNOWN.options} />
      <Buffered />
      <SelectInput name="patResult" label={LABELS.patResult} hint={PAT_HELP} options={PAT_RESULT.options} />
      <TextAreaInput name="notes" label={LABELS.notes} />
      <FormActions saving={saving} onCancel={onCancel} />
    </SchemaForm>
  );
}
