import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { can } from '@toneledger/common/domain/roles';
import { edtfAsWritten } from '@toneledger/common/domain/edtf-words';
import { referenceListQuerySchema, type Paper } from '@toneledger/common/schemas/catalogue';
import { PAPER_BASE, YES_NO_UNKNOWN } from '@toneledger/common/schemas/vocab';
import { SidePanel } from '@/components/ui/side-panel';
import { useMe } from '@/lib/auth';
import { papersQueryOptions } from '@/lib/reference-api';
import { useSearchQuery } from '@/lib/search-query';
import { useDocumentTitle } from '@/lib/use-document-title';
import { PaperForm } from '@/features/reference/components/paper-form';
import { ReferenceListLayout } from '@/features/reference/components/reference-list-layout';
import { CountCell, EditButton, Empty, ReferenceTable } from '@/features/reference/components/reference-table';
import { useEditPanel } from '@/features/reference/components/use-edit-panel';

const column = createColumnHelper<Paper>();

export function PapersPage() {
  useDocumentTitle('Papers');
  const me = useMe();
  const canWrite = can(me.role, 'catalogue.write');
  const [query, setQuery] = useSearchQuery(referenceListQuerySchema);
  const list = useQuery({ ...papersQueryOptions(query), placeholderData: keepPreviousData });
  const edit = useEditPanel<Paper>();

  const columns = [
    column.accessor('label', { header: 'Paper', cell: (info) => <span className="font-medium text-ink-900">{info.getValue()}</span> }),
    column.accessor('base', { header: 'Base', cell: (info) => PAPER_BASE.labels[info.getValue()] }),
    column.accessor('surface', { header: 'Surface', cell: (info) => info.getValue() ?? <Empty>—</Empty> }),
    column.accessor('baseTint', { header: 'Tint', cell: (info) => info.getValue() ?? <Empty>—</Empty> }),
    column.accessor('opticalBrighteners', { header: 'Brighteners', cell: (info) => YES_NO_UNKNOWN.labels[info.getValue()] }),
    column.accessor('madeDisplay', {
      header: 'Made',
      cell: ({ row }) =>
        row.original.madeDates ? (
          <span title={`EDTF ${row.original.madeDates}`}>{edtfAsWritten(row.original.madeDates)}</span>
        ) : (
          <Empty>—</Empty>
        ),
    }),
    column.accessor('printCount', { header: 'Prints', cell: (info) => <CountCell value={info.getValue()} /> }),
    ...(canWrite
      ? [column.display({ id: 'edit', header: () => <span className="sr-only">Edit</span>, cell: ({ row }) => <EditButton name={row.original.label} onClick={() => edit.openEdit(row.original)} /> })]
      : []),
  ];

  return (
    <ReferenceListLayout
      title="Papers"
      description="Photographic papers by manufacturer and product, as written on the packet, with base, surface and the years the paper was made."
      newLabel={canWrite ? 'New paper' : undefined}
      onNew={edit.openNew}
      searchWhat="papers"
      searchLabel="Manufacturer or product"
      query={query}
      setQuery={setQuery}
      list={list}
      what="papers"
      saved={edit.saved}
      renderTable={(rows, busy) => (
        <ReferenceTable rows={rows} columns={columns} caption="Papers" empty={query.q ? 'No paper matches this search.' : 'No papers yet.'} busy={busy} />
      )}
      panel={
        edit.panel && canWrite ? (
          <SidePanel key={edit.key} title={edit.panel.record ? `Edit paper: ${edit.panel.record.label}` : 'New paper'} onClose={edit.close}>
            <PaperForm
              paper={edit.panel.record}
              onCancel={edit.close}
              onSaved={(paper, created) => edit.done(`${created ? 'Added' : 'Saved'} paper “${paper.label}”.`)}
            />
          </SidePanel>
        ) : null
      }
    />
  );
}
