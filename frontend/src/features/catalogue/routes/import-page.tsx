import { useSearchParams } from 'react-router-dom';
import { IMPORT_COLUMNS } from '@toneledger/common/schemas/catalogue';
import { buttonClasses } from '@/components/ui/button';
import { ErrorNotice } from '@/components/ui/notice';
import { Loading } from '@/components/ui/loading';
import { PageHeader } from '@/components/ui/page-header';
import { useDocumentTitle } from '@/lib/use-document-title';
import { IMPORT_TEMPLATE_HREF } from '@/features/catalogue/api/exports';
import { useImport } from '@/features/catalogue/api/get-import';
import { ImportJobView } from '@/features/catalogue/components/import-job-view';
import { ImportUploadForm } from '@/features/catalogue/components/import-upload-form';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

function ColumnsHelp() {
  return (
    <details className="rounded border border-paper-300 bg-white p-3 text-sm">
      <summary className="cursor-pointer font-medium">Columns the file may have</summary>
      <p className="mt-2 text-ink-800">
        The first row names the columns. Makers, papers, locations and enclosures are matched by name; a maker not yet in the
        catalogue is created (you will see the list before anything is written). Several toner classes are separated by a
        semicolon, e.g. <code className="mono">selenium;iron_blue</code>. Dates are EDTF, as in the form.
      </p>
      <ul className="mt-2 flex flex-wrap gap-1.5">
        {IMPORT_COLUMNS.map((c) => (
          <li key={c}>
            <code className="mono rounded bg-paper-100 px-1.5 py-0.5 text-xs">{c}</code>
          </li>
        ))}
      </ul>
    </details>
  );
}

/** CSV import in two stages: the server checks every row first, then writes all rows or none. */
export function ImportPage() {
  useDocumentTitle('Import prints');
  const [params, setParams] = useSearchParams();
  const raw = params.get('job');
  const jobId = raw && UUID.test(raw) ? raw : undefined;
  const job = useImport(jobId);

  function setJob(id: string | null) {
    const next = new URLSearchParams(params);
    if (id) next.set('job', id);
    else next.delete('job');
    setParams(next);
  }

  return (
    <section className="max-w-5xl">
      <PageHeader
        title="Import prints"
        description="Add many prints at once from a CSV file. Every row is checked first; prints are written only when the whole file is correct and you confirm."
        actions={
          <a href={IMPORT_TEMPLATE_HREF} download className={buttonClasses('secondary', 'md', 'no-underline')}>
            Download the template
          </a>
        }
      />
      <div className="flex flex-col gap-4">
        {!jobId ? (
          <>
            <ImportUploadForm onStarted={(started) => setJob(started.id)} />
            <ColumnsHelp />
          </>
        ) : job.isPending ? (
          <Loading label="Loading the import…" />
        ) : job.isError ? (
          <>
            <ErrorNotice error={job.error} title="This import could not be loaded." />
            <ImportUploadForm onStarted={(started) => setJob(started.id)} />
          </>
        ) : (
          <ImportJobView job={job.data} onStartAgain={() => setJob(null)} />
        )}
      </div>
    </section>
  );
}
