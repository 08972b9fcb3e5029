import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { preservationApi } from '@toneledger/common/api/preservation';
import type { BagExportStart, BagJob } from '@toneledger/common/schemas/preservation';
import { callData, uploadWithProgress, urlOf } from '@/lib/api-client';

/**
 * Preservation packages (BagIt bags): the administrators' page starts and follows exports of the
 * collection and imports; the catalogue list starts an export of its search. One set of keys and
 * queries, shared. A job still queued or running is asked for again every two seconds.
 */
export const preservationKeys = {
  all: ['preservation'] as const,
  lists: () => [...preservationKeys.all, 'list'] as const,
  details: () => [...preservationKeys.all, 'detail'] as const,
  detail: (id: string) => [...preservationKeys.details(), id] as const,
};

const active = (job: BagJob | undefined) => !!job && (job.status === 'queued' || job.status === 'running');

export function bagJobsQueryOptions() {
  return queryOptions({
    queryKey: preservationKeys.lists(),
    queryFn: ({ signal }) => callData(preservationApi.list, { signal }),
    refetchInterval: (q) => (q.state.data?.some(active) ? 2000 : false),
  });
}

export function useBagJobs() {
  return useQuery(bagJobsQueryOptions());
}

export function useBagJob(id: string | null) {
  return useQuery({
    queryKey: preservationKeys.detail(id ?? ''),
    queryFn: ({ signal }) => callData(preservationApi.get, { params: { id: id! }, signal }),
    enabled: !!id,
    refetchInterval: (q) => (active(q.state.data) ? 2000 : false),
  });
}

export function useStartBagExport() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: BagExportStart) => callData(preservationApi.startExport, { body }),
    onSuccess: (job) => {
      client.setQueryData(preservationKeys.detail(job.id), job);
      void client.invalidateQueries({ queryKey: preservationKeys.lists() });
    },
  });
}

/** Uploads a bag (a .tar) to bring into this installation, reporting progress. */
export function useImportBag() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ file, onProgress }: { file: File; onProgress?: (fraction: number) => void }) => {
      const form = new FormData();
      form.append('bag', file, file.name);
      return uploadWithProgress(preservationApi.startImport, { body: form }, onProgress);
    },
    onSuccess: () => void client.invalidateQueries({ queryKey: preservationKeys.lists() }),
  });
}

/** Download address of a finished bag. */
export function bagHref(id: string): string {
  return urlOf(preservationApi.download, { params: { id } });
}
