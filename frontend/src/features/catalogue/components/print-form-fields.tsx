import { useMemo } from 'react';
import { useFormContext, useWatch } from 'react-hook-form';
import { accessionRule, checkAccession } from '@toneledger/common/domain/accession';
import { CURRENCIES } from '@toneledger/common/domain/currencies';
import { RIGHTS_CHOICES, RIGHTS_GROUP_LABELS, rightsLabel, type RightsGroup } from '@toneledger/common/domain/rights';
import { can } from '@toneledger/common/domain/roles';
import { parseEdtf } from '@toneledger/common/domain/edtf';
import type { Enclosure, Print } from '@toneledger/common/schemas/catalogue';
import { PAT_RESULT, PROCESS, STATUS, SUPPORT } from '@toneledger/common/schemas/vocab';
import { NumberInput, SelectInput, TextAreaInput, TextInput, useFieldError } from '@/components/form/fields';
import { useFieldId } from '@/components/form/form-context';
import { useMe } from '@/lib/auth';
import { useEnclosures, useLocations, useMakers, usePapers } from '@/lib/reference-api';
import { WarningsPanel } from '@/features/catalogue/components/warnings-panel';
import { edtfSummary } from '@/features/catalogue/utils/format';
import { FIELD_LABELS as L, type PrintFormValues } from '@/features/catalogue/utils/print-form';
import { previewWarnings } from '@/features/catalogue/utils/warnings';

const NOT_RECORDED = 'Not recorded';
/** The valuation currencies (ISO 4217) as the select offers them: "GBP · Pound Sterling". */
const CURRENCY_OPTIONS = CURRENCIES.map((c) => ({ value: c.code, label: `${c.code} · ${c.name}` }));
const box = 'grid gap-4 rounded border border-paper-300 bg-white p-4';
const legend = 'px-1 font-serif text-lg font-semibold';

function bufferingText(value: boolean | null): string {
  return value === true ? 'alkaline-buffered' : value === false ? 'unbuffered' : 'buffering unknown';
}

const RIGHTS_GROUPS = Object.keys(RIGHTS_GROUP_LABELS) as RightsGroup[];

/**
 * The rights statement: the Creative Commons licences and public-domain tools and the
 * RightsStatements.org statements, by their plain labels (the value is the URI the manifest carries).
 * A saved URI that is not one of the choices (an older licence from an import) stays offered as it is.
 */
function RightsSelect() {
  const value = (useWatch({ name: 'rights' }) as string | undefined) ?? '';
  const listed = value === '' || RIGHTS_CHOICES.some((c) => c.uri === value);
  return (
    <SelectInput name="rights" label={L.rights} empty={NOT_RECORDED} hint="Shown to IIIF viewers with the credit line">
      {listed ? null : <option value={value}>{rightsLabel(value)}</option>}
      {RIGHTS_GROUPS.map((group) => (
        <optgroup key={group} label={RIGHTS_GROUP_LABELS[group]}>
          {RIGHTS_CHOICES.filter((c) => c.group === group).map((c) => (
            <option key={c.uri} value={c.uri}>
              {c.label}
            </option>
          ))}
        </optgroup>
      ))}
    </SelectInput>
  );
}

/** The accession number against the pattern from the settings, as typed (only when it differs from the saved one). */
export function accessionProblem(pattern: string | undefined, value: string, saved: string | null): string | null {
  if (!pattern || value.trim() === '' || value === saved) return null;
  const check = checkAccession(pattern, value);
  return check.ok ? null : check.message;
}

/** A date made that is not EDTF, in words. */
export function dateMadeProblem(value: string): string | null {
  const edtf = value.trim() === '' ? null : parseEdtf(value.trim());
  return edtf && !edtf.ok ? `Not a date this catalogue can read: ${edtf.error}` : null;
}

function Identification({ pattern, savedAccession }: { pattern: string | undefined; savedAccession: string | null }) {
  const makers = useMakers();
  const [accession, dateMade] = useWatch<PrintFormValues, ['accessionNumber', 'dateMade']>({ name: ['accessionNumber', 'dateMade'] });
  const accessionError = useFieldError('accessionNumber');
  const dateError = useFieldError('dateMade');
  const dateId = useFieldId('dateMade');
  const example = useMemo(() => {
    try {
      return pattern ? accessionRule(pattern).example : null;
    } catch {
      return null;
    }
  }, [pattern]);
  const live = accessionProblem(pattern, accession ?? '', savedAccession);
  const edtf = (dateMade ?? '').trim() === '' ? null : parseEdtf((dateMade ?? '').trim());
  return (
    <fieldset className={`${box} sm:grid-cols-2`}>
      <legend className={legend}>Identification</legend>
      <div className="flex flex-col gap-1">
        <TextInput
          name="accessionNumber"
          label={L.accessionNumber}
          hint={pattern ? `Pattern ${pattern}${example ? `, for example ${example}` : ''}` : undefined}
          className="mono"
          autoComplete="off"
          required
        />
        <p aria-live="polite" className="text-xs text-sepia-800">
          {live && !accessionError ? live : ''}
        </p>
      </div>
      <TextInput name="title" label={L.title} required />
      <SelectInput name="makerId" label={L.makerId} empty={NOT_RECORDED}>
        {makers.data?.data.map((m) => (
          <option key={m.id} value={m.id}>
            {m.name}
            {m.lifeDates ? ` (${m.lifeDates})` : ''}
          </option>
        ))}
      </SelectInput>
      <div className="flex flex-col gap-1">
        <TextInput
          name="dateMade"
          label={L.dateMade}
          hint="EDTF: 1968, 1968-04, 1968-04~ (about), 1971? (uncertain), 196X (1960s), 1964/1969"
          aria-describedby={`${dateError ? `${dateId}-error` : `${dateId}-hint`} ${dateId}-preview`}
          className="mono"
          autoComplete="off"
        />
        <p id={`${dateId}-preview`} aria-live="polite" className={`text-xs ${edtf && !edtf.ok ? 'text-danger-700' : 'text-ink-800'}`}>
          {/* A refused date is said once: by the field's error after a save, by this line while typing before it. */}
          {edtf ? (edtf.ok ? <>Reads as: {edtfSummary(edtf)}</> : dateError ? '' : edtf.error) : ''}
        </p>
      </div>
    </fieldset>
  );
}

