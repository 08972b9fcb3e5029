import { useEffect, useState, type FormEvent } from 'react';
import { printListQuerySchema, type PrintListQuery } from '@toneledger/common/schemas/catalogue';
import { LIGHT_RESPONSIVITY, PROCESS, STATUS, SUPPORT, TONER_CLASS } from '@toneledger/common/schemas/vocab';
import { Button } from '@/components/ui/button';
import { ChoiceSelect } from '@/components/ui/choice-select';
import { TextField } from '@/components/ui/field';
import { SearchField } from '@/components/ui/search-field';
import { useEnclosures, useLocations, useMakers, usePapers } from '@/lib/reference-api';

export interface PrintsFiltersProps {
  query: PrintListQuery;
  onChange: (patch: Partial<PrintListQuery>) => void;
  /** Roles that may not see locations get no location filter. */
  showLocation: boolean;
}

const FILTER_KEYS = [
  'q', 'process', 'support', 'status', 'holding', 'tonerClass', 'lightResponsivity', 'makerId', 'paperId', 'enclosureId', 'locationId',
  'hasWarnings', 'madeFrom', 'madeTo',
] as const satisfies readonly (keyof PrintListQuery)[];

/** Borrowed prints (loans in) are records of their own, left out of the list unless asked for. */
const HOLDINGS = [
  { value: 'borrowed', label: 'Borrowed prints only' },
  { value: 'all', label: 'Collection and borrowed' },
];

const WARNINGS = [
  { value: 'true', label: 'With warnings' },
  { value: 'false', label: 'Without warnings' },
];

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

/** A four-digit year, as typed (read by `readYear` on submit). */
function YearField({ label, value, onText, error }: { label: string; value: string; onText: (text: string) => void; error?: string }) {
  return <TextField label={label} inputMode="numeric" value={value} onChange={(event) => onText(event.target.value)} error={error} fieldClassName="w-32" maxLength={4} />;
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

  function choose(key: keyof PrintListQuery) {
    return (value: string | undefined) => onChange({ [key]: value } as Partial<PrintListQuery>);
  }

  return (
    <form role="search" aria-label="Search and filter prints" onSubmit={submit} className="mb-4 flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        <SearchField
          label="Search the catalogue"
          value={text}
          onText={setText}
          querySchema={printListQuerySchema}
          fieldClassName="w-full max-w-md"
          placeholder="Accession number, title, maker, inscriptions…"
        />
        <YearField label="Made from (year)" value={from} onText={setFrom} error={yearErrors.from} />
        <YearField label="Made to (year)" value={to} onText={setTo} error={yearErrors.to} />
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
        <ChoiceSelect label="Process" empty="Any process" options={PROCESS.options} value={query.process} onChoose={choose('process')} />
        <ChoiceSelect label="Support" empty="Any support" options={SUPPORT.options} value={query.support} onChoose={choose('support')} />
        <ChoiceSelect label="Status" empty="Any status" options={STATUS.options} value={query.status} onChoose={choose('status')} />
        <ChoiceSelect
          label="Holding"
          empty="The collection"
          options={HOLDINGS}
          value={query.holding === 'collection' ? undefined : query.holding}
          onChoose={choose('holding')}
        />
        <ChoiceSelect label="Toner" empty="Any toner" options={TONER_CLASS.options} value={query.tonerClass} onChoose={choose('tonerClass')} />
        <ChoiceSelect label="Light responsivity" empty="Any" options={LIGHT_RESPONSIVITY.options} value={query.lightResponsivity} onChoose={choose('lightResponsivity')} />
        <ChoiceSelect label="Warnings" empty="With or without" options={WARNINGS} value={query.hasWarnings} onChoose={choose('hasWarnings')} />
        <ChoiceSelect label="Maker" empty="Any maker" options={makers.data?.data.map((m) => ({ value: m.id, label: m.name }))} value={query.makerId} onChoose={choose('makerId')} />
        <ChoiceSelect label="Paper" empty="Any paper" options={papers.data?.data.map((p) => ({ value: p.id, label: p.label }))} value={query.paperId} onChoose={choose('paperId')} />
        <ChoiceSelect
          label="Enclosure"
          empty="Any enclosure"
          options={enclosures.data?.data.map((e) => ({ value: e.id, label: e.name }))}
          value={query.enclosureId}
          onChoose={choose('enclosureId')}
        />
        {showLocation ? (
          <ChoiceSelect
            label="Location"
            hint="Includes everything inside it"
            empty="Anywhere"
            options={locations.data?.data.map((l) => ({ value: l.id, label: l.pathLabel }))}
            value={query.locationId}
            onChoose={choose('locationId')}
          />
        ) : null}
      </div>
    </form>
  );
}
