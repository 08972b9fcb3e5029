import { z } from 'zod';
import { idParamsSchema } from '../schemas/primitives';
import { dictionaryEntrySchema, exportNameParamsSchema, loansExportQuerySchema, readingsExportQuerySchema } from '../schemas/exports';
import { dataEnvelope } from '../schemas/envelope';
import { endpoint } from './endpoint';

const csv = (what: string) => ({ description: `CSV, UTF-8 with BOM, ISO 8601 dates; ${what}`, contentType: 'text/csv' });
const json = (what: string) => ({ description: `JSON document; ${what}`, contentType: 'application/json' });

/** Exports of the list screens; each CSV has its data dictionary (`dictionary`). */
export const exportsApi = {
  conditionReportsCsv: endpoint({
    method: 'get', path: '/api/exports/prints/:id/condition-reports.csv', summary: "A print's condition reports as CSV: one row per observation (a report without any has one row)",
    tags: ['exports'], access: 'condition.read', params: idParamsSchema, response: csv('one row per observation'),
  }),
  conditionReportsJson: endpoint({
    method: 'get', path: '/api/exports/prints/:id/condition-reports.json', summary: "A print's condition reports with observations and addenda as JSON",
    tags: ['exports'], access: 'condition.read', params: idParamsSchema, response: json('the reports as the report screen shows them'),
  }),
  readingsCsv: endpoint({
    method: 'get', path: '/api/exports/readings.csv', summary: 'Measurement readings (one print, or the leaders filter) with ΔE00 against each spot\'s baseline, streamed',
    tags: ['exports'], access: 'measurements.read', query: readingsExportQuerySchema, response: csv('one row per spot per session'),
  }),
  readingsJson: endpoint({
    method: 'get', path: '/api/exports/readings.json', summary: 'Measurement sessions and readings per print with ΔE00 against the baseline, streamed',
    tags: ['exports'], access: 'measurements.read', query: readingsExportQuerySchema, response: json('prints with their spots and sessions'),
  }),
  movementsCsv: endpoint({
    method: 'get', path: '/api/exports/prints/:id/movements.csv', summary: "Where a print has been, as CSV, newest first",
    tags: ['exports'], access: 'catalogue.read_restricted', params: idParamsSchema, response: csv('one row per movement'),
  }),
  movementsJson: endpoint({
    method: 'get', path: '/api/exports/prints/:id/movements.json', summary: "Where a print has been, as JSON, newest first",
    tags: ['exports'], access: 'catalogue.read_restricted', params: idParamsSchema, response: json('the print and its movements'),
  }),
  loansCsv: endpoint({
    method: 'get', path: '/api/exports/loans.csv', summary: 'The loans list with its filters as CSV, latest first',
    tags: ['exports'], access: 'loans.read', query: loansExportQuerySchema, response: csv('one row per loan'),
  }),
  loansJson: endpoint({
    method: 'get', path: '/api/exports/loans.json', summary: 'The loans list with its filters as JSON, each loan with its prints and status history',
    tags: ['exports'], access: 'loans.read', query: loansExportQuerySchema, response: json('loans with their prints'),
  }),
  dictionary: endpoint({
    method: 'get', path: '/api/exports/:name/dictionary', summary: "An export's data dictionary: each CSV column's name, meaning, type, unit and source",
    tags: ['exports'], access: 'signed_in', params: exportNameParamsSchema, response: { description: 'The columns', schema: dataEnvelope(z.array(dictionaryEntrySchema)) },
  }),
  dictionaryCsv: endpoint({
    method: 'get', path: '/api/exports/:name/dictionary.csv', summary: "An export's data dictionary as CSV (one row per column of the export)",
    tags: ['exports'], access: 'signed_in', params: exportNameParamsSchema, response: csv('column, meaning, type, unit, source'),
  }),
};
