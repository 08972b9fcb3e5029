import { useWatch } from 'react-hook-form';
import { COHORT_FACTORS, type CohortFactorCode } from '@toneledger/common/fields/cohort';
import { NumberInput, SelectInput } from '@/components/form/fields';
import { useLocations } from '@/lib/reference-api';
import { CheckGroup } from '@/features/research/components/check-group';
import { useFactorValues } from '@/features/research/api/research';

const FLAG_OPTIONS = [
  { value: 'yes', label: 'Yes' },
  { value: 'no', label: 'No' },
  { value: 'unknown', label: 'Unknown' },
];

/** The filter control of one factor, by its kind in the factor table. */
export function FactorFilter({ code }: { code: CohortFactorCode }) {
  const factor = COHORT_FACTORS[code];
  const base = `filters.${code}`;
  const unit = 'unit' in factor && factor.unit ? ` (${factor.unit})` : '';
  switch (factor.kind) {
    case 'choice':
      return <CheckGroup name={`${base}.values`} legend={factor.label} options={factor.choices.codes.map((c) => ({ value: c, label: (factor.choices.labels as Record<string, string>)[c] ?? c }))} />;
    case 'flag':
      return <CheckGroup name={`${base}.values`} legend={factor.label} options={FLAG_OPTIONS} />;
    case 'text':
      return <TextFactor code={code} />;
    case 'number':
      return (
        <div className="flex flex-wrap gap-3">
          <NumberInput name={`${base}.min`} label={`${factor.label}: lowest${unit}`} fieldClassName="w-48" />
          <NumberInput name={`${base}.max`} label={`${factor.label}: highest${unit}`} fieldClassName="w-48" />
        </div>
      );
    case 'year':
      return (
        <div className="flex flex-wrap gap-3">
          <NumberInput name={`${base}.fromYear`} label={`${factor.label}: from year`} fieldClassName="w-40" />
          <NumberInput name={`${base}.toYear`} label={`${factor.label}: to year`} fieldClassName="w-40" />
        </div>
      );
    case 'place':
      return <PlaceFactor code={code} />;
  }
}

function TextFactor({ code }: { code: CohortFactorCode }) {
  const values = useFactorValues();
  const chosen = useWatch({ name: `filters.${code}.values` }) as string[];
  const known = values.data?.[code] ?? [];
  // A value in the query the collection no longer holds is kept visible, so it can be unticked.
  const options = [...known.map((v) => ({ value: v.value, label: v.value, count: v.count })), ...chosen.filter((c) => !known.some((k) => k.value === c)).map((c) => ({ value: c, label: c, count: 0 }))];
  if (values.isPending) return <p className="text-sm text-ink-600">Loading the values of {COHORT_FACTORS[code].label}…</p>;
  if (options.length === 0) return <p className="text-sm text-ink-600">No print records a value for {COHORT_FACTORS[code].label}.</p>;
  return <CheckGroup name={`filters.${code}.values`} legend={COHORT_FACTORS[code].label} options={options} hint="Prints in the collection with each value in brackets." />;
}

function PlaceFactor({ code }: { code: CohortFactorCode }) {
  const locations = useLocations();
  return (
    <SelectInput
      name={`filters.${code}.locationId`}
      label={`${COHORT_FACTORS[code].label} (and everything inside it)`}
      empty="Any place"
      options={locations.data?.data.map((l) => ({ value: l.id, label: l.pathLabel }))}
      fieldClassName="w-80"
    />
  );
}
