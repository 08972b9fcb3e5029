import { z } from 'zod';
import { dataEnvelope, pageEnvelope } from '../schemas/envelope';
import {
  approvalInputSchema, displayInputSchema, displaySchema, displayUpdateSchema, exhibitionDetailSchema, exhibitionInputSchema, exhibitionListQuerySchema,
  exhibitionObjectInputSchema, exhibitionSchema, exhibitionUpdateSchema,
} from '../schemas/exhibitions';
import { deletedSchema, id, idParamsSchema, versionQuerySchema } from '../schemas/primitives';
import { endpoint } from './endpoint';

const detailEnvelope = dataEnvelope(exhibitionDetailSchema);
const printParams = z.object({ id, printId: id });

/** Exhibitions (registrars), their object lists, display periods (registrars and conservators) and approval for display (conservators). */
export const exhibitionsApi = {
  list: endpoint({
    method: 'get', path: '/api/exhibitions', summary: 'Exhibitions, latest opening first, filtered by words and by current, coming or past', tags: ['exhibitions'],
    access: 'loans.read', query: exhibitionListQuerySchema, response: { description: 'A page of exhibitions', schema: pageEnvelope(exhibitionSchema) },
  }),
  create: endpoint({
    method: 'post', path: '/api/exhibitions', summary: 'Records an exhibition with its venues and dates', tags: ['exhibitions'],
    access: 'loans.write', body: exhibitionInputSchema, status: 201, idempotent: true, response: { description: 'The exhibition', schema: detailEnvelope },
  }),
  get: endpoint({
    method: 'get', path: '/api/exhibitions/:id', summary: 'One exhibition with its object list, display periods and each object\'s light figures', tags: ['exhibitions'],
    access: 'loans.read', params: idParamsSchema, response: { description: 'The exhibition', schema: detailEnvelope },
  }),
  update: endpoint({
    method: 'patch', path: '/api/exhibitions/:id', summary: 'Edits an exhibition (venues, when given, replace the list; 409 when stale)', tags: ['exhibitions'],
    access: 'loans.write', params: idParamsSchema, body: exhibitionUpdateSchema, response: { description: 'The exhibition', schema: detailEnvelope },
  }),
  remove: endpoint({
    method: 'delete', path: '/api/exhibitions/:id', summary: 'Deletes an exhibition that has no display periods and no loan (409 otherwise)', tags: ['exhibitions'],
    access: 'loans.write', params: idParamsSchema, query: versionQuerySchema, response: { description: 'Deleted', schema: dataEnvelope(deletedSchema) },
  }),
  addObjects: endpoint({
    method: 'post', path: '/api/exhibitions/:id/objects', summary: 'Adds prints to the object list (each waits for a conservator\'s approval)', tags: ['exhibitions'],
    access: 'loans.write', params: idParamsSchema, body: exhibitionObjectInputSchema, response: { description: 'The exhibition', schema: detailEnvelope },
  }),
  removeObject: endpoint({
    method: 'delete', path: '/api/exhibitions/:id/objects/:printId', summary: 'Takes a print off the object list with its display periods', tags: ['exhibitions'],
    access: 'loans.write', params: printParams, query: versionQuerySchema, response: { description: 'The exhibition', schema: detailEnvelope },
  }),
  decide: endpoint({
    method: 'put', path: '/api/exhibitions/:id/objects/:printId/approval', summary: 'Approves a print for display, or refuses it with a reason (conservators)',
    tags: ['exhibitions'], access: 'displays.approve', params: printParams, body: approvalInputSchema,
    response: { description: 'The exhibition', schema: detailEnvelope },
  }),
  checklistCsv: endpoint({
    method: 'get', path: '/api/exhibitions/:id/objects.csv', summary: 'The object list as CSV, with display periods and light figures', tags: ['exhibitions'],
    access: 'loans.read', params: idParamsSchema, response: { description: 'CSV, UTF-8, one row per display period', contentType: 'text/csv' },
  }),
};

/** Display periods: a print on show, with its illuminance and hours, from which its light dose is summed. */
export const displaysApi = {
  create: endpoint({
    method: 'post', path: '/api/exhibitions/:id/displays', summary: 'Adds a display period for a print on the object list (409 when it overlaps another)',
    tags: ['exhibitions', 'light'], access: 'displays.write', params: idParamsSchema, body: displayInputSchema, status: 201, idempotent: true,
    response: { description: 'The display period', schema: dataEnvelope(displaySchema) },
  }),
  update: endpoint({
    method: 'patch', path: '/api/displays/:id', summary: 'Edits a display period: dates, illuminance, hours, days, UV, case and mount (409 when stale or overlapping)',
    tags: ['exhibitions', 'light'], access: 'displays.write', params: idParamsSchema, body: displayUpdateSchema,
    response: { description: 'The display period', schema: dataEnvelope(displaySchema) },
  }),
  remove: endpoint({
    method: 'delete', path: '/api/displays/:id', summary: 'Deletes a display period', tags: ['exhibitions', 'light'],
    access: 'displays.write', params: idParamsSchema, query: versionQuerySchema, response: { description: 'Deleted', schema: dataEnvelope(deletedSchema) },
  }),
};
