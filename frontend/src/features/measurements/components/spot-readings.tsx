import { useFieldArray, useFormContext, useWatch } from 'react-hook-form';
import { DENSITY_TYPES, SPOT_PURPOSE_LABELS, type MeasurementSession, type SpotAnalysis } from '@toneledger/common/schemas/measurements';
import type { MeasurementConditions } from '@toneledger/common/domain/colour';
import { NumberInput, SelectInput, useFieldError } from '@/components/form/fields';
import { Button } from '@/components/ui/button';
import { formatDay, formatNumber, formatSigned, formatThreshold } from '@/features/measurements/utils/format';
import { emptySpotEntry, newRow, previewSpot, type SessionFormValues } from '@/features/measurements/utils/session-form';

const DENSITY_TYPES_LIST = DENSITY_TYPES.map((t) => ({ value: t, label: t === 'visual' ? 'Visual' : 'Status A' }));

export interface SpotReadingsProps {
  analysis: SpotAnalysis;
  baselineSession: MeasurementSession | null;
  conditions: MeasurementConditions;
  threshold: number;
}

/** What the readings typed so far would show: mean and spread, and the change against the baseline. */
function Preview({ analysis, baselineSession, conditions, threshold }: Omit<SpotReadingsProps, 'idPrefix'>) {
  const entry = useWatch<SessionFormValues, `spots.${string}`>({ name: `spots.${analysis.spot.id}` }) ?? emptySpotEntry();
  const preview = previewSpot(entry, analysis.baseline, baselineSession, conditions, threshold);
  if (preview.kind === 'empty') return <p className="text-sm text-ink-700">Type a reading to see its change against the baseline.</p>;
  const { summary, density, against } = preview;
  return (
    <div className="num flex flex-col gap-1 text-sm">
      <p>
        Mean L* {formatNumber(summary.mean.L)} · a* {formatNumber(summary.mean.a)} · b* {formatNumber(summary.mean.b)} · n = {summary.n}
        {summary.sd ? (
          <span className="block text-ink-700">
            sd {formatNumber(summary.sd.L)} / {formatNumber(summary.sd.a)} / {formatNumber(summary.sd.b)} · largest ΔE00 between readings{' '}
            {formatNumber(summary.maxPairwiseDeltaE00)}
          </span>
        ) : null}
        {density !== null ? <span className="block text-ink-700">Density D {formatNumber(density, 3)}</span> : null}
      </p>
      {against.kind === 'no_baseline' ? (
        <p className="text-ink-700">This spot has no baseline yet: the first comparable session becomes its baseline.</p>
      ) : against.kind === 'not_comparable' ? (
        <p className="text-sepia-800">{against.reason}</p>
      ) : (
        <p className={against.atOrBeyondThreshold ? 'font-medium text-danger-700' : ''}>
          ΔE00 {formatNumber(against.dE00)} against the baseline of {formatDay(against.baselineOn)}
          {against.atOrBeyondThreshold ? `: at or beyond the noticeable threshold (ΔE00 ${formatThreshold(threshold)})` : `: below the noticeable threshold (ΔE00 ${formatThreshold(threshold)})`}
          <span className="block font-normal text-ink-800">
            ΔL′ {formatSigned(against.dLPrime)} · ΔC′ {formatSigned(against.dCPrime)} · ΔH′ {formatSigned(against.dHPrime)}
            {against.dominant ? ` · mainly ${against.dominant}` : ''}
            {against.densityLossPercent !== null ? ` · density loss ${formatNumber(against.densityLossPercent, 1)} %` : ''}
          </span>
        </p>
      )}
    </div>
  );
}

/** One spot's readings in the session: rows of L*, a*, b*, optional density or reflectance, and the live preview. */
export function SpotReadings(props: SpotReadingsProps) {
  const { spot } = props.analysis;
  const base = `spots.${spot.id}`;
  const { control } = useFormContext<SessionFormValues>();
  const { fields, append, remove } = useFieldArray({ control, name: `spots.${spot.id}.readings` });
  const density = useWatch({ control, name: `spots.${spot.id}.density` }) ?? '';
  const listError = useFieldError(`${base}.readings`);
  const spotError = useFieldError(base);
  const groupError = listError ?? spotError;
  return (
    <fieldset data-field={base} tabIndex={-1} className="rounded border border-paper-300 bg-white p-3">
      <legend className="px-1 font-serif text-base font-semibold">{spot.name}</legend>
      <p className="mb-2 text-xs text-ink-700">{SPOT_PURPOSE_LABELS[spot.purpose]}</p>
      {groupError ? <p className="mb-2 text-xs font-medium text-danger-700">{groupError}</p> : null}
      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
        <div className="flex flex-col gap-2">
          <ol className="flex flex-col gap-2">
            {fields.map((row, index) => (
              // a* and b* are lower case in CIELAB: the usual upper-case field labels would misname them.
              <li key={row.id} className="flex flex-wrap items-end gap-2 [&_label]:normal-case">
                <span className="w-6 pb-2 text-xs text-ink-700" aria-hidden="true">
                  {index + 1}.
                </span>
                {(['L', 'a', 'b'] as const).map((channel) => (
                  <NumberInput key={channel} name={`${base}.readings.${index}.${channel}`} label={`${channel}*`} fieldClassName="w-24" />
                ))}
                {fields.length > 1 ? (
                  <Button size="sm" variant="quiet" onClick={() => remove(index)} aria-label={`Remove reading ${index + 1} at ${spot.name}`}>
                    Remove
                  </Button>
                ) : null}
              </li>
            ))}
          </ol>
          <div>
            <Button size="sm" onClick={() => append(newRow(), { shouldFocus: false })}>
              Add reading
            </Button>
          </div>
          <div className="mt-1 flex flex-wrap items-end gap-2">
            <NumberInput name={`${base}.density`} label="Density" fieldClassName="w-24" />
            <SelectInput name={`${base}.densityType`} label="Density type" empty="Not stated" options={DENSITY_TYPES_LIST} fieldClassName="w-36" />
            <NumberInput
              name={`${base}.reflectance`}
              label="Reflectance (0–1)"
              hint={density.trim() === '' ? 'Density is worked out from it' : undefined}
              fieldClassName="w-36"
            />
          </div>
        </div>
        <div aria-live="polite" className="rounded bg-paper-100 p-3">
          <h4 className="mb-1 font-sans text-xs font-semibold tracking-wide text-ink-700 uppercase">Before saving</h4>
          <Preview {...props} />
        </div>
      </div>
    </fieldset>
  );
}
