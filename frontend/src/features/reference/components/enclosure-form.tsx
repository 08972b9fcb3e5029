import { enclosureInputSchema, enclosureSchema, type Enclosure } from '@toneledger/common/schemas/catalogue';
import { PAT_RESULT, YES_NO_UNKNOWN } from '@toneledger/common/schemas/vocab';
import { SelectField, TextField } from '@/components/ui/field';
import { TextAreaField } from '@/components/ui/text-area-field';
import { useSaveEnclosure } from '@/features/reference/api/save-enclosure';
import { BUFFERED_HELP, BufferedNote, PAT_HELP } from '@/features/reference/components/enclosure-notes';
import { FormActions, FormMessages } from '@/features/reference/components/form-messages';
import { useRecordForm } from '@/features/reference/components/use-record-form';

type YesNoUnknown = (typeof YES_NO_UNKNOWN.codes)[number];

interface EnclosureDraft extends Record<string, unknown> {
  name: string;
  material: string;
  alkalineBuffered: YesNoUnknown;
  patResult: string;
  notes: string;
}

const LABELS: Record<string, string> = {
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

function toDraft(enclosure: Enclosure | null): EnclosureDraft {
  return {
    name: enclosure?.name ?? '',
    material: enclosure?.material ?? '',
    alkalineBuffered: enclosure ? bufferedToChoice(enclosure.alkalineBuffered) : 'unknown',
    patResult: enclosure?.patResult ?? 'not_tested',
    notes: enclosure?.notes ?? '',
  };
}

function toBody(draft: EnclosureDraft) {
  return { ...draft, alkalineBuffered: choiceToBuffered(draft.alkalineBuffered) };
}

function describe(field: string, value: unknown): string {
  if (value === '' || value == null) return '(empty)';
  if (field === 'alkalineBuffered') return YES_NO_UNKNOWN.labels[value as YesNoUnknown] ?? String(value);
  if (field === 'patResult') return PAT_RESULT.labels[value as keyof typeof PAT_RESULT.labels] ?? String(value);
  return String(value);
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
  const form = useRecordForm({ record: enclosure, toDraft, toBody, schema: enclosureInputSchema, recordSchema: enclosureSchema, save, onSaved });
  const { draft, errors } = form;
  return (
    <form onSubmit={form.submit} noValidate className="flex flex-col gap-3">
      <TextField label="Name" hint="e.g. Four-flap folder, unbuffered" value={draft.name} onChange={(e) => form.set('name', e.target.value)} error={errors.name} maxLength={200} required />
      <TextField
        label="Material"
        hint="e.g. cotton rag paper, polyester film, polypropylene"
        value={draft.material}
        onChange={(e) => form.set('material', e.target.value)}
        error={errors.material}
        maxLength={300}
      />
      <SelectField
        label="Alkaline-buffered"
        hint={BUFFERED_HELP}
        value={draft.alkalineBuffered}
        onChange={(e) => form.set('alkalineBuffered', e.target.value as YesNoUnknown)}
        error={errors.alkalineBuffered}
      >
        {YES_NO_UNKNOWN.options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </SelectField>
      {draft.alkalineBuffered === 'yes' ? <BufferedNote /> : null}
      <SelectField label="Photographic Activity Test" hint={PAT_HELP} value={draft.patResult} onChange={(e) => form.set('patResult', e.target.value)} error={errors.patResult}>
        {PAT_RESULT.options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </SelectField>
      <TextAreaField label="Notes" value={draft.notes} onChange={(e) => form.set('notes', e.target.value)} error={errors.notes} maxLength={2000} />
      <FormMessages
        errors={errors}
        formError={form.formError}
        stale={form.stale}
        notice={form.notice}
        labelFor={(path) => LABELS[path] ?? path}
        describe={describe}
        onReapply={form.reapply}
        onDiscard={form.discardMine}
      />
      <FormActions saving={form.saving} onCancel={onCancel} />
    </form>
  );
}
