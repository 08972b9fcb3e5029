import { dataEnvelope } from '../schemas/envelope';
import { importSchema } from '../schemas/catalogue';
import { emptyBodySchema, idParamsSchema } from '../schemas/primitives';
import { endpoint } from './endpoint';

export const importsApi = {
  template: endpoint({
    method: 'get', path: '/api/imports/template.csv', summary: 'An empty CSV with the columns an import reads', tags: ['imports'],
    access: 'catalogue.write', response: { description: 'CSV header row', contentType: 'text/csv' },
  }),
  start: endpoint({
    method: 'post', path: '/api/imports', summary: 'Uploads a CSV of prints and starts checking every row (nothing is written yet)', tags: ['imports'],
    access: 'catalogue.write', requestContentType: 'multipart/form-data', status: 202,
    response: { description: 'The import job, validating', schema: dataEnvelope(importSchema) },
  }),
  get: endpoint({
    method: 'get', path: '/api/imports/:id', summary: 'An import: progress, problems by row and column, outcome', tags: ['imports'],
    access: 'catalogue.write', params: idParamsSchema, response: { description: 'The import job', schema: dataEnvelope(importSchema) },
  }),
  commit: endpoint({
    method: 'post', path: '/api/imports/:id/commit', summary: 'Imports every row of a checked file in one transaction (all or nothing)', tags: ['imports'],
    access: 'catalogue.write', params: idParamsSchema, body: emptyBodySchema, status: 202,
    response: { description: 'The import job, committing', schema: dataEnvelope(importSchema) },
  }),
};
