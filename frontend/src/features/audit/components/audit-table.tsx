import { createColumnHelper, getCoreRowModel, getExpandedRowModel, useReactTable } from '@tanstack/react-table';
import type { AuditEvent, AuditListQuery } from '@toneledger/common/schemas/audit';
import { Link } from 'react-router-dom';
import { recordLabel, recordPagePath } from '@toneledger/common/fields/audit-records';
import { DataTable } from '@/components/ui/data-table';
import { formatDateTime } from '@/lib/format';
import { ChangeView } from '@/features/audit/components/change-view';

const column = createColumnHelper<AuditEvent>();


const filterButton = 'text-left text-iron-700 underline decoration-iron-200 underline-offset-2 hover:text-iron-900 hover:decoration-iron-700';

export interface AuditTableProps {
  events: AuditEvent[];
  query: AuditListQuery;
  total: number;
  busy: boolean;
  onFilter: (patch: Partial<AuditListQuery>) => void;
}

/**
 * Audit events, newest first as the server sends them; "Show changes" (in the "What happened" cell, so
 * no column stands empty on events without changes) opens each field's before and after. The record is
 * its kind and name in words, linked to its page; its id only travels in the "Only this record" filter.
 * The request id (a raw id, for matching the server log) is in the CSV export, not on the screen.
 */
export function AuditTable({ events, query, total, busy, onFilter }: AuditTableProps) {
  const columns = [
    column.accessor('at', {
      header: 'When',
      cell: (info) => (
        <time dateTime={info.getValue()} className="whitespace-nowrap">
          {formatDateTime(info.getValue())}
        </time>
      ),
    }),
    column.accessor('actorName', {
      header: 'Who',
      cell: ({ row }) => {
        const { actorId, actorName } = row.original;
        if (!actorId) return <span className="text-ink-700">{actorName ?? 'System'}</span>;
        return (
          <button
            type="button"
            className={filterButton}
            title="Show only this person's events"
            aria-label={`${actorName ?? 'A person without a name'}: show only this person's events`}
            onClick={() => onFilter({ actorId })}
          >
            {actorName ?? 'A person without a name'}
          </button>
        );
      },
    }),
    column.accessor('sentence', {
      header: 'What happened',
      cell: ({ row }) => (
        <span className="flex flex-col items-start gap-0.5">
          <span className="text-ink-900">{row.original.sentence}</span>
          <span className="flex flex-wrap items-center gap-x-3 gap-y-0.5 text-xs">
            <button type="button" className={filterButton} title="Show only this action" onClick={() => onFilter({ action: row.original.action })}>
              {row.original.actionLabel}
            </button>
            {row.getCanExpand() ? (
              <button
                type="button"
                onClick={row.getToggleExpandedHandler()}
                aria-expanded={row.getIsExpanded()}
                className="rounded px-1 font-medium whitespace-nowrap text-iron-700 hover:bg-iron-50"
              >
                <span aria-hidden="true">{row.getIsExpanded() ? '▾ ' : '▸ '}</span>
                {row.getIsExpanded() ? 'Hide changes' : 'Show changes'}
              </button>
            ) : null}
          </span>
        </span>
      ),
    }),
    column.accessor('record', {
      header: 'Record',
      cell: ({ row }) => {
        const { entityType, entityId, record } = row.original;
        const named = recordLabel(record);
        return (
          <span className="flex flex-col items-start gap-0.5">
            <button type="button" className={filterButton} title="Show only this kind of record" onClick={() => onFilter({ entityType, entityId: undefined })}>
              {record.kind}
            </button>
            {record.name ? (
              record.link ? (
                <Link to={recordPagePath(record.link)} className="[overflow-wrap:anywhere] text-ink-900 underline underline-offset-2 hover:text-iron-800">
                  {record.name}
                </Link>
              ) : (
                <span className="[overflow-wrap:anywhere] text-ink-900">{record.name}</span>
              )
            ) : null}
            {entityId ? (
              <button
                type="button"
                className={`${filterButton} text-xs whitespace-nowrap`}
                aria-label={`Show only the events of ${named}`}
                onClick={() => onFilter({ entityType, entityId })}
              >
                Only this record
              </button>
            ) : null}
          </span>
        );
      },
    }),
  ];

  const table = useReactTable({
    data: events,
    columns,
    getRowId: (event) => event.id,
    getCoreRowModel: getCoreRowModel(),
    getExpandedRowModel: getExpandedRowModel(),
    getRowCanExpand: (row) => row.original.changes.length > 0,
    enableSorting: false,
    manualPagination: true,
    manualFiltering: true,
    pageCount: Math.max(1, Math.ceil(total / query.pageSize)),
    state: { pagination: { pageIndex: query.page - 1, pageSize: query.pageSize } },
  });

  return (
    <DataTable
      table={table}
      caption="Audit events"
      empty="No events match these filters."
      busy={busy}
      renderExpanded={(row) => <ChangeView changes={row.original.changes} />}
    />
  );
}
