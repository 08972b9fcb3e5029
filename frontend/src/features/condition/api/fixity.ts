import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { fixityApi } from '@toneledger/common/api/images';
import { callData } from '@/lib/api-client';
import { imageKeys } from '@/lib/images-api';
import { fixityKeys } from '@/features/condition/api/keys';

export function fixityHistoryQueryOptions(imageId: string) {
  return queryOptions({
    queryKey: imageKeys.fixity(imageId),
    queryFn: ({ signal }) => callData(fixityApi.history, { params: { id: imageId }, signal }),
  });
}

export function useFixityHistory(imageId: string, enabled: boolean) {
  return useQuery({ ...fixityHistoryQueryOptions(imageId), enabled });
}

export function fixityAlertsQueryOptions() {
  return queryOptions({
    queryKey: fixityKeys.alerts(),
    queryFn: ({ signal }) => callData(fixityApi.alerts, { signal }),
  });
}

export function useFixityAlerts(enabled: boolean) {
  return useQuery({ ...fixityAlertsQueryOptions(), enabled });
}

export function runFixityCheck() {
  return callData(fixityApi.runAll, { body: {} });
}

export function useRunFixityCheck() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: runFixityCheck,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: fixityKeys.all }),
  });
}
