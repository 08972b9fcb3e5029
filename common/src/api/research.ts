import { z } from 'zod';
import { dataEnvelope, pageEnvelope } from '../schemas/envelope';
import { idParamsSchema, versionQuerySchema } from '../schemas/primitives';
import {
  cohortPrintSchema, cohortPrintsInputSchema, cohortQuerySchema, cohortResultSchema, cohortRunQuerySchema, savedQueryInputSchema, savedQueryListSchema, savedQuerySchema,
  savedQueryUpdateSchema,
} from '../schemas/research';
import { endpoint } from './endpoint';

export const researchApi = {
  run: endpoint({
    method: 'post', path: '/api/research/cohort',
    summary: 'Runs a cohort query: groups with their sizes, and the figures asked for (`figures`, all when left out): fading rates, Kaplan–Meier curves with the log-rank test, incidence of deterioration terms, a Cox model (reads only)',
    tags: ['research'], access: 'research.run', query: cohortRunQuerySchema, body: cohortQuerySchema, response: { description: 'Figures', schema: dataEnvelope(cohortResultSchema) },
  }),
  prints: endpoint({
    method: 'post', path: '/api/research/cohort/prints', summary: 'The prints behind a figure of a cohort query (reads only)',
    tags: ['research'], access: 'research.run', body: cohortPrintsInputSchema, response: { description: 'Prints', schema: pageEnvelope(cohortPrintSchema) },
  }),
  export: endpoint({
    method: 'post', path: '/api/research/cohort/export',
    summary: 'A Frictionless Data Package (zip): datapackage.json with a Table Schema per resource, the cohort as CSV and JSON (one row per print), the chart data, the query and a README; audited',
    tags: ['research'], access: 'research.export', body: cohortQuerySchema, response: { description: 'Zip', contentType: 'application/zip' },
  }),
  listSaved: endpoint({
    method: 'get', path: '/api/research/queries', summary: 'Saved queries: my own and those shared', tags: ['research'], access: 'research.run',
    query: savedQueryListSchema, response: { description: 'Queries', schema: pageEnvelope(savedQuerySchema) },
  }),
  getSaved: endpoint({
    method: 'get', path: '/api/research/queries/:id', summary: 'One saved query (its owner, or anyone when shared)', tags: ['research'], access: 'research.run',
    params: idParamsSchema, response: { description: 'Query', schema: dataEnvelope(savedQuerySchema) },
  }),
  save: endpoint({
    method: 'post', path: '/api/research/queries', summary: 'Saves a query with a name and description', tags: ['research'], access: 'research.run',
    body: savedQueryInputSchema, status: 201, idempotent: true, response: { description: 'Query', schema: dataEnvelope(savedQuerySchema) },
  }),
  updateSaved: endpoint({
    method: 'patch', path: '/api/research/queries/:id', summary: 'Changes a saved query (its owner only)', tags: ['research'], access: 'research.run',
    params: idParamsSchema, body: savedQueryUpdateSchema, response: { description: 'Query', schema: dataEnvelope(savedQuerySchema) },
  }),
  deleteSaved: endpoint({
    method: 'delete', path: '/api/research/queries/:id', summary: 'Deletes a saved query (its owner only; audited)', tags: ['research'], access: 'research.run',
    params: idParamsSchema, query: versionQuerySchema, status: 204, response: { description: 'Deleted' },
  }),
  factors: endpoint({
    method: 'get', path: '/api/research/factors', summary: 'The values each text factor takes in the collection (for the query builder)', tags: ['research'],
    access: 'research.run', response: { description: 'Values', schema: dataEnvelope(z.record(z.string(), z.array(z.object({ value: z.string(), count: z.number().int() })))) },
  }),
};
