import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { can } from '@toneledger/common/domain/roles';
import { referenceListQuerySchema, type Enclosure } from '@toneledger/common/schemas/catalogue';
import { PAT_RESULT } from '@toneledger/common/schemas/vocab';
import { SidePanel } from '@/components/ui/side-panel';
import { useMe } from '@/lib/auth';
import { enclosuresQueryOptions } from '@/lib/reference-api';
import { useSearchQuery } from '@/lib/search-query';
import { useDocumentTitle } from '@/lib/use-document-title';
import { EnclosureForm } from '@/features/reference/components/enclosure-form';
import { BufferedNote } from '@/features/reference/components/enclosure-notes';
import { ReferenceListLayout } from '@/features/reference/components/reference-list-layout';
import { CountCell, EditButton, Empty, ReferenceTable } from '@/features/reference/components/reference-table';
import { useEditPanel } from '@/features/reference/components/use-edit-panel';

const column = createColumnHelper<Enclosure>();

function Buffered({ value }: { value: boolean | null }) {
  if (value === null) return <Empty>Unknown</Empty>;
  if (!value) return <>No</>;
  return (
    <>
      <span className="font-medium">Yes</span>
      <BufferedNote compact />
    </>
  );
}

export function EnclosuresPage() {
  useDocumentTitle('Enclosure types');
  const me = useMe();
  const canWrite = can(me.role, 'catalogue.write');
  const [query, setQuery] = useSearchQuery(referenceListQuerySchema);
  const list = useQuery({ ...enclosuresQueryOptions(query), placeholderData: keepPreviousData });
  const edit = useEditPanel<Enclosure>();

  const columns = [
    column.accessor('name', { header: 'Name', cell: (info) => <span className="font-medium text-ink-900">{info.getValue()}</span> }),
    column.accessor('material', { header: 'Material', cell: (info) => info.getValue() ?? <Empty>—</Empty> }),
    column.accessor('alkalineBuffered', { header: 'Alkaline-buffered', cell: (info) => <Buffered value={info.getValue()} /> }),
    column.accessor('patResult', {
      header: 'Activity test',
      cell: (info) => (
        <span className={info.getValue() === 'failed' ? 'font-medium text-danger-700' : undefined}>{PAT_RESULT.labels[info.getValue()]}</span>
      ),
    }),
    column.accessor('printCount', { header: 'Prints', cell: (info) => <CountCell value={info.getValue()} /> }),
    ...(canWrite
      ? [column.display({ id: 'edit', header: () => <span className="sr-only">Edit</span>, cell: ({ row }) => <EditButton name={row.original.name} onClick={() => edit.openEdit(row.original)} /> })]
      : []),
  ];

  return (
    <ReferenceListLayout
      title="Enclosure types"
      description="Folders, sleeves, mats and boxes that prints are kept in: the material, whether it is alkaline-buffered, and its Photographic Activity Test result (ISO 18916)."
      newLabel={canWrite ? 'New enclosure type' : undefined}
      onNew={edit.openNew}
      searchWhat="enclosure types"
      searchLabel="Name or material"
      query={query}
      setQuery={setQuery}
      list={list}
      what="enclosure types"
      saved={edit.saved}
      renderTable={(rows, busy) => (
        <ReferenceTable
          rows={rows}
          columns={columns}
          caption="Enclosure types"
          empty={query.q ? 'No enclosure type matches this search.' : 'No enclosure types yet.'}
          busy={busy}
        />
      )}
      panel={
        edit.panel && canWrite ? (
          <SidePanel key={edit.key} title={edit.panel.record ? `Edit enclosure type: ${edit.panel.record.name}` : 'New enclosure type'} onClose={edit.close}>
            <EnclosureForm
              enclosure={edit.panel.record}
              onCancel={edit.close}
              onSaved={(enclosure, created) => edit.done(`${created ? 'Added' : 'Saved'} enclosure type “${enclosure.name}”.`)}
            />
          </SidePanel>
        ) : null
      }
    />
  );
}
