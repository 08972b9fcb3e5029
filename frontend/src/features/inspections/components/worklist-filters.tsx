import { RISK_BANDS, RISK_BAND_LABELS, RISK_FACTOR_CODES, RISK_FACTOR_LABELS } from '@toneledger/common/schemas/inspections';
import { Button } from '@/components/ui/button';
import { ChoiceSelect } from '@/components/ui/choice-select';
import { useLocations } from '@/lib/reference-api';
import { useAssignees, type WorklistQuery } from '@/features/inspections/api/rounds';

const RISK_OPTIONS = RISK_BANDS.map((r) => ({ value: r, label: RISK_BAND_LABELS[r] }));
const REASON_OPTIONS = RISK_FACTOR_CODES.map((r) => ({ value: r, label: RISK_FACTOR_LABELS[r] }));

export interface WorklistFiltersProps {
  query: WorklistQuery;
  onChange: (patch: Partial<WorklistQuery>) => void;
}

/** Place (with everything inside it), risk, reason and who has the print in a round: each a key of the URL's query. */
export function WorklistFilters({ query, onChange }: WorklistFiltersProps) {
  const locations = useLocations();
  const assignees = useAssignees();
  const assigneeOptions = [{ value: 'none', label: 'In no planned round' }, ...(assignees.data ?? []).map((a) => ({ value: a.id, label: a.name }))];
  const filtered = query.locationId || query.risk || query.reason || query.assigneeId;
  return (
    <div role="group" aria-label="Filter the work list" className="mb-4 flex flex-wrap items-end gap-3 print:hidden">
      <ChoiceSelect
        label="Place"
        empty="Every place"
        options={locations.data?.data.map((l) => ({ value: l.id, label: l.pathLabel }))}
        value={query.locationId}
        onChoose={(locationId) => onChange({ locationId })}
        fieldClassName="w-72"
      />
      <ChoiceSelect label="Risk" empty="Any risk" options={RISK_OPTIONS} value={query.risk} onChoose={(risk) => onChange({ risk: risk as WorklistQuery['risk'] })} fieldClassName="w-36" />
      <ChoiceSelect
        label="Reason"
        empty="Any reason"
        options={REASON_OPTIONS}
        value={query.reason}
        onChoose={(reason) => onChange({ reason: reason as WorklistQuery['reason'] })}
        fieldClassName="w-56"
      />
      <ChoiceSelect
        label="Assigned to"
        empty="Anyone or no one"
        options={assigneeOptions}
        value={query.assigneeId}
        onChoose={(assigneeId) => onChange({ assigneeId })}
        fieldClassName="w-52"
      />
      {filtered ? (
        <Button variant="quiet" onClick={() => onChange({ locationId: undefined, risk: undefined, reason: undefined, assigneeId: undefined })}>
          Clear filters
        </Button>
      ) : null}
    </div>
  );
}
