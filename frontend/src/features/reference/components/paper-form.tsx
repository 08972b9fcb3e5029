import { useWatch } from 'react-hook-form';
import { parseEdtf } from '@toneledger/common/domain/edtf';
import { paperInputSchema, paperSchema, type Paper } from '@toneledger/common/schemas/catalogue';
import { PAPER_BASE, YES_NO_UNKNOWN } from '@toneledger/common/schemas/vocab';
import { SchemaForm } from '@/components/form/schema-form';
import { SelectInput, TextAreaInput, TextInput } from '@/components/form/fields';
import { useSavePaper } from '@/features/reference/api/save-paper';
import { FormActions } from '@/features/reference/components/form-actions';
import type { FieldErrors } from '@/lib/forms/field-errors';
import { fieldList } from '@/lib/forms/stale-edit';
import { useRecordForm } from '@/features/reference/components/use-record-form';

interface PaperValues {
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

const LABELS: Record<keyof PaperValues, string> = {
  manufacturer: 'Manufacturer',
  product: 'Product',
  base: 'Base',
  opticalBrighteners: 'Optical brighteners',
  surface: 'Surface',
  baseTint: 'Base tint',
  weight: 'Weight',
  madeDates: 'Made (EDTF)',
  notes: 'Notes',
};

function toValues(paper: Paper | null): PaperValues {
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

/** What the manufacture-dates field means as typed: its reading in words, or why it is not EDTF. */
export function madeDatesFeedback(value: string): { hint?: string; error?: string } {
  const text = value.trim();
  if (!text) return { hint: 'Optional. An EDTF date or interval, e.g. 1962/1975, 196X or 1968~' };
  const parsed = parseEdtf(text);
  return parsed.ok ? { hint: `Reads as: ${parsed.value.display}` } : { error: parsed.error };
}

function check(values: PaperValues): FieldErrors {
  const error = madeDatesFeedback(values.madeDates).error;
  return error ? { madeDates: error } : {};
}

function describe(key: string, values: PaperValues): string {
  if (key === 'base') return PAPER_BASE.labels[values.base as keyof typeof PAPER_BASE.labels] ?? values.base;
  if (key === 'opticalBrighteners') return YES_NO_UNKNOWN.labels[values.opticalBrighteners as keyof typeof YES_NO_UNKNOWN.labels] ?? values.opticalBrighteners;
  return values[key as keyof PaperValues] ?? '';
}

function MadeDates() {
  const made = madeDatesFeedback(useWatch<PaperValues, 'madeDates'>({ name: 'madeDates' }) ?? '');
  return <TextInput name="madeDates" label={LABELS.madeDates} hint={made.hint} liveError={made.error} spellCheck={false} className="mono" />;
}

export function PaperForm({ paper, onSaved, onCancel }: { paper: Paper | null; onSaved: (paper: Paper, created: boolean) => void; onCancel: () => void }) {
  const save = useSavePaper();
  const { form, edit, onValid, saving } = useRecordForm({
    record: paper,
    schema: paperInputSchema,
    recordSchema: paperSchema,
    toValues,
    check,
    describe,
    fields: fieldList(LABELS),
    save,
    onSaved,
  });
  return (
    <SchemaForm form={form} edit={edit} onValid={onValid} className="gap-3">
      <TextInput name="manufacturer" label={LABELS.manufacturer} hint="As written on the packet" required />
      <TextInput name="product" label={LABELS.product} required />
      <div className="grid grid-cols-2 gap-3">
        <SelectInput name="base" label={LABELS.base} options={PAPER_BASE.options} />
        <SelectInput name="opticalBrighteners" label={LABELS.opticalBrighteners} options={YES_NO_UNKNOWN.options} />
        <TextInput name="surface" label={LABELS.surface} hint="e.g. glossy, matt, lustre" />
        <TextInput name="baseTint" label={LABELS.baseTint} hint="e.g. white, warm white, cream" />
        <TextInput name="weight" label={LABELS.weight} hint="e.g. double weight" />
      </div>
      <MadeDates />
      <TextAreaInput name="notes" label={LABELS.notes} />
      <FormActions saving={saving} onCancel={onCancel} />
    </SchemaForm>
  );
}
