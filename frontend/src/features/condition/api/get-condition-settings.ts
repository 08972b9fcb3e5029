import { queryOptions, useQuery } from '@tanstack/react-query';
import { conditionSettingsApi } from '@toneledger/common/api/condition';
import { DEFAULT_GRADE_DEFINITIONS, type GradeDefinitions } from '@toneledger/common/schemas/condition';
import { callData } from '@/lib/api-client';
import { settingsKeys } from '@/features/condition/api/keys';

export function conditionSettingsQueryOptions() {
  return queryOptions({
    queryKey: settingsKeys.condition(),
    queryFn: ({ signal }) => callData(conditionSettingsApi.get, { signal }),
    staleTime: 5 * 60_000,
  });
}

/** The written definition of each grade: the institution's own once loaded, the defaults until then. */
export function useGradeDefinitions(): { definitions: GradeDefinitions; loaded: boolean } {
  const settings = useQuery(conditionSettingsQueryOptions());
  return { definitions: settings.data?.grades ?? DEFAULT_GRADE_DEFINITIONS, loaded: settings.isSuccess };
}
