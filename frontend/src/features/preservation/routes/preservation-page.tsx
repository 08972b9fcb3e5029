import { PageHeader } from '@/components/ui/page-header';
import { ErrorNotice } from '@/components/ui/notice';
import { usePrints } from '@/lib/prints-api';
import { useBagJobs } from '@/lib/preservation-api';
import { useDocumentTitle } from '@/lib/use-document-title';
import { BagJobsTable } from '@/features/preservation/components/bag-jobs-table';
import { ExportForm } from '@/features/preservation/components/export-form';
import { ImportForm } from '@/features/preservation/components/import-form';

/** Administrators: the collection out as a preservation package, and a package brought in. */
export function PreservationPage() {
  useDocumentTitle('Preservation package');
  const jobs = useBagJobs();
  const prints = usePrints({ page: 1, pageSize: 1, sort: 'accessionNumber', holding: 'all' });
  return (
    <section className="flex flex-col gap-4">
      <PageHeader
        title="Preservation package"
        description="The whole collection in open formats — JSON, CSV, the image files and a data dictionary — inside a BagIt bag, so it can be read without this program; and a bag brought into a new installation."
      />
      <div className="grid gap-4 md:grid-cols-2">
        <ExportForm />
        <ImportForm empty={prints.data ? prints.data.pagination.total === 0 : false} />
      </div>
      <h2 className="text-lg">Exports and imports</h2>
      {jobs.isError ? <ErrorNotice error={jobs.error} title="The list could not be loaded." /> : jobs.data ? <BagJobsTable jobs={jobs.data} /> : <p>Loading…</p>}
    </section>
  );
}
