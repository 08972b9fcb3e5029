import { useState } from 'react';
import { climateSettingsSchema, type ClimateSettings } from '@toneledger/common/schemas/climate';
import { NumberInput, TextAreaInput } from '@/components/form/fields';
import { SchemaForm } from '@/components/form/schema-form';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { useSchemaForm } from '@/lib/forms/use-schema-form';
import { useUpdateClimateSettings } from '@/features/climate/api/climate';
import { climateSettingsToValues, climateSettingsValuesToBody } from '@/features/climate/utils/settings-form';

/** Targets with their source, the reference climate and isoperm constants with theirs, and the excursion and gap lengths. Administrators change them. */
export function ClimateSettingsForm({ settings, canManage }: { settings: ClimateSettings; canManage: boolean }) {
  const update = useUpdateClimateSettings();
  const form = useSchemaForm({ schema: climateSettingsSchema, defaultValues: climateSettingsToValues(settings), toBody: climateSettingsValuesToBody });
  const [saved, setSaved] = useState(false);
  return (
    <SchemaForm
      form={form}
      className="max-w-4xl gap-5"
      onValid={(body) => {
        setSaved(false);
        update.mutate(body, {
          onSuccess: (value) => { form.reset(climateSettingsToValues(value)); setSaved(true); },
          onError: form.serverError,
        });
      }}
    >
      <fieldset disabled={!canManage} className="flex flex-col gap-6">
        <fieldset className="flex flex-col gap-2">
          <legend className="mb-1 font-serif text-lg">Target ranges</legend>
          <div className="flex flex-wrap gap-3">
            <NumberInput name="target.temperatureMinC" label="Lowest temperature (°C)" fieldClassName="w-44" />
            <NumberInput name="target.temperatureMaxC" label="Highest temperature (°C)" fieldClassName="w-44" />
            <NumberInput name="target.rhMinPercent" label="Lowest RH (%)" fieldClassName="w-36" />
            <NumberInput name="target.rhMaxPercent" label="Highest RH (%)" fieldClassName="w-36" />
          </div>
          <TextAreaInput name="targetSource" label="Source of the targets" hint="Shown beside the figures of every location." rows={3} />
        </fieldset>
        <fieldset className="flex flex-col gap-2">
          <legend className="mb-1 font-serif text-lg">Relative permanence (isoperms)</legend>
          <div className="flex flex-wrap gap-3">
            <NumberInput name="reference.temperatureC" label="Reference temperature (°C)" fieldClassName="w-48" />
            <NumberInput name="reference.rhPercent" label="Reference RH (%)" fieldClassName="w-40" />
            <NumberInput name="activationEnergyKjMol" label="Activation energy Ea (kJ/mol)" fieldClassName="w-52" />
            <NumberInput name="rhExponent" label="RH exponent" fieldClassName="w-32" />
          </div>
          <TextAreaInput name="permanenceSource" label="Source of the model and its constants" rows={3} />
        </fieldset>
        <fieldset className="flex flex-col gap-2">
          <legend className="mb-1 font-serif text-lg">Excursions and gaps</legend>
          <div className="flex flex-wrap gap-3">
            <NumberInput name="briefExcursionMinutes" label="Brief below (minutes)" hint="Shorter excursions are listed, marked brief, and not counted on the rooms page." fieldClassName="w-64" />
            <NumberInput name="gapMinutes" label="Gap after (minutes)" hint="A longer time between readings is a gap, counted neither in nor out." fieldClassName="w-64" />
          </div>
        </fieldset>
      </fieldset>
      {canManage ? (
        <div className="flex items-center gap-3">
          <Button type="submit" variant="primary" disabled={update.isPending}>Save</Button>
          <span role="status" className="text-sm text-ok-700">{update.isPending ? 'Saving…' : saved ? 'Settings saved.' : ''}</span>
        </div>
      ) : (
        <Notice tone="info">Only administrators change these settings.</Notice>
      )}
    </SchemaForm>
  );
}
