import { z } from 'zod';
import { printSchema } from '../schemas/catalogue';
import { dataEnvelope, pageEnvelope } from '../schemas/envelope';
import {
  borrowedPrintInputSchema, loanDetailSchema, loanInputSchema, loanListQuerySchema, loanObjectsInputSchema, loanSchema, loanStatusInputSchema,
  loanUpdateSchema,
} from '../schemas/loans';
import { id, idParamsSchema, versionQuerySchema } from '../schemas/primitives';
import { endpoint } from './endpoint';

const detailEnvelope = dataEnvelope(loanDetailSchema);

/** Loans out and in (registrars); everyone reads them, values only with `valuation.read`. */
export const loansApi = {
  list: endpoint({
    method: 'get', path: '/api/loans', summary: 'Loans, latest first, filtered by words, direction and status', tags: ['loans'],
    access: 'loans.read', query: loanListQuerySchema, response: { description: 'A page of loans', schema: pageEnvelope(loanSchema) },
  }),
  create: endpoint({
    method: 'post', path: '/api/loans', summary: 'Proposes a loan (out or in); 409 when the reference is taken', tags: ['loans'],
    access: 'loans.write', body: loanInputSchema, status: 201, idempotent: true, response: { description: 'The loan', schema: detailEnvelope },
  }),
  get: endpoint({
    method: 'get', path: '/api/loans/:id', summary: 'One loan with its objects, status history and what stands in the way of its next step', tags: ['loans'],
    access: 'loans.read', params: idParamsSchema, response: { description: 'The loan', schema: detailEnvelope },
  }),
  update: endpoint({
    method: 'patch', path: '/api/loans/:id', summary: 'Edits a loan (409 when stale; dates and conditions are fixed once it is in transit)', tags: ['loans'],
    access: 'loans.write', params: idParamsSchema, body: loanUpdateSchema, response: { description: 'The loan', schema: detailEnvelope },
  }),
  setObjects: endpoint({
    method: 'put', path: '/api/loans/:id/objects', summary: 'Adds prints to the loan or changes their values (409 when a print is on another loan at the same time)',
    tags: ['loans'], access: 'loans.write', params: idParamsSchema, body: loanObjectsInputSchema, response: { description: 'The loan', schema: detailEnvelope },
  }),
  removeObject: endpoint({
    method: 'delete', path: '/api/loans/:id/objects/:printId', summary: 'Takes a print off a loan that has not left', tags: ['loans'],
    access: 'loans.write', params: z.object({ id, printId: id }), query: versionQuerySchema, response: { description: 'The loan', schema: detailEnvelope },
  }),
  addBorrowed: endpoint({
    method: 'post', path: '/api/loans/:id/borrowed-prints', summary: 'Records a print lent to the collection (a loan in) and puts it on the loan',
    tags: ['loans'], access: 'loans.write', params: idParamsSchema, body: borrowedPrintInputSchema, status: 201, idempotent: true,
    response: { description: 'The new print record', schema: dataEnvelope(printSchema) },
  }),
  changeStatus: endpoint({
    method: 'post', path: '/api/loans/:id/status', summary: 'Moves the loan to its next state, dated; 409 naming what is missing (a signed report, approval for display, a date)',
    tags: ['loans'], access: 'loans.write', params: idParamsSchema, body: loanStatusInputSchema, response: { description: 'The loan', schema: detailEnvelope },
  }),
  checklistCsv: endpoint({
    method: 'get', path: '/api/loans/:id/checklist.csv', summary: 'The loan checklist as CSV (values only for those who may read them)', tags: ['loans'],
    access: 'loans.read', params: idParamsSchema, response: { description: 'CSV, UTF-8, one row per print', contentType: 'text/csv' },
  }),
};
