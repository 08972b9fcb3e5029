import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { importsApi } from '@toneledger/common/api/imports';
import type { ImportRowsQuery } from '@toneledger/common/schemas/catalogue';
import { call } from '@/lib/api-client';
import { importKeys } from '@/features/catalogue/api/keys';

export function importRowsQueryOptions(id: string, query: ImportRowsQuery) {
  return queryOptions({
    queryKey: importKeys.rows(id, query),
    queryFn: ({ signal }) => call(importsApi.rows, { params: { id }, query, signal }),
    placeholderData: keepPreviousData,
  });
}

/** A page of what a checked file's rows would do: create, update (with the changes) or nothing. */
export function useImportRows(id: string, query: ImportRowsQuery) {
  return useQuery(importRowsQueryOptions(id, query));
}
