import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { can } from '@toneledger/common/domain/roles';
import { referenceListQuerySchema, type Maker } from '@toneledger/common/schemas/catalogue';
import { SidePanel } from '@/components/ui/side-panel';
import { useMe } from '@/lib/auth';
import { makersQueryOptions } from '@/lib/reference-api';
import { useSearchQuery } from '@/lib/search-query';
import { useDocumentTitle } from '@/lib/use-document-title';
import { MakerForm } from '@/features/reference/components/maker-form';
import { ReferenceListLayout } from '@/features/reference/components/reference-list-layout';
import { CountCell, EditButton, Empty, ReferenceTable } from '@/features/reference/components/reference-table';
import { useEditPanel } from '@/features/reference/components/use-edit-panel';

const column = createColumnHelper<Maker>();

export function MakersPage() {
  useDocumentTitle('Makers');
  const me = useMe();
  const canWrite = can(me.role, 'catalogue.write');
  const [query, setQuery] = useSearchQuery(referenceListQuerySchema);
  const list = useQuery({ ...makersQueryOptions(query), placeholderData: keepPreviousData });
  const edit = useEditPanel<Maker>();

  const columns = [
    column.accessor('name', { header: 'Name', cell: (info) => <span className="font-medium text-ink-900">{info.getValue()}</span> }),
    column.accessor('lifeDates', { header: 'Life dates', cell: (info) => info.getValue() ?? <Empty>—</Empty> }),
    column.accessor('notes', {
      header: 'Notes',
      cell: (info) => <span className="line-clamp-2 max-w-md">{info.getValue() ?? ''}</span>,
    }),
    column.accessor('printCount', { header: 'Prints', cell: (info) => <CountCell value={info.getValue()} /> }),
    ...(canWrite
      ? [column.display({ id: 'edit', header: () => <span className="sr-only">Edit</span>, cell: ({ row }) => <EditButton name={row.original.name} onClick={() => edit.openEdit(row.original)} /> })]
      : []),
  ];

  return (
    <ReferenceListLayout
      title="Makers"
      description="Printers and photographers that print records name. A maker's print count is the number of prints that name them."
      newLabel={canWrite ? 'New maker' : undefined}
      onNew={edit.openNew}
      searchWhat="makers"
      searchLabel="Name"
      query={query}
      setQuery={setQuery}
      list={list}
      what="makers"
      saved={edit.saved}
      renderTable={(rows, busy) => (
        <ReferenceTable rows={rows} columns={columns} caption="Makers" empty={query.q ? 'No maker matches this search.' : 'No makers yet.'} busy={busy} />
      )}
      panel={
        edit.panel && canWrite ? (
          <SidePanel key={edit.key} title={edit.panel.record ? `Edit maker: ${edit.panel.record.name}` : 'New maker'} onClose={edit.close}>
            <MakerForm
              maker={edit.panel.record}
              onCancel={edit.close}
              onSaved={(maker, created) => edit.done(`${created ? 'Added' : 'Saved'} maker “${maker.name}”.`)}
            />
          </SidePanel>
        ) : null
      }
    />
  );
}
