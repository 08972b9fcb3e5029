import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BodyIn, DataOf } from '@toneledger/common/api/endpoint';
import type { enclosuresApi, locationsApi, makersApi, papersApi, recipesApi } from '@toneledger/common/api/reference';
import { callData } from '@/lib/api-client';

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

type ReferenceContract = typeof makersApi | typeof papersApi | typeof recipesApi | typeof locationsApi | typeof enclosuresApi;
/** The record a reference contract's create and edit answer. */
type RecordOf<C extends ReferenceContract> = DataOf<C['create']> & { id: string };

// The five contracts are made by one definition and share one shape: each call is typed per contract by its signature.
type AnyCreate = typeof makersApi.create;
type AnyUpdate = typeof makersApi.update;

export async function createReference<C extends ReferenceContract>(contract: C, body: BodyIn<C['create']>): Promise<RecordOf<C>> {
  const created: unknown = await callData(contract.create as AnyCreate, { body: body as BodyIn<AnyCreate> });
  return created as RecordOf<C>;
}

export async function updateReference<C extends ReferenceContract>(contract: C, id: string, body: BodyIn<C['update']>): Promise<RecordOf<C>> {
  const updated: unknown = await callData(contract.update as AnyUpdate, { params: { id }, body: body as BodyIn<AnyUpdate> });
  return updated as RecordOf<C>;
}

/**
 * Create-or-update for one reference resource: POST without an id, PATCH with one. On success the
 * record is put in its detail query and every list of the resource is fetched again. The body is
 * what the record form checked with the contract's schema.
 */
export function useSaveReference<C extends ReferenceContract>(keys: ReferenceKeys, contract: C) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, body }: SaveRequest) =>
      id ? updateReference(contract, id, body as BodyIn<C['update']>) : createReference(contract, body as BodyIn<C['create']>),
    onSuccess: async (record) => {
      queryClient.setQueryData(keys.detail(record.id), record);
      await queryClient.invalidateQueries({ queryKey: keys.lists() });
    },
  });
}
