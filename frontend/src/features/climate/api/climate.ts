import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { climateApi, climateSettingsApi } from '@toneledger/common/api/climate';
import type { ClimateFile, ClimateMapping } from '@toneledger/common/schemas/climate';
import { call, callData } from '@/lib/api-client';
import { climateKeys, climateSettingsKeys, type Period } from '@/features/climate/api/keys';

const query = (p: Period) => ({ ...(p.from ? { from: p.from } : {}), ...(p.to ? { to: p.to } : {}) });

export function useClimateRooms(p: Period) {
  return useQuery({
    queryKey: climateKeys.rooms(p),
    queryFn: ({ signal }) => callData(climateApi.rooms, { query: query(p), signal }),
    placeholderData: keepPreviousData,
  });
}

export function useClimateSummary(id: string, p: Period) {
  return useQuery({
    queryKey: climateKeys.summary(id, p),
    queryFn: ({ signal }) => callData(climateApi.summary, { params: { id }, query: query(p), signal }),
    placeholderData: keepPreviousData,
  });
}

export function useClimateSeries(id: string, p: Period) {
  return useQuery({
    queryKey: climateKeys.series(id, p),
    queryFn: ({ signal }) => callData(climateApi.series, { params: { id }, query: query(p), signal }),
    placeholderData: keepPreviousData,
  });
}

export function useClimateFiles(id: string) {
  return useQuery({ queryKey: climateKeys.files(id), queryFn: ({ signal }) => callData(climateApi.files, { params: { id }, signal }) });
}

/** Uploads a logger CSV for a location (multipart field `file`): nothing is read into the readings yet. */
export function useUploadClimateFile(locationId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (file: File) => {
      const form = new FormData();
      form.append('file', file, file.name);
      return callData(climateApi.upload, { params: { id: locationId }, body: form as never });
    },
    onSuccess: () => qc.invalidateQueries({ queryKey: climateKeys.files(locationId) }),
  });
}

export function useCheckClimateFile() {
  return useMutation({
    mutationFn: ({ id, mapping }: { id: string; mapping: ClimateMapping }) => callData(climateApi.check, { params: { id }, body: { mapping } }),
  });
}

/** Accepting writes the readings: every figure of the location is asked for again. */
export function useAcceptClimateFile() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, mapping }: { id: string; mapping: ClimateMapping }) => callData(climateApi.accept, { params: { id }, body: { mapping } }),
    onSuccess: async () => {
      await qc.invalidateQueries({ queryKey: climateKeys.all });
    },
  });
}

export function useDiscardClimateFile(locationId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (file: Pick<ClimateFile, 'id'>) => { await call(climateApi.discard, { params: { id: file.id } }); },
    onSuccess: () => qc.invalidateQueries({ queryKey: climateKeys.files(locationId) }),
  });
}

export function useClimateSettings() {
  return useQuery({
    queryKey: climateSettingsKeys.all,
    queryFn: ({ signal }) => callData(climateSettingsApi.get, { signal }),
    staleTime: 5 * 60_000,
  });
}

/** New targets or constants change every figure, so all climate queries are asked for again. */
export function useUpdateClimateSettings() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: BodyIn<typeof climateSettingsApi.put>) => callData(climateSettingsApi.put, { body }),
    onSuccess: async (settings) => {
      qc.setQueryData(climateSettingsKeys.all, settings);
      await qc.invalidateQueries({ queryKey: climateKeys.all });
    },
  });
}
