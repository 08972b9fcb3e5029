import { useState } from 'react';
import {
  createColumnHelper,
  getCoreRowModel,
  getExpandedRowModel,
  useReactTable,
  type ExpandedState,
} from '@tanstack/react-table';
import { LOCATION_KIND } from '@toneledger/common/schemas/vocab';
import { Button } from '@/components/ui/button';
import { DataTable } from '@/components/ui/data-table';
import type { LocationNode } from '@/features/reference/components/location-tree';
import { CountCell, Empty } from '@/features/reference/components/reference-table';

const column = createColumnHelper<LocationNode>();

export interface LocationsTreeTableProps {
  roots: LocationNode[];
  busy: boolean;
  searching: boolean;
  canWrite: boolean;
  onAddInside: (parent: LocationNode) => void;
  onEdit: (location: LocationNode) => void;
}

/** Buildings, rooms, cabinets, drawers and boxes, indented by depth; each place opens to show what is inside. */
export function LocationsTreeTable({ roots, busy, searching, canWrite, onAddInside, onEdit }: LocationsTreeTableProps) {
  // Open the top two levels at first (everything while searching).
  const [expanded, setExpanded] = useState<ExpandedState>(() =>
    searching ? true : Object.fromEntries(roots.flatMap((r) => [[r.id, true], ...r.children.map((c) => [c.id, true] as const)])),
  );

  const columns = [
    column.accessor('name', {
      header: 'Place',
      cell: ({ row }) => (
        <div className="flex items-start gap-1" style={{ paddingLeft: `${row.depth * 1.25}rem` }}>
          {row.getCanExpand() ? (
            <button
              type="button"
              onClick={row.getToggleExpandedHandler()}
              aria-expanded={row.getIsExpanded()}
              aria-label={`${row.getIsExpanded() ? 'Collapse' : 'Expand'} ${row.original.name}`}
              className="inline-flex size-6 shrink-0 items-center justify-center rounded text-iron-700 hover:bg-iron-50"
            >
              <span aria-hidden="true">{row.getIsExpanded() ? '▾' : '▸'}</span>
            </button>
          ) : (
            <span className="inline-block size-6 shrink-0" aria-hidden="true" />
          )}
          <span className="pt-0.5">
            <span className="font-medium text-ink-900">{row.original.name}</span>
            {row.depth === 0 && row.original.parentId ? (
              <span className="block text-xs text-ink-700">{row.original.pathLabel}</span>
            ) : null}
            {row.getCanExpand() ? <span className="sr-only">, {row.original.children.length} inside</span> : null}
          </span>
        </div>
      ),
    }),
    column.accessor('kind', { header: 'Kind', cell: (info) => LOCATION_KIND.labels[info.getValue()] }),
    column.accessor('code', { header: 'Code', cell: (info) => (info.getValue() ? <code className="mono text-xs">{info.getValue()}</code> : <Empty>—</Empty>) }),
    column.accessor('printCount', { header: () => <span title="Prints here and in every place inside">Prints, inside too</span>, cell: (info) => <CountCell value={info.getValue()} /> }),
    ...(canWrite
      ? [
          column.display({
            id: 'actions',
            header: () => <span className="sr-only">Actions</span>,
            cell: ({ row }) => (
              <div className="flex justify-end gap-1">
                <Button size="sm" variant="quiet" onClick={() => onAddInside(row.original)} aria-label={`Add a place inside ${row.original.name}`}>
                  Add inside
                </Button>
                <Button size="sm" variant="quiet" onClick={() => onEdit(row.original)} aria-label={`Edit ${row.original.name}`}>
                  Edit
                </Button>
              </div>
            ),
          }),
        ]
      : []),
  ];

  const table = useReactTable({
    data: roots,
    columns,
    getRowId: (row) => row.id,
    getSubRows: (row) => row.children,
    getCoreRowModel: getCoreRowModel(),
    getExpandedRowModel: getExpandedRowModel(),
    enableSorting: false,
    state: { expanded },
    onExpandedChange: setExpanded,
  });

  return (
    <>
      <div className="mb-2 flex gap-2">
        <Button size="sm" variant="quiet" onClick={() => table.toggleAllRowsExpanded(true)}>
          Expand all
        </Button>
        <Button size="sm" variant="quiet" onClick={() => setExpanded({})}>
          Collapse all
        </Button>
      </div>
      <DataTable table={table} caption="Storage places, as a tree" empty={searching ? 'No place matches this search.' : 'No places yet.'} busy={busy} />
    </>
  );
}
