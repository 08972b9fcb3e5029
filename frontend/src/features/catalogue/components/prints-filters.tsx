import { useEffect, useState, type FormEvent } from 'react';
import { printListQuerySchema, type PrintListQuery } from '@toneledger/common/schemas/catalogue';
import { LIGHT_RESPONSIVITY, PROCESS, STATUS, SUPPORT, TONER_CLASS } from '@toneledger/common/schemas/vocab';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { limitsOf } from '@/lib/forms/limits';
import { useEnclosures, useLocations, useMakers, usePapers } from '@/lib/reference-api';

export interface PrintsFiltersProps {
  query: PrintListQuery;
  onChange: (patch: Partial<PrintListQuery>) => void;
  /** Roles that may not see locations get no location filter. */
  showLocation: boolean;
}

const FILTER_KEYS = [
  'q', 'process', 'support', 'status', 'tonerClass', 'lightResponsivity', 'makerId', 'paperId', 'enclosureId', 'locationId',
  'hasWarnings', 'madeFrom', 'madeTo',
] as const satisfies readonly (keyof PrintListQuery)[];

const YEAR_MIN = 1800;
const YEAR_MAX = 2200;

function readYear(text: string): { ok: true; value: number | undefined } | { ok: false; message: string } {
  const value = text.trim();
  if (value === '') return { ok: true, value: undefined };
  if (!/^\d{4}$/.test(value) || Number(value) < YEAR_MIN || Number(value) > YEAR_MAX) {
    return { ok: false, message: `A year from ${YEAR_MIN} to ${YEAR_MAX}` };
  }
  return { ok: true, value: Number(value) };
}

/**
 * Full-text search and a filter for every controlled field. Choices apply at once; the search
 * text and the years apply with the Search button (or Enter).
 */
export function PrintsFilters({ query, onChange, showLocation }: PrintsFiltersProps) {
  const [text, setText] = useState(query.q ?? '');
  const [from, setFrom] = useState(query.madeFrom?.toString() ?? '');
  const [to, setTo] = useState(query.madeTo?.toString() ?? '');
  const [yearErrors, setYearErrors] = useState<{ from?: string; to?: string }>({});
  useEffect(() => setText(query.q ?? ''), [query.q]);
  useEffect(() => setFrom(query.madeFrom?.toString() ?? ''), [query.madeFrom]);
  useEffect(() => setTo(query.madeTo?.toString() ?? ''), [query.madeTo]);

  const makers = useMakers();
  const papers = usePapers();
  const enclosures = useEnclosures();
  const locations = useLocations(undefined, showLocation);

  function submit(event: FormEvent) {
    event.preventDefault();
    const a = readYear(from);
    const b = readYear(to);
    const errors = { from: a.ok ? undefined : a.message, to: b.ok ? undefined : b.message };
    if (a.ok && b.ok && a.value !== undefined && b.value !== undefined && a.value > b.value) {
      errors.to = 'Not before the “from” year';
    }
    setYearErrors(errors);
    if (errors.from || errors.to || !a.ok || !b.ok) return;
    onChange({ q: text.trim() || undefined, madeFrom: a.value, madeTo: b.value });
  }

  const active = FILTER_KEYS.some((key) => query[key] !== undefined);
  function clear() {
    setYearErrors({});
    onChange(Object.fromEntries(FILTER_KEYS.map((key) => [key, undefined])) as Partial<PrintListQuery>);
  }

  function select(key: keyof PrintListQuery) {
    return (event: { target: { value: string } }) => onChange({ [key]: event.target.value || undefined } as Partial<PrintListQuery>);
  }

  return (
    <form role="search" aria-label="Search and filter prints" onSubmit={submit} className="mb-4 flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        <TextField
          label="Search the catalogue"
          type="search"
          value={text}
          onChange={(event) => setText(event.target.value)}
          fieldClassName="w-full max-w-md"
          placeholder="Accession number, title, maker, inscriptions…"
          maxLength={limitsOf(printListQuerySchema, 'q').maxLength}
        />
        <TextField
          label="Made from (year)"
          inputMode="numeric"
          value={from}
          onChange={(event) => setFrom(event.target.value)}
          error={yearErrors.from}
          fieldClassName="w-32"
          maxLength={4}
        />
        <TextField
          label="Made to (year)"
          inputMode="numeric"
          value={to}
          onChange={(event) => setTo(event.target.value)}
          error={yearErrors.to}
          fieldClassName="w-32"
          maxLength={4}
        />
        <Button type="submit" variant="primary">
          Search
        </Button>
        {active ? (
          <Button variant="quiet" onClick={clear}>
            Clear filters
          </Button>
        ) : null}
      </div>
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4 xl:grid-cols-6">
        <SelectField label="Process" value={query.process ?? ''} onChange={select('process')}>
          <option value="">Any process</option>
          {PROCESS.options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </SelectField>
        <SelectField label="Support" value={query.support ?? ''} onChange={select('support')}>
          <option value="">Any support</option>
          {SUPPORT.options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </SelectField>
        <SelectField label="Status" value={query.status ?? ''} onChange={select('status')}>
          <option value="">Any status</option>
          {STATUS.options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </SelectField>
        <SelectField label="Toner class" value={query.tonerClass ?? ''} onChange={select('tonerClass')}>
          <option value="">Any toner</option>
          {TONER_CLASS.options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </SelectField>
        <SelectField label="Light responsivity" value={query.lightResponsivity ?? ''} onChange={select('lightResponsivity')}>
          <option value="">Any</option>
          {LIGHT_RESPONSIVITY.options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </SelectField>
        <SelectField label="Warnings" value={query.hasWarnings ?? ''} onChange={select('hasWarnings')}>
          <option value="">With or without</option>
          <option value="true">With warnings</option>
          <option value="false">Without warnings</option>
        </SelectField>
        <SelectField label="Maker" value={query.makerId ?? ''} onChange={select('makerId')}>
          <option value="">Any maker</option>
          {makers.data?.data.map((m) => (
            <option key={m.id} value={m.id}>
              {m.name}
            </option>
          ))}
        </SelectField>
        <SelectField label="Paper" value={query.paperId ?? ''} onChange={select('paperId')}>
          <option value="">Any paper</option>
          {papers.data?.data.map((p) => (
            <option key={p.id} value={p.id}>
              {p.label}
            </option>
          ))}
        </SelectField>
        <SelectField label="Enclosure" value={query.enclosureId ?? ''} onChange={select('enclosureId')}>
          <option value="">Any enclosure</option>
          {enclosures.data?.data.map((e) => (
            <option key={e.id} value={e.id}>
              {e.name}
            </option>
          ))}
        </SelectField>
        {showLocation ? (
          <SelectField label="Location" hint="Includes everything inside it" value={query.locationId ?? ''} onChange={select('locationId')}>
            <option value="">Anywhere</option>
            {locations.data?.data.map((l) => (
              <option key={l.id} value={l.id}>
                {l.pathLabel}
              </option>
            ))}
          </SelectField>
        ) : null}
      </div>
    </form>
  );
}
