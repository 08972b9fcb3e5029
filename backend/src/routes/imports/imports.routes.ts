import { z } from 'zod';
import { dataEnvelope } from '@toneledger/common/schemas/envelope';
import { IMPORT_COLUMNS, idParamsSchema, importSchema } from '@toneledger/common/schemas/catalogue';
import { route, type RouteDef } from '../../http/route';
import { AppError, validationFailed } from '../../errors';
import { idOf } from '../../middleware/request-id';
import { singleUpload } from '../../middleware/single-upload';
import { MAX_IMPORT_BYTES, commitImport, getImport, startImport } from '../../services/import.service';
import { presentImport } from '../../presenters/catalogue.presenter';


export function importsRoutes(): RouteDef[] {
  return [
    route({
      method: 'get', path: '/api/imports/template.csv', summary: 'An empty CSV with the columns an import reads', tags: ['imports'],
      access: 'catalogue.write', response: { description: 'CSV header row', contentType: 'text/csv' },
      handler: ({ res }) => {
        res.setHeader('Content-Type', 'text/csv; charset=utf-8');
        res.setHeader('Content-Disposition', 'attachment; filename="prints-import-template.csv"');
        res.send(`${IMPORT_COLUMNS.join(',')}\r\n`);
      },
    }),
    route({
      method: 'post', path: '/api/imports', summary: 'Uploads a CSV of prints and starts checking every row (nothing is written yet)', tags: ['imports'],
      access: 'catalogue.write', before: [singleUpload('file', MAX_IMPORT_BYTES)], requestContentType: 'multipart/form-data', status: 202,
      response: { description: 'The import job, validating', schema: dataEnvelope(importSchema) },
      handler: async ({ req, user }) => {
        const file = req.file;
        if (!file) throw validationFailed([{ path: 'file', message: 'Choose a CSV file', code: 'required' }]);
        const text = new TextDecoder('utf-8', { fatal: false }).decode(file.buffer);
        if (text.includes('\u0000') || text.includes('\uFFFD')) {
          throw new AppError('unsupported_media_type', 415, 'The file is not UTF-8 text. Save the spreadsheet as "CSV UTF-8".');
        }
        const job = await startImport(file.originalname.slice(0, 200) || 'upload.csv', text, { id: user!.id, name: user!.name });
        return { data: presentImport(job) };
      },
    }),
    route({
      method: 'get', path: '/api/imports/:id', summary: 'An import: progress, problems by row and column, outcome', tags: ['imports'],
      access: 'catalogue.write', params: idParamsSchema, response: { description: 'The import job', schema: dataEnvelope(importSchema) },
      handler: async ({ params }) => ({ data: presentImport(await getImport(params.id)) }),
    }),
    route({
      method: 'post', path: '/api/imports/:id/commit', summary: 'Imports every row of a checked file in one transaction (all or nothing)', tags: ['imports'],
      access: 'catalogue.write', params: idParamsSchema, body: z.object({}).optional(), status: 202,
      response: { description: 'The import job, committing', schema: dataEnvelope(importSchema) },
      handler: async ({ params, user, req }) => ({ data: presentImport(await commitImport(params.id, { id: user!.id, name: user!.name }, idOf(req))) }),
    }),
  ];
}
