import { dataEnvelope, pageEnvelope } from '../schemas/envelope';
import { importCommitSchema, importRowSchema, importRowsQuerySchema, importSchema, importTemplateQuerySchema } from '../schemas/catalogue';
import { idParamsSchema } from '../schemas/primitives';
import { endpoint } from './endpoint';

export const importsApi = {
  template: endpoint({
    method: 'get', path: '/api/imports/template.csv',
    summary: 'A template to fill in: notes on every column (type, allowed codes, default, who may read it), the header and an example row; `file=steps` for the process-history file',
    tags: ['imports'], access: 'catalogue.write', query: importTemplateQuerySchema,
    response: { description: 'CSV, UTF-8: note lines starting with #, the header, an example row', contentType: 'text/csv' },
  }),
  start: endpoint({
    method: 'post', path: '/api/imports',
    summary: 'Uploads a CSV of prints (field `file`) and optionally a CSV of their process steps (field `steps`), and starts checking every row (nothing is written yet)',
    tags: ['imports'], access: 'catalogue.write', requestContentType: 'multipart/form-data', status: 202,
    response: { description: 'The import job, validating', schema: dataEnvelope(importSchema) },
  }),
  get: endpoint({
    method: 'get', path: '/api/imports/:id', summary: 'An import: progress, what it would do (creates, updates), problems by file, row and column, outcome', tags: ['imports'],
    access: 'catalogue.write', params: idParamsSchema, response: { description: 'The import job', schema: dataEnvelope(importSchema) },
  }),
  rows: endpoint({
    method: 'get', path: '/api/imports/:id/rows', summary: 'What each row of a checked file would do: create, update (with each change, before and after) or nothing', tags: ['imports'],
    access: 'catalogue.write', params: idParamsSchema, query: importRowsQuerySchema,
    response: { description: 'A page of rows, in file order', schema: pageEnvelope(importRowSchema) },
  }),
  commit: endpoint({
    method: 'post', path: '/api/imports/:id/commit',
    summary: 'Writes every row of a checked file in one transaction (all or nothing); `mode` create_only refuses rows that match prints already in the catalogue, create_or_update updates them',
    tags: ['imports'], access: 'catalogue.write', params: idParamsSchema, body: importCommitSchema, status: 202, idempotent: true,
    response: { description: 'The import job, committing', schema: dataEnvelope(importSchema) },
  }),
};
