import { z } from 'zod';
import { dataEnvelope, pageEnvelope } from '../schemas/envelope';
import {
  catalogueSettingsSchema, enclosureInputSchema, enclosureSchema, enclosureUpdateSchema, locationInputSchema, locationSchema,
  locationUpdateSchema, makerInputSchema, makerSchema, makerUpdateSchema, paperInputSchema, paperSchema, paperUpdateSchema,
  recipeInputSchema, recipeSchema, recipeUpdateSchema, referenceListQuerySchema,
} from '../schemas/catalogue';
import { idParamsSchema } from '../schemas/primitives';
import type { Permission } from '../domain/roles';
import { endpoint } from './endpoint';
import { settingsSection } from './settings-section';

/** The four endpoints of a reference record (list, create, get, edit), from its schemas. */
function referenceRecord<
  const Path extends string, Item extends z.ZodType, Input extends z.ZodType, Update extends z.ZodType, Read extends Permission,
>(s: { path: Path; noun: string; item: Item; input: Input; update: Update; read: Read }) {
  const tags = [s.path] as const;
  return {
    list: endpoint({
      method: 'get', path: `/api/${s.path}`, summary: `Lists ${s.noun}s (search with q)`, tags, access: s.read,
      query: referenceListQuerySchema, response: { description: `A page of ${s.noun}s`, schema: pageEnvelope(s.item) },
    }),
    create: endpoint({
      method: 'post', path: `/api/${s.path}`, summary: `Creates a ${s.noun}`, tags, access: 'catalogue.write',
      body: s.input, status: 201, idempotent: true, response: { description: `The new ${s.noun}`, schema: dataEnvelope(s.item) },
    }),
    get: endpoint({
      method: 'get', path: `/api/${s.path}/:id`, summary: `One ${s.noun}`, tags, access: s.read,
      params: idParamsSchema, response: { description: `The ${s.noun}`, schema: dataEnvelope(s.item) },
    }),
    update: endpoint({
      method: 'patch', path: `/api/${s.path}/:id`, summary: `Edits a ${s.noun} (409 if it changed since version)`, tags, access: 'catalogue.write',
      params: idParamsSchema, body: s.update, response: { description: `The edited ${s.noun}`, schema: dataEnvelope(s.item) },
    }),
  };
}

export const makersApi = referenceRecord({
  path: 'makers', noun: 'maker', item: makerSchema, input: makerInputSchema, update: makerUpdateSchema, read: 'catalogue.read',
});
export const papersApi = referenceRecord({
  path: 'papers', noun: 'paper', item: paperSchema, input: paperInputSchema, update: paperUpdateSchema, read: 'catalogue.read',
});
export const recipesApi = referenceRecord({
  path: 'recipes', noun: 'bath recipe', item: recipeSchema, input: recipeInputSchema, update: recipeUpdateSchema, read: 'catalogue.read',
});
export const enclosuresApi = referenceRecord({
  path: 'enclosures', noun: 'enclosure type', item: enclosureSchema, input: enclosureInputSchema, update: enclosureUpdateSchema, read: 'catalogue.read',
});
export const locationsApi = referenceRecord({
  path: 'locations', noun: 'location', item: locationSchema, input: locationInputSchema, update: locationUpdateSchema,
  read: 'catalogue.read_restricted',
});

export const catalogueSettingsApi = settingsSection({
  name: 'catalogue', title: 'Catalogue settings', read: 'catalogue.read', schema: catalogueSettingsSchema, tags: ['settings'],
  readSummary: "The institution's name and accession-number pattern", changeSummary: 'Changes the catalogue settings (the pattern is checked)',
});
