import { z } from 'zod';
import { dataEnvelope, pageEnvelope } from '@toneledger/common/schemas/envelope';
import {
  historyEventSchema, idParamsSchema, movementInputSchema, movementSchema, printInputSchema, printListItemSchema, printListQuerySchema,
  printSchema, printUpdateSchema, stepsReplaceSchema,
} from '@toneledger/common/schemas/catalogue';
import { route, type RouteDef } from '../../http/route';
import { idOf } from '../../middleware/request-id';
import {
  createPrint, deletePrint, listMovements, listPrints, loadPrint, movePrint, printHistory, replaceSteps, updatePrint,
} from '../../services/print.service';
import { printJson, writePrintsCsv } from '../../services/print-export.service';
import { presentPrint } from '../../presenters/catalogue.presenter';

const printEnvelope = dataEnvelope(printSchema);

export function printsRoutes(): RouteDef[] {
  return [
    route({
      method: 'get', path: '/api/prints', summary: 'The catalogue: full-text search, filter by every controlled field, sort, page', tags: ['prints'],
      access: 'catalogue.read', query: printListQuerySchema, response: { description: 'A page of prints', schema: pageEnvelope(printListItemSchema) },
      handler: async ({ query, user }) => {
        const { rows, total, estimated } = await listPrints(query, user!.role);
        return { data: rows, pagination: { page: query.page, pageSize: query.pageSize, total, ...(estimated ? { estimated } : {}) } };
      },
    }),
    route({
      method: 'get', path: '/api/prints/export.csv', summary: 'The current filtered list as CSV (same query as the list; page ignored)', tags: ['prints'],
      access: 'catalogue.read', query: printListQuerySchema, response: { description: 'CSV, UTF-8, one row per print', contentType: 'text/csv' },
      handler: async ({ query, user, res }) => {
        res.setHeader('Content-Type', 'text/csv; charset=utf-8');
        res.setHeader('Content-Disposition', `attachment; filename="prints-${new Date().toISOString().slice(0, 10)}.csv"`);
        await writePrintsCsv(query, user!.role, res);
        res.end();
      },
    }),
    route({
      method: 'post', path: '/api/prints', summary: 'Catalogues a print (409 if the accession number is taken)', tags: ['prints'],
      access: 'catalogue.write', body: printInputSchema, status: 201, response: { description: 'The new print', schema: printEnvelope },
      handler: async ({ body, user, req }) => ({ data: presentPrint(await createPrint(body, { id: user!.id, name: user!.name }, idOf(req)), user!.role) }),
    }),
    route({
      method: 'get', path: '/api/prints/:id', summary: 'One print with its process history and warnings', tags: ['prints'],
      access: 'catalogue.read', params: idParamsSchema, response: { description: 'The print', schema: printEnvelope },
      handler: async ({ params, user }) => ({ data: presentPrint(await loadPrint(params.id), user!.role) }),
    }),
    route({
      method: 'patch', path: '/api/prints/:id', summary: 'Edits a print; a stale version gets 409 with the current record', tags: ['prints'],
      access: 'catalogue.write', params: idParamsSchema, body: printUpdateSchema, response: { description: 'The edited print', schema: printEnvelope },
      handler: async ({ params, body, user, req }) =>
        ({ data: presentPrint(await updatePrint(params.id, body, { id: user!.id, name: user!.name, role: user!.role }, idOf(req)), user!.role) }),
    }),
    route({
      method: 'delete', path: '/api/prints/:id', summary: 'Deletes a print; the whole record stays in the audit trail', tags: ['prints'],
      access: 'catalogue.write', params: idParamsSchema, query: z.object({ version: z.coerce.number().int().min(1) }),
      response: { description: 'Deleted', schema: dataEnvelope(z.object({ id: z.string() })) },
      handler: async ({ params, query, user, req }) => {
        await deletePrint(params.id, query.version, { id: user!.id, name: user!.name, role: user!.role }, idOf(req));
        return { data: { id: params.id } };
      },
    }),
    route({
      method: 'put', path: '/api/prints/:id/steps', summary: 'Replaces the ordered process history of a print', tags: ['prints'],
      access: 'catalogue.write', params: idParamsSchema, body: stepsReplaceSchema, response: { description: 'The print', schema: printEnvelope },
      handler: async ({ params, body, user, req }) =>
        ({ data: presentPrint(await replaceSteps(params.id, body, { id: user!.id, name: user!.name, role: user!.role }, idOf(req)), user!.role) }),
    }),
    route({
      method: 'get', path: '/api/prints/:id/movements', summary: 'Where the print has been, newest first', tags: ['prints'],
      access: 'catalogue.read_restricted', params: idParamsSchema, response: { description: 'Movements', schema: dataEnvelope(z.array(movementSchema)) },
      handler: async ({ params }) => ({ data: await listMovements(params.id) }),
    }),
    route({
      method: 'post', path: '/api/prints/:id/movements', summary: 'Moves a print and records from, to, when, who and why', tags: ['prints'],
      access: 'catalogue.write', params: idParamsSchema, body: movementInputSchema, status: 201, response: { description: 'The print', schema: printEnvelope },
      handler: async ({ params, body, user, req }) =>
        ({ data: presentPrint(await movePrint(params.id, body, { id: user!.id, name: user!.name, role: user!.role }, idOf(req)), user!.role) }),
    }),
    route({
      method: 'get', path: '/api/prints/:id/history', summary: 'Every change to the print: who, when, before and after', tags: ['prints'],
      access: 'catalogue.read_restricted', params: idParamsSchema, response: { description: 'History', schema: dataEnvelope(z.array(historyEventSchema)) },
      handler: async ({ params }) => ({ data: await printHistory(params.id) }),
    }),
    route({
      method: 'get', path: '/api/prints/:id/export.json', summary: 'One print with everything, as a JSON file', tags: ['prints'],
      access: 'catalogue.read', params: idParamsSchema, response: { description: 'JSON document', contentType: 'application/json' },
      handler: async ({ params, user, res }) => {
        const doc = await printJson(params.id, user!.role);
        res.setHeader('Content-Disposition', `attachment; filename="print-${doc.print.accessionNumber.replace(/[^A-Za-z0-9._-]/g, '_')}.json"`);
        res.json(doc);
      },
    }),
  ];
}
