import { PROCESS, TONER_CLASS } from '@toneledger/common/schemas/vocab';
import { ChoiceSelect } from '@/components/ui/choice-select';
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
      <ChoiceSelect label="Process" empty="Any process" options={PROCESS.options} value={query.process} onChoose={(process) => onChange({ process })} />
      <ChoiceSelect label="Toner" empty="Any toner" options={TONER_CLASS.options} value={query.tonerClass} onChoose={(tonerClass) => onChange({ tonerClass })} />
      <SelectField label="Sort by" value={query.sort} onChange={(e) => onChange({ sort: e.target.value === 'change' ? 'change' : 'rate' })}>
        <option value="rate">Fastest change (ΔE00 per year)</option>
        <option value="change">Largest change so far (latest ΔE00)</option>
      </SelectField>
    </div>
  );
}
