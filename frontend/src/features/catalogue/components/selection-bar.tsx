import { can, type Role } from '@toneledger/common/domain/roles';
import type { BulkAction } from '@toneledger/common/schemas/bulk';
import { Button } from '@/components/ui/button';
import { ErrorNotice } from '@/components/ui/notice';
import { ACTION_TITLES } from '@/features/catalogue/components/bulk-panel';
import { useExportSelection } from '@/features/catalogue/api/bulk';
import { selectedCount, toPrintSelection, type ListSelection } from '@/features/catalogue/utils/selection';

const ACTION_ACCESS = { move: 'prints.move', rehouse: 'prints.move', status: 'catalogue.write', round: 'schedule.write', exhibition: 'loans.write' } as const;
const SHORT: Record<BulkAction, string> = { move: 'Move…', rehouse: 'Rehouse…', status: 'Change status…', round: 'Add to round…', exhibition: 'Add to exhibition…' };

export interface SelectionBarProps {
  role: Role | null;
  selection: ListSelection;
  /** Every print on the page is ticked: offer to select all that match. */
  pageAllTicked: boolean;
  total: number;
  estimated: boolean;
  onSelectAllMatching: () => void;
  onClear: () => void;
  onAction: (action: BulkAction) => void;
}

/** How a selection reads in a sentence. */
export function selectionLabel(sel: ListSelection, estimated = false): string {
  const n = selectedCount(sel).toLocaleString('en-GB');
  if (sel.kind === 'query') return `all ${estimated ? 'about ' : ''}${n} prints matching this search`;
  return `${n} selected ${sel.ids.length === 1 ? 'print' : 'prints'}`;
}

/** Above the list while prints are selected: the count, "select all N matching", the actions the role may take, export. */
export function SelectionBar({ role, selection, pageAllTicked, total, estimated, onSelectAllMatching, onClear, onAction }: SelectionBarProps) {
  const exporter = useExportSelection();
  const count = selectedCount(selection);
  if (count === 0) return null;
  const actions = (Object.keys(ACTION_ACCESS) as BulkAction[]).filter((a) => can(role, ACTION_ACCESS[a]));
  return (
    <div role="region" aria-label="Selected prints" className="mb-2 flex flex-col gap-2 rounded border border-iron-300 bg-iron-50 px-3 py-2 text-sm">
      <div className="flex flex-wrap items-center gap-2">
        <p role="status" className="font-semibold">
          {selection.kind === 'query' ? `All ${estimated ? 'about ' : ''}${count.toLocaleString('en-GB')} prints matching this search are selected.` : `${count.toLocaleString('en-GB')} selected.`}
        </p>
        {selection.kind === 'ids' && pageAllTicked && total > count ? (
          <Button size="sm" variant="quiet" onClick={onSelectAllMatching}>
            Select all {estimated ? 'about ' : ''}{total.toLocaleString('en-GB')} matching
          </Button>
        ) : null}
        <Button size="sm" variant="quiet" onClick={onClear}>
          Clear selection
        </Button>
      </div>
      <div className="flex flex-wrap items-center gap-2">
        {actions.map((a) => (
          <Button key={a} size="sm" onClick={() => onAction(a)} title={ACTION_TITLES[a]}>
            {SHORT[a]}
          </Button>
        ))}
        <Button size="sm" onClick={() => exporter.mutate({ selection: toPrintSelection(selection), format: 'csv' })} disabled={exporter.isPending}>
          Export CSV
        </Button>
        <Button size="sm" onClick={() => exporter.mutate({ selection: toPrintSelection(selection), format: 'json' })} disabled={exporter.isPending}>
          Export JSON
        </Button>
      </div>
      {exporter.error ? <ErrorNotice error={exporter.error} title="The export failed." /> : null}
    </div>
  );
}
