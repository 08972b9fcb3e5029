import { PROCESS, TONER_CLASS } from '@toneledger/common/schemas/vocab';
import { SelectField } from '@/components/ui/field';
import type { LeadersQuery } from '@/features/measurements/api/keys';

export interface LeadersFiltersProps {
  query: LeadersQuery;
  onChange: (patch: Partial<LeadersQuery>) => void;
}

/** Process, toner class and the order of the list; each choice applies at once. */
export function LeadersFilters({ query, onChange }: LeadersFiltersProps) {
  return (
    <div role="group" aria-label="Filter and sort" className="mb-4 grid grid-cols-1 gap-3 sm:grid-cols-3 lg:max-w-4xl">
      <SelectField label="Process" value={query.process ?? ''} onChange={(e) => onChange({ process: e.target.value || undefined })}>
        <option value="">Any process</option>
        {PROCESS.options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </SelectField>
      <SelectField label="Toner class" value={query.tonerClass ?? ''} onChange={(e) => onChange({ tonerClass: e.target.value || undefined })}>
        <option value="">Any toner</option>
        {TONER_CLASS.options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </SelectField>
      <SelectField label="Sort by" value={query.sort} onChange={(e) => onChange({ sort: e.target.value === 'change' ? 'change' : 'rate' })}>
        <option value="rate">Fastest change (ΔE00 per year)</option>
        <option value="change">Largest change so far (latest ΔE00)</option>
      </SelectField>
    </div>
  );
}