function Materials() {
  const papers = usePapers();
  return (
    <fieldset className={`${box} sm:grid-cols-2 lg:grid-cols-3`}>
      <legend className={legend}>Making and materials</legend>
      <SelectInput name="process" label={L.process} options={PROCESS.options} />
      <SelectInput name="support" label={L.support} empty={NOT_RECORDED} options={SUPPORT.options} />
      <SelectInput name="paperId" label={L.paperId} empty={NOT_RECORDED} options={papers.data?.data.map((p) => ({ value: p.id, label: p.label }))} />
      <SelectInput name="status" label={L.status} options={STATUS.options} />
    </fieldset>
  );
}

const DIMENSIONS = ['imageHeightMm', 'imageWidthMm', 'sheetHeightMm', 'sheetWidthMm', 'mountHeightMm', 'mountWidthMm'] as const;

function Housing({ creating, print, enclosures }: { creating: boolean; print: Print | null; enclosures: Enclosure[] }) {
  const locations = useLocations(undefined, creating);
  const { control } = useFormContext<PrintFormValues>();
  const [process, enclosureId] = useWatch({ control, name: ['process', 'enclosureId'] });
  const warnings = previewWarnings({ process, enclosureId, enclosures, steps: print?.steps ?? [] });
  return (
    <fieldset className={`${box} lg:grid-cols-2`}>
      <legend className={legend}>Housing</legend>
      <div className="flex flex-col gap-4">
        <SelectInput name="enclosureId" label={L.enclosureId} empty={NOT_RECORDED}>
          {enclosures.map((e) => (
            <option key={e.id} value={e.id}>
              {e.name} — {bufferingText(e.alkalineBuffered)}, PAT {PAT_RESULT.labels[e.patResult].toLowerCase()}
            </option>
          ))}
        </SelectInput>
        {creating ? (
          <SelectInput
            name="locationId"
            label={L.locationId}
            hint="Where the print is placed first; recorded as its first movement."
            empty={NOT_RECORDED}
            options={locations.data?.data.map((l) => ({ value: l.id, label: l.pathLabel }))}
          />
        ) : (
          <p className="text-sm text-ink-700">
            Location: {print?.location?.pathLabel ?? 'not recorded'}. To change it, use Move on the print's page, so the movement is recorded.
          </p>
        )}
      </div>
      <WarningsPanel
        title="Warnings preview"
        warnings={warnings}
        live
        intro={
          creating
            ? 'Worked out as you choose, with the rules applied on save. Toner classes come from the process history, which is added after the print is saved.'
            : "Worked out as you choose, with the rules applied on save, using this print's process history."
        }
        empty="No warnings with these choices."
      />
    </fieldset>
  );
}

/** The print form's fields, in their groups; values, checks and saving are the form's (print-form.tsx). */
export function PrintFormFields({ creating, print, pattern }: { creating: boolean; print: Print | null; pattern: string | undefined }) {
  const enclosures = useEnclosures();
  const valuation = can(useMe().role, 'valuation.read');
  return (
    <>
      <Identification pattern={pattern} savedAccession={print?.accessionNumber ?? null} />
      <Materials />
      <fieldset className={`${box} sm:grid-cols-2 lg:grid-cols-3`}>
        <legend className={legend}>Dimensions (mm, height × width)</legend>
        {DIMENSIONS.map((field) => (
          <NumberInput key={field} name={field} label={L[field]} />
        ))}
      </fieldset>
      <Housing creating={creating} print={print} enclosures={enclosures.data?.data ?? []} />
      <fieldset className={box}>
        <legend className={legend}>Inscriptions, provenance and credit</legend>
        <TextAreaInput name="inscriptions" label={L.inscriptions} />
        <TextAreaInput name="provenance" label={L.provenance} />
        <TextInput name="creditLine" label={L.creditLine} />
        <RightsSelect />
      </fieldset>
      <fieldset className={`${box} sm:grid-cols-2`}>
        <legend className={legend}>Staff only</legend>
        <p className="text-xs text-ink-700 sm:col-span-2">
          {valuation ? 'Staff notes are not shown to viewers; the valuation only to registrars and administrators.' : 'Staff notes are not shown to viewers.'}
        </p>
        <TextAreaInput name="staffNotes" label={L.staffNotes} fieldClassName="sm:col-span-2" />
        {valuation ? (
          <>
            <NumberInput name="valuationAmount" label={L.valuationAmount} />
            <SelectInput name="valuationCurrency" label={L.valuationCurrency} options={CURRENCY_OPTIONS} empty={NOT_RECORDED} />
          </>
        ) : null}
      </fieldset>
    </>
  );
}
