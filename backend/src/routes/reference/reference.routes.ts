import { enclosuresApi, locationsApi, makersApi, papersApi, recipesApi } from '@toneledger/common/api/reference';
import { implement, type RouteDef } from '../../http/route';
import {
  createReference, enclosures, getReference, listReference, locations, makers, papers, recipes, updateReference, type ReferenceKind,
} from '../../services/reference.service';

type ReferenceContract = typeof makersApi | typeof papersApi | typeof recipesApi | typeof enclosuresApi | typeof locationsApi;

/** The four endpoints of a reference record, served by the one generic service. */
function referenceRecord<C extends ReferenceContract>(contract: C, kind: ReferenceKind<never, unknown>): RouteDef[] {
  // The generic service works on any kind; each kind's presenter gives the item schema of its contract.
  return implement(contract as typeof makersApi, {
    list: async ({ query }) => {
      const { rows, total } = await listReference(kind, query);
      return { data: rows as never, pagination: { page: query.page, pageSize: query.pageSize, total } };
    },
    create: async ({ body, actor, requestId }) => ({ data: (await createReference(kind, body as never, actor, requestId)) as never }),
    get: async ({ params }) => ({ data: (await getReference(kind, params.id)) as never }),
    update: async ({ params, body, actor, requestId }) => ({ data: (await updateReference(kind, params.id, body as never, actor, requestId)) as never }),
  });
}

export function referenceRoutes(): RouteDef[] {
  const k = <M>(x: M) => x as unknown as ReferenceKind<never, unknown>;
  return [
    ...referenceRecord(makersApi, k(makers)),
    ...referenceRecord(papersApi, k(papers)),
    ...referenceRecord(recipesApi, k(recipes)),
    ...referenceRecord(enclosuresApi, k(enclosures)),
    ...referenceRecord(locationsApi, k(locations)),
  ];
}
