import { LIGHT_RESPONSIVITY } from '@toneledger/common/schemas/vocab';
import { printLightSchema, responsivityOverrideInputSchema, type PrintLight } from '@toneledger/common/schemas/light';
import { SelectInput, TextAreaInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { SubmitCancel } from '@/components/form/submit-cancel';
import { useRecordEdit } from '@/lib/forms/use-record-edit';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useOverrideCategory } from '@/features/light/api/print-light';
import { categoryLabel } from '@/features/light/utils/format';

/** What the controls hold: a category code, or '' for "use the default"; the reason as typed. */
export interface CategoryFormValues {
  category: string;
  reason: string;
  version: number;
}

export function categoryToValues(light: PrintLight): CategoryFormValues {
  return { category: light.categorySource === 'override' ? light.category : '', reason: light.overrideReason ?? '', version: light.version };
}

/** "Use the default" is sent as `category: null`; the schema reads the rest (an empty reason is null). */
export function categoryValuesToBody(values: CategoryFormValues) {
  return { category: values.category === '' ? null : values.category, reason: values.reason, version: values.version };
}

const FIELDS = [
  { key: 'category', label: 'Category' },
  { key: 'reason', label: 'Reason' },
] as const;

/**
 * A conservator sets the print's light category, with the reason it differs from the default, or
 * returns it to the default. Someone else's change in between is shown beside what was typed.
 */
export function CategoryForm({ light, onDone }: { light: PrintLight; onDone: (saved: PrintLight | null) => void }) {
  const save = useOverrideCategory(light.printId);
  const form = useSchemaForm({ schema: responsivityOverrideInputSchema, defaultValues: categoryToValues(light), toBody: categoryValuesToBody });
  const edit = useRecordEdit(form, {
    record: light,
    recordSchema: printLightSchema,
    toValues: categoryToValues,
    fields: FIELDS,
    comparable: (v) => ({ category: v.category, reason: v.reason.trim() }),
    describe: (key, v) => (key === 'category' ? (v.category ? categoryLabel(v.category) : `Use the default (${categoryLabel(light.defaultCategory)})`) : v.reason),
  });

  return (
    <SchemaForm
      form={form}
      edit={edit}
      subject="this print's light category"
      className="gap-3 rounded border border-paper-300 bg-paper-100 p-3"
      aria-label="Change category"
      onValid={(body) =>
        save.mutate(body, {
          onSuccess: (saved) => {
            edit.saved(saved);
            onDone(saved);
          },
          onError: edit.failed,
        })
      }
    >
      <SelectInput
        name="category"
        label="Category"
        hint={`The default for this print's process and toner is ${categoryLabel(light.defaultCategory)}.`}
        options={LIGHT_RESPONSIVITY.options}
        empty={`Use the default (${categoryLabel(light.defaultCategory)})`}
        fieldClassName="max-w-sm"
      />
      <TextAreaInput name="reason" label="Reason" hint="Required when the category differs from the default: why this print is more or less sensitive." rows={3} />
      <SubmitCancel label="Save category" busy={save.isPending} busyLabel="Saving…" onCancel={() => onDone(null)} size="sm" />
    </SchemaForm>
  );
}
