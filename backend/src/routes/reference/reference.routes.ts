import type { z } from 'zod';
import { dataEnvelope, pageEnvelope } from '@toneledger/common/schemas/envelope';
import {
  enclosureInputSchema, enclosureSchema, enclosureUpdateSchema, idParamsSchema, locationInputSchema, locationSchema, locationUpdateSchema,
  makerInputSchema, makerSchema, makerUpdateSchema, paperInputSchema, paperSchema, paperUpdateSchema, recipeInputSchema, recipeSchema,
  recipeUpdateSchema, referenceListQuerySchema,
} from '@toneledger/common/schemas/catalogue';
import type { Permission } from '@toneledger/common/domain/roles';
import { route, type RouteDef } from '../../http/route';
import { idOf } from '../../middleware/request-id';
import {
  createReference, enclosures, getReference, listReference, locations, makers, papers, recipes, updateReference, type ReferenceKind,
} from '../../services/reference.service';

interface Spec {
  path: string;
  tag: string;
  noun: string;
  kind: ReferenceKind<never, unknown>;
  item: z.ZodType;
  input: z.ZodType;
  update: z.ZodType;
  read: Permission;
}

function crud(s: Spec): RouteDef[] {
  return [
    route({
      method: 'get', path: `/api/${s.path}`, summary: `Lists ${s.noun}s (search with q)`, tags: [s.tag], access: s.read,
      query: referenceListQuerySchema, response: { description: `A page of ${s.noun}s`, schema: pageEnvelope(s.item) },
      handler: async ({ query }) => {
        const { rows, total } = await listReference(s.kind, query);
        return { data: rows, pagination: { page: query.page, pageSize: query.pageSize, total } };
      },
    }),
    route({
      method: 'post', path: `/api/${s.path}`, summary: `Creates a ${s.noun}`, tags: [s.tag], access: 'catalogue.write',
      body: s.input as z.ZodType<Record<string, unknown>>, status: 201, response: { description: `The new ${s.noun}`, schema: dataEnvelope(s.item) },
      handler: async ({ body, user, req }) => ({ data: await createReference(s.kind, body, { id: user!.id, name: user!.name }, idOf(req)) }),
    }),
    route({
      method: 'get', path: `/api/${s.path}/:id`, summary: `One ${s.noun}`, tags: [s.tag], access: s.read,
      params: idParamsSchema, response: { description: `The ${s.noun}`, schema: dataEnvelope(s.item) },
      handler: async ({ params }) => ({ data: await getReference(s.kind, params.id) }),
    }),
    route({
      method: 'patch', path: `/api/${s.path}/:id`, summary: `Edits a ${s.noun} (409 if it changed since version)`, tags: [s.tag], access: 'catalogue.write',
      params: idParamsSchema, body: s.update as z.ZodType<Record<string, unknown> & { version: number }>,
      response: { description: `The edited ${s.noun}`, schema: dataEnvelope(s.item) },
      handler: async ({ params, body, user, req }) => ({ data: await updateReference(s.kind, params.id, body, { id: user!.id, name: user!.name }, idOf(req)) }),
    }),
  ];
}

export function referenceRoutes(): RouteDef[] {
  const k = <M>(x: M) => x as unknown as ReferenceKind<never, unknown>;
  return [
    ...crud({ path: 'makers', tag: 'makers', noun: 'maker', kind: k(makers), item: makerSchema, input: makerInputSchema, update: makerUpdateSchema, read: 'catalogue.read' }),
    ...crud({ path: 'papers', tag: 'papers', noun: 'paper', kind: k(papers), item: paperSchema, input: paperInputSchema, update: paperUpdateSchema, read: 'catalogue.read' }),
    ...crud({ path: 'recipes', tag: 'recipes', noun: 'bath recipe', kind: k(recipes), item: recipeSchema, input: recipeInputSchema, update: recipeUpdateSchema, read: 'catalogue.read' }),
    ...crud({ path: 'enclosures', tag: 'enclosures', noun: 'enclosure type', kind: k(enclosures), item: enclosureSchema, input: enclosureInputSchema, update: enclosureUpdateSchema, read: 'catalogue.read' }),
    ...crud({ path: 'locations', tag: 'locations', noun: 'location', kind: k(locations), item: locationSchema, input: locationInputSchema, update: locationUpdateSchema, read: 'catalogue.read_restricted' }),
  ];
}
