import type { z } from 'zod';
import { dataEnvelope } from '../schemas/envelope';
import {
  applyBody, bulkExhibitionSchema, bulkExportBodySchema, bulkMoveSchema, bulkPreviewSchema, bulkRehouseSchema, bulkResultSchema, bulkRoundSchema,
  bulkStatusSchema, previewBody, savedSearchInputSchema, savedSearchSchema, savedSearchUpdateSchema,
} from '../schemas/bulk';
import { deletedSchema, idParamsSchema, versionQuerySchema } from '../schemas/primitives';
import type { Permission } from '../domain/roles';
import { endpoint } from './endpoint';

/** The preview and the apply of one action, from the action's one description. */
function action<const N extends string, const A extends Permission, S extends z.ZodRawShape>(name: N, access: A, shape: S, what: string) {
  return {
    preview: endpoint({
      method: 'post', path: `/api/prints-bulk/${name}/preview`, summary: `What ${what} would change, print by print, with its warnings (nothing is written)`,
      tags: ['bulk'], access, body: previewBody(shape), response: { description: 'The preview', schema: dataEnvelope(bulkPreviewSchema) },
    }),
    apply: endpoint({
      method: 'post', path: `/api/prints-bulk/${name}`,
      summary: `${what[0].toUpperCase()}${what.slice(1)}: one transaction, one audit entry per changed print; 409 with a fresh preview when the selection changed since the preview`,
      tags: ['bulk'], access, body: applyBody(shape), response: { description: 'What was done', schema: dataEnvelope(bulkResultSchema) },
    }),
  };
}

const move = action('move', 'prints.move', bulkMoveSchema.shape, 'moving the prints to a place');
const rehouse = action('rehouse', 'prints.move', bulkRehouseSchema.shape, 'rehousing the prints in another enclosure');
const status = action('status', 'catalogue.write', bulkStatusSchema.shape, 'changing the prints\' status');
const round = action('round', 'schedule.write', bulkRoundSchema.shape, 'adding the prints to a planned inspection round');
const exhibition = action('exhibition', 'loans.write', bulkExhibitionSchema.shape, 'adding the prints to an exhibition\'s object list');

export const bulkApi = {
  movePreview: move.preview, move: move.apply,
  rehousePreview: rehouse.preview, rehouse: rehouse.apply,
  statusPreview: status.preview, status: status.apply,
  roundPreview: round.preview, round: round.apply,
  exhibitionPreview: exhibition.preview, exhibition: exhibition.apply,
  exportCsv: endpoint({
    method: 'post', path: '/api/prints-bulk/export.csv', summary: 'The selected prints as CSV (the catalogue export\'s columns), streamed', tags: ['bulk'],
    access: 'catalogue.read', body: bulkExportBodySchema, response: { description: 'CSV, UTF-8, one row per print', contentType: 'text/csv' },
  }),
  exportJson: endpoint({
    method: 'post', path: '/api/prints-bulk/export.json', summary: 'The selected prints as JSON, each as the single print export gives it, streamed', tags: ['bulk'],
    access: 'catalogue.read', body: bulkExportBodySchema, response: { description: 'JSON document', contentType: 'application/json' },
  }),
};

export const savedSearchesApi = {
  list: endpoint({
    method: 'get', path: '/api/saved-searches', summary: 'Saved catalogue searches: my own and those shared', tags: ['bulk'],
    access: 'catalogue.read', response: { description: 'Searches, mine first', schema: dataEnvelope(savedSearchSchema.array()) },
  }),
  create: endpoint({
    method: 'post', path: '/api/saved-searches', summary: 'Saves the current catalogue search under a name', tags: ['bulk'],
    access: 'catalogue.read', body: savedSearchInputSchema, status: 201, idempotent: true, response: { description: 'The search', schema: dataEnvelope(savedSearchSchema) },
  }),
  update: endpoint({
    method: 'patch', path: '/api/saved-searches/:id', summary: 'Renames, shares or changes a saved search (its owner only; 409 when stale)', tags: ['bulk'],
    access: 'catalogue.read', params: idParamsSchema, body: savedSearchUpdateSchema, response: { description: 'The search', schema: dataEnvelope(savedSearchSchema) },
  }),
  remove: endpoint({
    method: 'delete', path: '/api/saved-searches/:id', summary: 'Deletes a saved search (its owner only)', tags: ['bulk'],
    access: 'catalogue.read', params: idParamsSchema, query: versionQuerySchema, response: { description: 'Deleted', schema: dataEnvelope(deletedSchema) },
  }),
};
