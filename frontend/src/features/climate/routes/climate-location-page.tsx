import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { can } from '@toneledger/common/domain/roles';
import type { ClimateFile } from '@toneledger/common/schemas/climate';
import { Button } from '@/components/ui/button';
import { Loading } from '@/components/ui/loading';
import { ErrorNotice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { useMe } from '@/lib/auth';
import { useDocumentTitle } from '@/lib/use-document-title';
import { useClimateFiles, useClimateSeries, useClimateSummary } from '@/features/climate/api/climate';
import { ClimateChart } from '@/features/climate/components/climate-chart';
import { ClimateFigures, ClimateSources, ExcursionsTable } from '@/features/climate/components/climate-figures';
import { FilesList } from '@/features/climate/components/files-list';
import { PeriodChooser, usePeriod } from '@/features/climate/components/period-chooser';
import { UploadFlow } from '@/features/climate/components/upload-flow';

/** One location's climate: figures with their sources, the chart, excursions, files and the upload flow. */
export function ClimateLocationPage() {
  const { id = '' } = useParams();
  const me = useMe();
  const [period, setPeriod] = usePeriod();
  const summary = useClimateSummary(id, period);
  const series = useClimateSeries(id, period);
  const files = useClimateFiles(id);
  const [uploading, setUploading] = useState<{ resume: ClimateFile | null } | null>(null);
  const canLoad = can(me.role, 'climate.write');
  useDocumentTitle(summary.data ? `Climate · ${summary.data.locationLabel}` : 'Climate');

  return (
    <section>
      <PageHeader
        title={summary.data ? `Climate · ${summary.data.locationLabel}` : 'Climate'}
        description={<Link className="underline" to="/climate">All store rooms</Link>}
        actions={canLoad && !uploading ? <Button variant="primary" onClick={() => setUploading({ resume: null })}>Load a logger file</Button> : null}
      />
      {uploading ? <div className="mb-5"><UploadFlow key={uploading.resume?.id ?? 'new'} locationId={id} resume={uploading.resume} onClose={() => setUploading(null)} /></div> : null}
      <PeriodChooser period={period} onChange={setPeriod} shown={summary.data ? { from: summary.data.from, to: summary.data.to } : undefined} />
      {summary.isError ? <ErrorNotice error={summary.error} title="The figures could not be loaded." /> : null}
      {summary.isPending ? <Loading label="Loading figures…" /> : null}
      {summary.data ? (
        <div className="grid gap-5 lg:grid-cols-[1fr_20rem]">
          <div className="flex min-w-0 flex-col gap-5">
            <ClimateFigures summary={summary.data} />
            {series.data && series.data.points.length ? (
              <div className="flex flex-col gap-4">
                <ClimateChart series={series.data} summary={summary.data} quantity="temperature" />
                <ClimateChart series={series.data} summary={summary.data} quantity="rh" />
              </div>
            ) : null}
            <ExcursionsTable summary={summary.data} />
          </div>
          <ClimateSources settings={summary.data.settings} />
        </div>
      ) : null}
      <div className="mt-6">
        {files.isError ? <ErrorNotice error={files.error} title="The files could not be loaded." /> : null}
        {files.data ? <FilesList files={files.data} onResume={canLoad ? (f) => setUploading({ resume: f }) : undefined} /> : null}
      </div>
    </section>
  );
}
