import { parseEdtf } from '@toneledger/common/domain/edtf';
import { paperInputSchema, paperSchema, type Paper } from '@toneledger/common/schemas/catalogue';
import { PAPER_BASE, YES_NO_UNKNOWN } from '@toneledger/common/schemas/vocab';
import { SelectField, TextField } from '@/components/ui/field';
import { TextAreaField } from '@/components/ui/text-area-field';
import { useSavePaper } from '@/features/reference/api/save-paper';
import { FormActions, FormMessages } from '@/features/reference/components/form-messages';
import { useRecordForm, type FieldErrors } from '@/features/reference/components/use-record-form';

interface PaperDraft extends Record<string, unknown> {
  manufacturer: string;
  product: string;
  base: string;
  surface: string;
  baseTint: string;
  weight: string;
  opticalBrighteners: string;
  madeDates: string;
  notes: string;
}

export const PAPER_LABELS: Record<string, string> = {
  manufacturer: 'Manufacturer',
  product: 'Product',
  base: 'Base',
  surface: 'Surface',
  baseTint: 'Base tint',
  weight: 'Weight',
  opticalBrighteners: 'Optical brighteners',
  madeDates: 'Made (EDTF)',
  notes: 'Notes',
};

function toDraft(paper: Paper | null): PaperDraft {
  return {
    manufacturer: paper?.manufacturer ?? '',
    product: paper?.product ?? '',
    base: paper?.base ?? 'fibre',
    surface: paper?.surface ?? '',
    baseTint: paper?.baseTint ?? '',
    weight: paper?.weight ?? '',
    opticalBrighteners: paper?.opticalBrighteners ?? 'unknown',
    madeDates: paper?.madeDates ?? '',
    notes: paper?.notes ?? '',
  };
}

function toBody(draft: PaperDraft) {
  return { ...draft, madeDates: draft.madeDates.trim() };
}

/** What the manufacture-dates field means as typed: its reading in words, or why it is not EDTF. */
export function madeDatesFeedback(value: string): { hint?: string; error?: string } {
  const text = value.trim();
  if (!text) return { hint: 'Optional. An EDTF date or interval, e.g. 1962/1975, 196X or 1968~' };
  const parsed = parseEdtf(text);
  return parsed.ok ? { hint: `Reads as: ${parsed.value.display}` } : { error: parsed.error };
}

export function PaperForm({ paper, onSaved, onCancel }: { paper: Paper | null; onSaved: (paper: Paper, created: boolean) => void; onCancel: () => void }) {
  const save = useSavePaper();
  const form = useRecordForm({
    record: paper,
    toDraft,
    toBody,
    schema: paperInputSchema,
    recordSchema: paperSchema,
    save,
    validate: (d): FieldErrors => {
      const error = madeDatesFeedback(d.madeDates).error;
      return error ? { madeDates: error } : {};
    },
    onSaved,
  });
  const { draft, errors } = form;
  const made = madeDatesFeedback(draft.madeDates);
  return (
    <form onSubmit={form.submit} noValidate className="flex flex-col gap-3">
      <TextField
        label="Manufacturer"
        hint="As written on the packet"
        value={draft.manufacturer}
        onChange={(e) => form.set('manufacturer', e.target.value)}
        error={errors.manufacturer}
        maxLength={200}
        required
      />
      <TextField label="Product" value={draft.product} onChange={(e) => form.set('product', e.target.value)} error={errors.product} maxLength={200} required />
      <div className="grid grid-cols-2 gap-3">
        <SelectField label="Base" value={draft.base} onChange={(e) => form.set('base', e.target.value)} error={errors.base}>
          {PAPER_BASE.options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </SelectField>
        <SelectField
          label="Optical brighteners"
          value={draft.opticalBrighteners}
          onChange={(e) => form.set('opticalBrighteners', e.target.value)}
          error={errors.opticalBrighteners}
        >
          {YES_NO_UNKNOWN.options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </SelectField>
        <TextField label="Surface" hint="e.g. glossy, matt, lustre" value={draft.surface} onChange={(e) => form.set('surface', e.target.value)} error={errors.surface} maxLength={100} />
        <TextField label="Base tint" hint="e.g. white, warm white, cream" value={draft.baseTint} onChange={(e) => form.set('baseTint', e.target.value)} error={errors.baseTint} maxLength={100} />
        <TextField label="Weight" hint="e.g. double weight" value={draft.weight} onChange={(e) => form.set('weight', e.target.value)} error={errors.weight} maxLength={100} />
      </div>
      <TextField
        label="Made (EDTF)"
        value={draft.madeDates}
        onChange={(e) => form.set('madeDates', e.target.value)}
        hint={made.hint}
        error={errors.madeDates ?? made.error}
        spellCheck={false}
        maxLength={100}
        className="mono"
      />
      <TextAreaField label="Notes" value={draft.notes} onChange={(e) => form.set('notes', e.target.value)} error={errors.notes} maxLength={5000} />
      <FormMessages
        errors={errors}
        formError={form.formError}
        stale={form.stale}
        notice={form.notice}
        labelFor={(path) => PAPER_LABELS[path] ?? path}
        describe={(field, value) => describePaperValue(field, value)}
        onReapply={form.reapply}
        onDiscard={form.discardMine}
      />
      <FormActions saving={form.saving} onCancel={onCancel} />
    </form>
  );
}

function describePaperValue(field: string, value: unknown): string {
  if (value === '' || value == null) return '(empty)';
  if (field === 'base') return PAPER_BASE.labels[value as keyof typeof PAPER_BASE.labels] ?? String(value);
  if (field === 'opticalBrighteners') return YES_NO_UNKNOWN.labels[value as keyof typeof YES_NO_UNKNOWN.labels] ?? String(value);
  return String(value);
}
