import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { FixityResult, fixityAlertSchema } from '@toneledger/common/schemas/images';
import { requestData } from '@/lib/api-client';
import { fixityKeys, imageKeys } from '@/features/condition/api/keys';

export type FixityAlert = z.infer<typeof fixityAlertSchema>;

export function getFixityHistory(imageId: string, signal?: AbortSignal): Promise<FixityResult[]> {
  return requestData<FixityResult[]>(`/api/images/${encodeURIComponent(imageId)}/fixity`, { signal });
}

export function fixityHistoryQueryOptions(imageId: string) {
  return queryOptions({
    queryKey: imageKeys.fixity(imageId),
    queryFn: ({ signal }) => getFixityHistory(imageId, signal),
  });
}

export function useFixityHistory(imageId: string, enabled: boolean) {
  return useQuery({ ...fixityHistoryQueryOptions(imageId), enabled });
}

export function getFixityAlerts(signal?: AbortSignal): Promise<FixityAlert[]> {
  return requestData<FixityAlert[]>('/api/admin/fixity/alerts', { signal });
}

export function fixityAlertsQueryOptions() {
  return queryOptions({
    queryKey: fixityKeys.alerts(),
    queryFn: ({ signal }) => getFixityAlerts(signal),
  });
}

export function useFixityAlerts(enabled: boolean) {
  return useQuery({ ...fixityAlertsQueryOptions(), enabled });
}

export function runFixityCheck(): Promise<{ jobId: string | null }> {
  return requestData<{ jobId: string | null }>('/api/admin/fixity/run', { method: 'POST', body: {} });
}

export function useRunFixityCheck() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: runFixityCheck,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: fixityKeys.all }),
  });
}
