import { useEffect, useState, type FormEvent } from 'react';
import { LOAN_DIRECTION_LABELS, LOAN_DIRECTIONS, LOAN_STATUS_LABELS, LOAN_STATUSES, loanListQuerySchema } from '@toneledger/common/schemas/loans';
import { Button } from '@/components/ui/button';
import { ChoiceSelect } from '@/components/ui/choice-select';
import { SearchField } from '@/components/ui/search-field';
import type { LoanListQuery } from '@/features/loans/api/keys';

export interface LoansFiltersProps {
  query: LoanListQuery;
  onChange: (patch: Partial<LoanListQuery>) => void;
}

const DIRECTION_OPTIONS = LOAN_DIRECTIONS.map((d) => ({ value: d, label: LOAN_DIRECTION_LABELS[d] }));
const STATUS_OPTIONS = LOAN_STATUSES.map((s) => ({ value: s, label: LOAN_STATUS_LABELS[s] }));
const OPEN_OPTIONS = [
  { value: 'true', label: 'Open (not yet ended)' },
  { value: 'false', label: 'Ended' },
];

/** Words, direction, status and open/ended: each a key of the URL's query. */
export function LoansFilters({ query, onChange }: LoansFiltersProps) {
  const [text, setText] = useState(query.q ?? '');
  useEffect(() => setText(query.q ?? ''), [query.q]);

  function submit(event: FormEvent) {
    event.preventDefault();
    onChange({ q: text.trim() || undefined });
  }

  const filtered = query.q || query.direction || query.status || query.open;
  return (
    <form role="search" aria-label="Filter loans" onSubmit={submit} className="mb-4 flex flex-wrap items-end gap-3 print:hidden">
      <SearchField label="Reference, institution or venue" value={text} onText={setText} querySchema={loanListQuerySchema} fieldClassName="w-64" />
      <ChoiceSelect
        label="Direction"
        empty="Out and in"
        options={DIRECTION_OPTIONS}
        value={query.direction}
        onChoose={(direction) => onChange({ direction: direction as LoanListQuery['direction'] })}
        fieldClassName="w-36"
      />
      <ChoiceSelect
        label="Status"
        empty="Any status"
        options={STATUS_OPTIONS}
        value={query.status}
        onChoose={(status) => onChange({ status: status as LoanListQuery['status'] })}
        fieldClassName="w-40"
      />
      <ChoiceSelect
        label="Open or ended"
        empty="Both"
        options={OPEN_OPTIONS}
        value={query.open}
        onChoose={(open) => onChange({ open: open as LoanListQuery['open'] })}
        fieldClassName="w-48"
      />
      <Button type="submit" variant="primary">
        Search
      </Button>
      {filtered ? (
        <Button variant="quiet" onClick={() => onChange({ q: undefined, direction: undefined, status: undefined, open: undefined })}>
          Clear filters
        </Button>
      ) : null}
    </form>
  );
}
