import { Link, useSearchParams } from 'react-router-dom';
import { buttonClasses } from '@/components/ui/button';
import { ErrorNotice } from '@/components/ui/notice';
import { Loading } from '@/components/ui/loading';
import { PageHeader } from '@/components/ui/page-header';
import { useDocumentTitle } from '@/lib/use-document-title';
import { importTemplateHref } from '@/features/catalogue/api/exports';
import { useImport } from '@/features/catalogue/api/get-import';
import { ImportJobView } from '@/features/catalogue/components/import-job-view';
import { ImportUploadForm } from '@/features/catalogue/components/import-upload-form';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

function ColumnsHelp() {
  return (
    <details className="rounded border border-paper-300 bg-white p-3 text-sm">
      <summary className="cursor-pointer font-medium">How the files are read</summary>
      <div className="mt-2 flex flex-col gap-2 text-ink-800">
        <p>
          The first row names the columns; the templates list every column with its type, allowed codes and an example, and the{' '}
          <Link to="/catalogue/fields">data dictionary</Link> describes each field. An export of the print list is itself a file this page
          reads: its computed columns (toner classes, warnings, record id, last changed) are read and ignored.
        </p>
        <p>
          Makers, papers, locations, enclosures and recipes are matched by name; a maker not yet in the catalogue is created (you will see
          the list before anything is written). Codes may be written as codes or as their labels. Dates are EDTF, as in the form.
        </p>
        <p>
          On a new print an empty or missing column takes its default. On an update a missing column leaves the field as it is, and an
          empty cell clears it. The process history goes in the steps file, one row per step: a print with rows there gets exactly those
          steps; a print without keeps its own.
        </p>
      </div>
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
        description="Add or update many prints at once from CSV files. Every row is checked first and you see what each one would do; prints are written only when the whole file is correct and you confirm."
        actions={
          <>
            <a href={importTemplateHref('prints')} download className={buttonClasses('secondary', 'md', 'no-underline')}>
              Prints template
            </a>
            <a href={importTemplateHref('steps')} download className={buttonClasses('secondary', 'md', 'no-underline')}>
              Steps template
            </a>
          </>
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
