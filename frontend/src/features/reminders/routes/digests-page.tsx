import { DIGEST_STATUSES, digestListQuerySchema } from '@toneledger/common/schemas/inspections';
import { ChoiceSelect } from '@/components/ui/choice-select';
import { PageHeader } from '@/components/ui/page-header';
import { PagedList } from '@/components/ui/paged-list';
import { useSearchQuery } from '@/lib/search-query';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useDigests } from '@/features/reminders/api/reminders';
import { DIGEST_STATUS_LABELS, DigestsTable } from '@/features/reminders/components/digests-table';

const STATUS_OPTIONS = DIGEST_STATUSES.map((s) => ({ value: s, label: DIGEST_STATUS_LABELS[s] }));

/** Administrators: every weekly digest, its state, attempts and error. */
export function DigestsPage() {
  useDocumentTitle('Weekly digests');
  const [query, setQuery] = useSearchQuery(digestListQuerySchema);
  const digests = useDigests(query);
  return (
    <section>
      <PageHeader
        title="Weekly digests"
        description="The weekly e-mail of prints due for inspection, one per person and week. A failed send is tried again until it goes; its last error stays here."
      />
      <div className="mb-3">
        <ChoiceSelect
          label="State"
          options={STATUS_OPTIONS}
          empty="Any state"
          value={query.status}
          onChoose={(status) => setQuery({ status: status as (typeof DIGEST_STATUSES)[number] | undefined, page: 1 })}
          fieldClassName="w-64"
        />
      </div>
      <PagedList list={digests} query={query} setQuery={setQuery} errorTitle="The digests could not be loaded." loadingLabel="Loading digests…">
        {(page, busy) => <DigestsTable digests={page.data} busy={busy} />}
      </PagedList>
    </section>
  );
}
