import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { conditionTermsApi } from '@toneledger/common/api/condition';
import { researchApi } from '@toneledger/common/api/research';
import type { CohortFigure, CohortQuery, SavedQuery } from '@toneledger/common/schemas/research';
import { call, callData, callFile } from '@/lib/api-client';
import { researchKeys, type PrintsAsk } from '@/features/research/api/keys';

/**
 * The screen's figures in three parts, asked for at once so each is shown when it is ready (and the
 * server works on them side by side): the fading rates; the survival curves with the incidence of
 * terms; the Cox model. Every part also answers the groups with their sizes.
 */
export const COHORT_PARTS = { fading: ['fading'], survival: ['survival', 'incidence'], cox: ['cox'] } as const satisfies Record<string, readonly CohortFigure[]>;
export type CohortPart = keyof typeof COHORT_PARTS;

/** Runs one part of the query (reads only); nothing is asked until there is a query, nor the Cox part without its factors. */
export function useCohort(query: CohortQuery | null, part: CohortPart) {
  return useQuery({
    queryKey: researchKeys.cohort(query!, part),
    queryFn: ({ signal }) => callData(researchApi.run, { query: { figures: COHORT_PARTS[part].join(',') }, body: query!, signal }),
    enabled: query !== null && (part !== 'cox' || query.coxFactors.length > 0),
    placeholderData: keepPreviousData,
  });
}

export function useCohortPrints(query: CohortQuery, ask: PrintsAsk, page: number) {
  return useQuery({
    queryKey: researchKeys.prints(query, ask, page),
    queryFn: ({ signal }) => call(researchApi.prints, { body: { query, ...ask, page, pageSize: 50 }, signal }),
    placeholderData: keepPreviousData,
  });
}

/** The values each text factor takes, with their counts. */
export function useFactorValues() {
  return useQuery({ queryKey: researchKeys.factors(), queryFn: ({ signal }) => callData(researchApi.factors, { signal }), staleTime: 5 * 60_000 });
}

/** The deterioration vocabulary, for the "observation" event. */
export function useTerms() {
  return useQuery({
    queryKey: researchKeys.terms(),
    queryFn: ({ signal }) => callData(conditionTermsApi.list, { query: { all: 'true' }, signal }),
    staleTime: 5 * 60_000,
  });
}

export function useSavedQueries(mine: boolean) {
  return useQuery({
    queryKey: researchKeys.savedList(mine),
    queryFn: ({ signal }) => call(researchApi.listSaved, { query: { mine: mine ? 'true' : undefined, pageSize: 100 }, signal }),
  });
}

export function useSaveQuery() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: BodyIn<typeof researchApi.save>) => callData(researchApi.save, { body }),
    onSuccess: () => qc.invalidateQueries({ queryKey: researchKeys.saved() }),
  });
}

export function useUpdateSaved() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, body }: { id: string; body: BodyIn<typeof researchApi.updateSaved> }) => callData(researchApi.updateSaved, { params: { id }, body }),
    onSuccess: () => qc.invalidateQueries({ queryKey: researchKeys.saved() }),
  });
}

export function useDeleteSaved() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (q: Pick<SavedQuery, 'id' | 'version'>) => {
      await call(researchApi.deleteSaved, { params: { id: q.id }, query: { version: q.version } });
    },
    onSuccess: () => qc.invalidateQueries({ queryKey: researchKeys.saved() }),
  });
}

/** Downloads the data package of a query: the zip is handed to the browser as a file. */
export function useExportPackage() {
  return useMutation({
    mutationFn: async (query: CohortQuery) => {
      const { blob, fileName } = await callFile(researchApi.export, { body: query });
      const url = URL.createObjectURL(blob);
      const a = document.createElement('a');
      a.href = url;
      a.download = fileName ?? 'cohort-data-package.zip';
      document.body.append(a);
      a.click();
      a.remove();
      setTimeout(() => URL.revokeObjectURL(url), 10_000);
      return fileName;
    },
  });
}
