import { useMemo, useState } from 'react';
import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { can } from '@toneledger/common/domain/roles';
import { referenceListQuerySchema, type Location } from '@toneledger/common/schemas/catalogue';
import { Button } from '@/components/ui/button';
import { Loading } from '@/components/ui/loading';
import { ErrorNotice, Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { SidePanel } from '@/components/ui/side-panel';
import { useMe } from '@/lib/auth';
import { formatCount } from '@/lib/format';
import { locationsQueryOptions } from '@/lib/reference-api';
import { useSearchQuery } from '@/lib/search-query';
import { useDocumentTitle } from '@/lib/use-document-title';
import { LocationForm } from '@/features/reference/components/location-form';
import { buildLocationTree } from '@/features/reference/components/location-tree';
import { LocationsTreeTable } from '@/features/reference/components/locations-tree-table';
import { ReferenceSearch } from '@/features/reference/components/reference-search';
import { useEditPanel } from '@/features/reference/components/use-edit-panel';
import { SavedNotice } from '@/features/reference/components/saved-notice';

/** The whole tree is loaded at once (the API's largest page). */
const TREE_PAGE_SIZE = 1000;

const DESCRIPTION = 'Where prints are kept: buildings, rooms, cabinets, shelves, drawers and boxes, each inside another. Open a place to see what is inside it.';

export function LocationsPage() {
  useDocumentTitle('Locations');
  const me = useMe();
  const canRead = can(me.role, 'catalogue.read_restricted');
  if (!canRead) {
    return (
      <section>
        <PageHeader title="Locations" description={DESCRIPTION} />
        <Notice tone="info" title="Storage locations are not shown to your role.">
          <p className="mt-1">Ask a registrar if you need to know where a print is kept.</p>
        </Notice>
      </section>
    );
  }
  return <LocationsTree canWrite={can(me.role, 'catalogue.write')} />;
}

function LocationsTree({ canWrite }: { canWrite: boolean }) {
  const [query, setQuery] = useSearchQuery(referenceListQuerySchema);
  const listQuery = { q: query.q, page: 1, pageSize: TREE_PAGE_SIZE };
  const list = useQuery({ ...locationsQueryOptions(listQuery), placeholderData: keepPreviousData });
  const edit = useEditPanel<Location>();
  const [parentId, setParentId] = useState<string | null>(null);
  const all = useMemo(() => list.data?.data ?? [], [list.data]);
  const roots = useMemo(() => buildLocationTree(all), [all]);

  const openNew = (parent: Location | null) => {
    setParentId(parent?.id ?? null);
    edit.openNew();
  };

  const parent = parentId ? all.find((l) => l.id === parentId) : undefined;
  const panelTitle = edit.panel?.record
    ? `Edit place: ${edit.panel.record.name}`
    : parent
      ? `New place inside ${parent.name}`
      : 'New place';

  return (
    <section>
      <PageHeader
        title="Locations"
        description={DESCRIPTION}
        actions={
          canWrite ? (
            <Button variant="primary" onClick={() => openNew(null)}>
              New place
            </Button>
          ) : null
        }
      />
      <SavedNotice saved={edit.saved} />
      <div className={edit.panel ? 'grid items-start gap-5 lg:grid-cols-[minmax(0,1fr)_26rem]' : undefined}>
        <div className="min-w-0">
          <ReferenceSearch what="locations" label="Name or code" q={query.q} onSearch={(q) => setQuery({ q })} />
          {list.isError ? <ErrorNotice error={list.error} title="The locations could not be loaded." /> : null}
          {list.isPending ? (
            <Loading label="Loading locations…" />
          ) : list.data ? (
            <>
              {list.data.pagination.total > all.length ? (
                <div className="mb-3">
                  <Notice tone="warning">
                    Showing {formatCount(all.length)} of {formatCount(list.data.pagination.total)} places. Search to find the others.
                  </Notice>
                </div>
              ) : null}
              <LocationsTreeTable
                key={query.q ?? ''}
                roots={roots}
                busy={list.isPlaceholderData}
                searching={Boolean(query.q)}
                canWrite={canWrite}
                onAddInside={(node) => openNew(node)}
                onEdit={(node) => edit.openEdit(node)}
              />
            </>
          ) : null}
        </div>
        {edit.panel && canWrite ? (
          <SidePanel key={`${edit.key}-${parentId ?? 'top'}`} title={panelTitle} onClose={edit.close}>
            <LocationForm
              location={edit.panel.record}
              parentId={parentId}
              all={all}
              onCancel={edit.close}
              onSaved={(location, created) => edit.done(`${created ? 'Added' : 'Saved'} ${location.pathLabel}.`)}
            />
          </SidePanel>
        ) : null}
      </div>
    </section>
  );
}
