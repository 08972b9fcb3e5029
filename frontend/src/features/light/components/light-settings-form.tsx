import { useState } from 'react';
import { useFieldArray, useFormContext } from 'react-hook-form';
import { LIGHT_CATEGORIES } from '@toneledger/common/domain/light-budget';
import { lightSettingsSchema, type LightSettings } from '@toneledger/common/schemas/light';
import { NumberInput, SelectInput, TextAreaInput, useFieldError } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useUpdateLightSettings } from '@/features/light/api/light-settings';
import { categoryLabel } from '@/features/light/utils/format';
import {
  CATEGORY_OPTIONS,
  PROCESS_OPTIONS,
  TONER_OPTIONS,
  lightSettingsToValues,
  lightSettingsValuesToBody,
  settingsLabelFor,
  type LightSettingsValues,
} from '@/features/light/utils/settings-form';

function BudgetFields() {
  return (
    <fieldset className="flex flex-col gap-2">
      <legend className="mb-1 font-serif text-lg">Budgets per category</legend>
      <p className="text-sm text-ink-700">Leave a figure empty for no limit. The annual exposure holds over any 12 months.</p>
      <div className="grid gap-3 md:grid-cols-2">
        {LIGHT_CATEGORIES.map((c) => (
          <fieldset key={c} className="rounded border border-paper-300 bg-white p-3">
            <legend className="px-1 text-sm font-semibold">{categoryLabel(c)}</legend>
            <div className="flex flex-wrap gap-3">
              <NumberInput name={`budgets.${c}.maxLux`} label="Maximum illuminance (lx)" fieldClassName="w-44" />
              <NumberInput name={`budgets.${c}.annualLuxHours`} label="Annual exposure (lx·h)" fieldClassName="w-44" />
            </div>
          </fieldset>
        ))}
      </div>
      <TextAreaInput name="budgetSource" label="Source of the budgets" hint="Shown beside the budget on every print's light panel." rows={3} />
    </fieldset>
  );
}

/** The default category rules, in order: the first whose process and toner match a print gives its category. */
function RulesTable() {
  const { control } = useFormContext<LightSettingsValues>();
  const { fields, append, remove, move } = useFieldArray({ control, name: 'rules' });
  const listError = useFieldError('rules');
  return (
    <fieldset data-field="rules" tabIndex={-1} className="flex flex-col gap-2">
      <legend className="mb-1 font-serif text-lg">Default category rules</legend>
      <p className="text-sm text-ink-700">
        A print takes the category of the first rule that matches its process and its toning. “Any” matches everything. A conservator can
        override a single print with a reason.
      </p>
      {listError ? <p className="text-xs font-medium text-danger-700">{listError}</p> : null}
      <ol className="flex flex-col gap-2">
        {fields.map((row, i) => (
          <li key={row.id} className="flex flex-wrap items-end gap-2 rounded border border-paper-300 bg-white p-2">
            <span className="w-14 pb-2 text-xs text-ink-700">Rule {i + 1}</span>
            <SelectInput name={`rules.${i}.process`} label="Process" options={PROCESS_OPTIONS} empty="Any" fieldClassName="w-56" />
            <SelectInput name={`rules.${i}.tonerClass`} label="Toner" options={TONER_OPTIONS} empty="Any" fieldClassName="w-52" />
            <SelectInput name={`rules.${i}.category`} label="Category" options={CATEGORY_OPTIONS} fieldClassName="w-56" />
            <div className="flex gap-1 pb-0.5">
              <Button size="sm" onClick={() => move(i, i - 1)} disabled={i === 0} aria-label={`Move rule ${i + 1} up`}>
                ↑
              </Button>
              <Button size="sm" onClick={() => move(i, i + 1)} disabled={i === fields.length - 1} aria-label={`Move rule ${i + 1} down`}>
                ↓
              </Button>
              <Button size="sm" onClick={() => remove(i)} disabled={fields.length === 1} aria-label={`Remove rule ${i + 1}`}>
                Remove
              </Button>
            </div>
          </li>
        ))}
      </ol>
      <div>
        <Button size="sm" onClick={() => append({ process: '', tonerClass: '', category: 'medium' })}>
          Add a rule
        </Button>
      </div>
      <SelectInput name="fallbackCategory" label="Category when no rule matches" options={CATEGORY_OPTIONS} fieldClassName="max-w-sm" />
    </fieldset>
  );
}

/** The light settings: budgets with their source, the ordered default rules and the fallback. Administrators change them. */
export function LightSettingsForm({ settings, canManage }: { settings: LightSettings; canManage: boolean }) {
  const update = useUpdateLightSettings();
  const form = useSchemaForm({ schema: lightSettingsSchema, defaultValues: lightSettingsToValues(settings), toBody: lightSettingsValuesToBody });
  const [saved, setSaved] = useState(false);

  return (
    <SchemaForm
      form={form}
      labelFor={settingsLabelFor}
      className="max-w-5xl gap-5"
      onValid={(body) => {
        setSaved(false);
        update.mutate(body, {
          onSuccess: (value) => {
            form.reset(lightSettingsToValues(value));
            setSaved(true);
          },
          onError: form.serverError,
        });
      }}
    >
      <fieldset disabled={!canManage} className="flex flex-col gap-6">
        <BudgetFields />
        <RulesTable />
      </fieldset>
      {canManage ? (
        <div className="flex items-center gap-3">
          <Button type="submit" variant="primary" disabled={update.isPending}>
            Save
          </Button>
          <span role="status" className="text-sm text-ok-700">
            {update.isPending ? 'Saving…' : saved ? 'Settings saved.' : ''}
          </span>
        </div>
      ) : (
        <Notice tone="info">Only administrators change these settings.</Notice>
      )}
    </SchemaForm>
  );
}
