import { useMutation, useQueryClient } from '@tanstack/react-query';
import { requestData } from '@/lib/api-client';

/** What a record form sends: a whole new record (`id: null`), or the changed fields and `version`. */
export interface SaveRequest {
  id: string | null;
  body: Record<string, unknown>;
}

/** The part of a resource's query keys a save touches (see `@/lib/reference-api`). */
interface ReferenceKeys {
  lists: () => readonly unknown[];
  detail: (id: string) => readonly unknown[];
}

export function createReference<T>(path: string, body: unknown): Promise<T> {
  return requestData<T>(path, { method: 'POST', body });
}

export function updateReference<T>(path: string, id: string, body: unknown): Promise<T> {
  return requestData<T>(`${path}/${encodeURIComponent(id)}`, { method: 'PATCH', body });
}

/**
 * Create-or-update for one reference resource: POST without an id, PATCH with one. On success the
 * record is put in its detail query and every list of the resource is fetched again.
 */
export function useSaveReference<T extends { id: string }>(keys: ReferenceKeys, path: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, body }: SaveRequest) => (id ? updateReference<T>(path, id, body) : createReference<T>(path, body)),
    onSuccess: async (record) => {
      queryClient.setQueryData(keys.detail(record.id), record);
      await queryClient.invalidateQueries({ queryKey: keys.lists() });
    },
  });
}
