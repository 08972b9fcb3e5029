import { useState } from 'react';
import type { PrintListQuery } from '@toneledger/common/schemas/catalogue';
import { Button, buttonClasses } from '@/components/ui/button';
import { ErrorNotice } from '@/components/ui/notice';
import { bagHref, useBagJob, useStartBagExport } from '@/lib/preservation-api';

/** The search as a preservation package (a BagIt bag): started here, followed here, downloaded here. */
export function BagSearchButton({ query }: { query: PrintListQuery }) {
  const start = useStartBagExport();
  const [jobId, setJobId] = useState<string | null>(null);
  const job = useBagJob(jobId).data;
  function run() {
    const { page: _page, pageSize: _size, sort: _sort, ...filters } = query;
    start.mutate({ scope: 'selection', selection: { kind: 'query', query: filters }, withImages: true }, { onSuccess: (j) => setJobId(j.id) });
  }
  return (
    <span className="inline-flex flex-wrap items-center gap-2">
      <Button onClick={run} disabled={start.isPending || job?.status === 'queued' || job?.status === 'running'}
        title="These prints with all their records, images and history in a BagIt bag (.tar), for an archive">
        Preservation package
      </Button>
      <span aria-live="polite" className="text-sm">
        {job?.status === 'queued' || job?.status === 'running' ? `Packing… ${job.done} of ${job.total}` : null}
        {job?.status === 'failed' ? job.error : null}
      </span>
      {job?.downloadable ? <a href={bagHref(job.id)} download className={buttonClasses('primary', 'md', 'no-underline')}>Download bag</a> : null}
      {start.isError ? <ErrorNotice error={start.error} title="The package did not start." /> : null}
    </span>
  );
}
