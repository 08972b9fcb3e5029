import { useEffect } from 'react';
import { queryOptions, useQuery, useQueryClient } from '@tanstack/react-query';
import { importsApi } from '@toneledger/common/api/imports';
import type { ImportJob } from '@toneledger/common/schemas/catalogue';
import { callData } from '@/lib/api-client';
import { importKeys } from '@/features/catalogue/api/keys';
import { printKeys } from '@/lib/prints-api';

/** How often a running import is asked for its progress. */
export const IMPORT_POLL_MS = 700;

export function isImportRunning(job: Pick<ImportJob, 'status'> | undefined): boolean {
  return job?.status === 'validating' || job?.status === 'committing';
}

export function getImport(id: string, signal?: AbortSignal) {
  return callData(importsApi.get, { params: { id }, signal });
}

export function importQueryOptions(id: string) {
  return queryOptions({
    queryKey: importKeys.detail(id),
    queryFn: ({ signal }) => getImport(id, signal),
    staleTime: 0,
    // Poll while the server is checking or writing; stop once the job has settled.
    refetchInterval: (query) => (isImportRunning(query.state.data) ? IMPORT_POLL_MS : false),
    refetchIntervalInBackground: true,
  });
}

/** One import job, polled while it runs. Once it has written prints, lists of prints are refetched. */
export function useImport(id: string | undefined) {
  const queryClient = useQueryClient();
  const job = useQuery({ ...importQueryOptions(id ?? ''), enabled: Boolean(id) });
  const committed = job.data?.status === 'committed';
  useEffect(() => {
    if (committed) void queryClient.invalidateQueries({ queryKey: printKeys.lists() });
  }, [committed, queryClient]);
  return job;
}
