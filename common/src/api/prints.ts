import { z } from 'zod';
import { dataEnvelope, pageEnvelope } from '../schemas/envelope';
import {
  historyEventSchema, movementInputSchema, movementSchema, printInputSchema, printListItemSchema, printListQuerySchema, printSchema,
  printUpdateSchema, stepsReplaceSchema,
} from '../schemas/catalogue';
import { timelineEntrySchema } from '../schemas/images';
import { deletedSchema, idParamsSchema, versionQuerySchema } from '../schemas/primitives';
import { endpoint } from './endpoint';

const printEnvelope = dataEnvelope(printSchema);

export const printsApi = {
  list: endpoint({
    method: 'get', path: '/api/prints', summary: 'The catalogue: full-text search, filter by every controlled field, sort, page', tags: ['prints'],
    access: 'catalogue.read', query: printListQuerySchema, response: { description: 'A page of prints', schema: pageEnvelope(printListItemSchema) },
  }),
  exportCsv: endpoint({
    method: 'get', path: '/api/prints/export.csv', summary: 'The current filtered list as CSV (same query as the list; page ignored)', tags: ['prints'],
    access: 'catalogue.read', query: printListQuerySchema, response: { description: 'CSV, UTF-8, one row per print', contentType: 'text/csv' },
  }),
  exportStepsCsv: endpoint({
    method: 'get', path: '/api/prints/export-steps.csv',
    summary: 'The process histories of the current filtered list as CSV, one row per step keyed by accession number and step (same query as the list)', tags: ['prints'],
    access: 'catalogue.read', query: printListQuerySchema, response: { description: 'CSV, UTF-8, one row per step', contentType: 'text/csv' },
  }),
  create: endpoint({
    method: 'post', path: '/api/prints', summary: 'Catalogues a print (409 if the accession number is taken)', tags: ['prints'],
    access: 'catalogue.write', body: printInputSchema, status: 201, idempotent: true, response: { description: 'The new print', schema: printEnvelope },
  }),
  get: endpoint({
    method: 'get', path: '/api/prints/:id', summary: 'One print with its process history and warnings', tags: ['prints'],
    access: 'catalogue.read', params: idParamsSchema, response: { description: 'The print', schema: printEnvelope },
  }),
  update: endpoint({
    method: 'patch', path: '/api/prints/:id', summary: 'Edits a print; a stale version gets 409 with the current record', tags: ['prints'],
    access: 'catalogue.write', params: idParamsSchema, body: printUpdateSchema, response: { description: 'The edited print', schema: printEnvelope },
  }),
  deletion: endpoint({
    method: 'get', path: '/api/prints/:id/deletion', summary: 'Whether the print may be deleted now, and why not (asked before the command is offered)', tags: ['prints'],
    access: 'catalogue.write', params: idParamsSchema,
    response: { description: 'Whether it may be deleted', schema: dataEnvelope(z.object({ ok: z.boolean(), reason: z.string().nullable() })) },
  }),
  remove: endpoint({
    method: 'delete', path: '/api/prints/:id', summary: 'Deletes a print; the whole record stays in the audit trail', tags: ['prints'],
    access: 'catalogue.write', params: idParamsSchema, query: versionQuerySchema, response: { description: 'Deleted', schema: dataEnvelope(deletedSchema) },
  }),
  replaceSteps: endpoint({
    method: 'put', path: '/api/prints/:id/steps', summary: 'Replaces the ordered process history of a print', tags: ['prints'],
    access: 'catalogue.write', params: idParamsSchema, body: stepsReplaceSchema, response: { description: 'The print', schema: printEnvelope },
  }),
  movements: endpoint({
    method: 'get', path: '/api/prints/:id/movements', summary: 'Where the print has been, newest first', tags: ['prints'],
    access: 'catalogue.read_restricted', params: idParamsSchema, response: { description: 'Movements', schema: dataEnvelope(z.array(movementSchema)) },
  }),
  move: endpoint({
    method: 'post', path: '/api/prints/:id/movements', summary: 'Moves a print and records from, to, when, who and why', tags: ['prints'],
    access: 'prints.move', params: idParamsSchema, body: movementInputSchema, status: 201, idempotent: true, response: { description: 'The print', schema: printEnvelope },
  }),
  history: endpoint({
    method: 'get', path: '/api/prints/:id/history', summary: 'Every change to the print: who, when, before and after', tags: ['prints'],
    access: 'catalogue.read_restricted', params: idParamsSchema, response: { description: 'History', schema: dataEnvelope(z.array(historyEventSchema)) },
  }),
  exportJson: endpoint({
    method: 'get', path: '/api/prints/:id/export.json', summary: 'One print with everything, as a JSON file', tags: ['prints'],
    access: 'catalogue.read', params: idParamsSchema, response: { description: 'JSON document', contentType: 'application/json' },
  }),
  timeline: endpoint({
    method: 'get', path: '/api/prints/:id/timeline', summary: "One timeline of a print's life: cataloguing, movements, condition, images", tags: ['prints'],
    access: 'catalogue.read', params: idParamsSchema, response: { description: 'Newest first', schema: dataEnvelope(z.array(timelineEntrySchema)) },
  }),
};
