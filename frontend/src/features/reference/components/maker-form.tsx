import { makerInputSchema, makerSchema, type Maker } from '@toneledger/common/schemas/catalogue';
import { TextField } from '@/components/ui/field';
import { TextAreaField } from '@/components/ui/text-area-field';
import { useSaveMaker } from '@/features/reference/api/save-maker';
import { FormActions, FormMessages } from '@/features/reference/components/form-messages';
import { useRecordForm } from '@/features/reference/components/use-record-form';

interface MakerDraft extends Record<string, unknown> {
  name: string;
  lifeDates: string;
  notes: string;
}

const LABELS: Record<string, string> = { name: 'Name', lifeDates: 'Life dates', notes: 'Notes' };

function toDraft(maker: Maker | null): MakerDraft {
  return { name: maker?.name ?? '', lifeDates: maker?.lifeDates ?? '', notes: maker?.notes ?? '' };
}

function toBody(draft: MakerDraft) {
  return { name: draft.name, lifeDates: draft.lifeDates, notes: draft.notes };
}

export function MakerForm({ maker, onSaved, onCancel }: { maker: Maker | null; onSaved: (maker: Maker, created: boolean) => void; onCancel: () => void }) {
  const save = useSaveMaker();
  const form = useRecordForm({ record: maker, toDraft, toBody, schema: makerInputSchema, recordSchema: makerSchema, save, onSaved });
  const { draft, errors } = form;
  return (
    <form onSubmit={form.submit} noValidate className="flex flex-col gap-3">
      <TextField label="Name" value={draft.name} onChange={(e) => form.set('name', e.target.value)} error={errors.name} maxLength={300} required />
      <TextField
        label="Life dates"
        hint="As known, e.g. 1921–1998 or active 1950s"
        value={draft.lifeDates}
        onChange={(e) => form.set('lifeDates', e.target.value)}
        error={errors.lifeDates}
        maxLength={100}
      />
      <TextAreaField label="Notes" value={draft.notes} onChange={(e) => form.set('notes', e.target.value)} error={errors.notes} maxLength={5000} />
      <FormMessages
        errors={errors}
        formError={form.formError}
        stale={form.stale}
        notice={form.notice}
        labelFor={(path) => LABELS[path] ?? path}
        onReapply={form.reapply}
        onDiscard={form.discardMine}
      />
      <FormActions saving={form.saving} onCancel={onCancel} />
    </form>
  );
}
