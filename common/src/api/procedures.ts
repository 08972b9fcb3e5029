import { z } from 'zod';
import { acquisitionInputSchema, acquisitionPrintsInputSchema, acquisitionSchema, acquisitionUpdateSchema, entryInputSchema, entryListQuerySchema, entrySchema, entryUpdateSchema } from '../schemas/acquisitions';
import { addendumInputSchema } from '../schemas/condition';
import {
  deaccessionApprovalSchema, deaccessionCompletionSchema, deaccessionInputSchema, deaccessionSchema, deaccessionUpdateSchema, deaccessionWithdrawSchema,
} from '../schemas/deaccessions';
import { dataEnvelope } from '../schemas/envelope';
import { imageSchema } from '../schemas/images';
import { sessionSchema } from '../schemas/measurements';
import { idParamsSchema, versionBodySchema } from '../schemas/primitives';
import { TREATMENT_STATUS } from '../schemas/procedure-vocab';
import { treatmentApprovalSchema, treatmentInputSchema, treatmentSchema, treatmentSummarySchema, treatmentUpdateSchema } from '../schemas/treatments';
import { endpoint } from './endpoint';

const treatmentEnvelope = dataEnvelope(treatmentSchema);
const entryEnvelope = dataEnvelope(entrySchema);
const acquisitionEnvelope = dataEnvelope(acquisitionSchema);
const deaccessionEnvelope = dataEnvelope(deaccessionSchema);

/** Treatments: the conservator's record, proposed → approved → done → signed (then locked; corrections by addenda). */
export const treatmentsApi = {
  list: endpoint({
    method: 'get', path: '/api/treatments', summary: 'Treatments across the collection, newest proposal first, optionally of one status', tags: ['treatments'],
    access: 'condition.read', query: z.object({ status: z.enum(TREATMENT_STATUS.codes).optional() }),
    response: { description: 'Treatments', schema: dataEnvelope(z.array(treatmentSummarySchema)) },
  }),
  forPrint: endpoint({
    method: 'get', path: '/api/prints/:id/treatments', summary: "A print's treatments, newest proposal first", tags: ['treatments'],
    access: 'condition.read', params: idParamsSchema, response: { description: 'Treatments', schema: dataEnvelope(z.array(treatmentSummarySchema)) },
  }),
  propose: endpoint({
    method: 'post', path: '/api/prints/:id/treatments', summary: 'Proposes a treatment (condition found, aims, options, chosen method); 409 on a deaccessioned print', tags: ['treatments'],
    access: 'treatments.write', params: idParamsSchema, body: treatmentInputSchema, status: 201, idempotent: true, response: { description: 'The proposal', schema: treatmentEnvelope },
  }),
  get: endpoint({
    method: 'get', path: '/api/treatments/:id', summary: 'One treatment with its steps, materials, images and addenda', tags: ['treatments'],
    access: 'condition.read', params: idParamsSchema, response: { description: 'The treatment', schema: treatmentEnvelope },
  }),
  update: endpoint({
    method: 'patch', path: '/api/treatments/:id',
    summary: 'Edits the proposal (while proposed) or the record of the work (once approved); 409 when signed or stale', tags: ['treatments'],
    access: 'treatments.write', params: idParamsSchema, body: treatmentUpdateSchema, response: { description: 'The treatment', schema: treatmentEnvelope },
  }),
  approve: endpoint({
    method: 'post', path: '/api/treatments/:id/approve', summary: 'Records who approved a proposed treatment and when; a print in store goes into treatment', tags: ['treatments'],
    access: 'treatments.write', params: idParamsSchema, body: treatmentApprovalSchema, response: { description: 'The approved treatment', schema: treatmentEnvelope },
  }),
  complete: endpoint({
    method: 'post', path: '/api/treatments/:id/complete', summary: 'Marks the work done (needs its dates and at least one step); the print returns to store', tags: ['treatments'],
    access: 'treatments.write', params: idParamsSchema, body: versionBodySchema, response: { description: 'The treatment', schema: treatmentEnvelope },
  }),
  sign: endpoint({
    method: 'post', path: '/api/treatments/:id/sign', summary: 'Signs a done treatment (its conservator only); the record is then locked', tags: ['treatments'],
    access: 'treatments.write', params: idParamsSchema, body: versionBodySchema, response: { description: 'The signed treatment', schema: treatmentEnvelope },
  }),
  addAddendum: endpoint({
    method: 'post', path: '/api/treatments/:id/addenda', summary: 'Adds a dated, attributed addendum to a signed treatment', tags: ['treatments'],
    access: 'treatments.write', params: idParamsSchema, body: addendumInputSchema, status: 201, idempotent: true,
    response: { description: 'The treatment with its addenda', schema: treatmentEnvelope },
  }),
};

/** Object entry (objects come in: receipt) and acquisition with accessioning (title passes; prints linked). */
export const entriesApi = {
  list: endpoint({
    method: 'get', path: '/api/object-entries', summary: 'Object entries, newest first (q searches number and depositor)', tags: ['acquisitions'],
    access: 'catalogue.read_restricted', query: entryListQuerySchema, response: { description: 'Entries', schema: dataEnvelope(z.array(entrySchema)) },
  }),
  create: endpoint({
    method: 'post', path: '/api/object-entries', summary: 'Records an object entry; its number (E<year>.<n>) is given by the server', tags: ['acquisitions'],
    access: 'acquisitions.write', body: entryInputSchema, status: 201, idempotent: true, response: { description: 'The entry', schema: entryEnvelope },
  }),
  get: endpoint({
    method: 'get', path: '/api/object-entries/:id', summary: 'One object entry with the acquisitions that followed it', tags: ['acquisitions'],
    access: 'catalogue.read_restricted', params: idParamsSchema, response: { description: 'The entry', schema: entryEnvelope },
  }),
  update: endpoint({
    method: 'patch', path: '/api/object-entries/:id', summary: 'Edits an object entry (its number stays)', tags: ['acquisitions'],
    access: 'acquisitions.write', params: idParamsSchema, body: entryUpdateSchema, response: { description: 'The entry', schema: entryEnvelope },
  }),
};

export const acquisitionsApi = {
  list: endpoint({
    method: 'get', path: '/api/acquisitions', summary: 'Acquisitions, newest first', tags: ['acquisitions'],
    access: 'catalogue.read_restricted', response: { description: 'Acquisitions', schema: dataEnvelope(z.array(acquisitionSchema)) },
  }),
  create: endpoint({
    method: 'post', path: '/api/acquisitions', summary: 'Records an acquisition (source, method, dates, title document, funds), from an entry or not', tags: ['acquisitions'],
    access: 'acquisitions.write', body: acquisitionInputSchema, status: 201, idempotent: true, response: { description: 'The acquisition', schema: acquisitionEnvelope },
  }),
  get: endpoint({
    method: 'get', path: '/api/acquisitions/:id', summary: 'One acquisition with its accessioned prints', tags: ['acquisitions'],
    access: 'catalogue.read_restricted', params: idParamsSchema, response: { description: 'The acquisition', schema: acquisitionEnvelope },
  }),
  update: endpoint({
    method: 'patch', path: '/api/acquisitions/:id', summary: 'Edits an acquisition', tags: ['acquisitions'],
    access: 'acquisitions.write', params: idParamsSchema, body: acquisitionUpdateSchema, response: { description: 'The acquisition', schema: acquisitionEnvelope },
  }),
  setPrints: endpoint({
    method: 'post', path: '/api/acquisitions/:id/prints', summary: 'Accessioning: links catalogued prints to the acquisition or takes links off (a print belongs to one acquisition)', tags: ['acquisitions'],
    access: 'acquisitions.write', params: idParamsSchema, body: acquisitionPrintsInputSchema, response: { description: 'The acquisition', schema: acquisitionEnvelope },
  }),
  forPrint: endpoint({
    method: 'get', path: '/api/prints/:id/acquisition', summary: 'The acquisition a print came in by, or null', tags: ['acquisitions'],
    access: 'catalogue.read_restricted', params: idParamsSchema, response: { description: 'The acquisition', schema: dataEnvelope(acquisitionSchema.nullable()) },
  }),
};

/** Deaccession: proposed → approved → completed (the print becomes read-only), or withdrawn. */
export const deaccessionsApi = {
  forPrint: endpoint({
    method: 'get', path: '/api/prints/:id/deaccessions', summary: "A print's deaccession records (a withdrawn proposal stays), newest first", tags: ['deaccessions'],
    access: 'catalogue.read_restricted', params: idParamsSchema, response: { description: 'Deaccessions', schema: dataEnvelope(z.array(deaccessionSchema)) },
  }),
  propose: endpoint({
    method: 'post', path: '/api/prints/:id/deaccessions', summary: 'Proposes a deaccession (reason, method); one open proposal per print', tags: ['deaccessions'],
    access: 'deaccessions.write', params: idParamsSchema, body: deaccessionInputSchema, status: 201, idempotent: true, response: { description: 'The proposal', schema: deaccessionEnvelope },
  }),
  update: endpoint({
    method: 'patch', path: '/api/deaccessions/:id', summary: 'Edits a proposal (while proposed)', tags: ['deaccessions'],
    access: 'deaccessions.write', params: idParamsSchema, body: deaccessionUpdateSchema, response: { description: 'The deaccession', schema: deaccessionEnvelope },
  }),
  approve: endpoint({
    method: 'post', path: '/api/deaccessions/:id/approve', summary: 'Records the authority that approved the proposal and the date', tags: ['deaccessions'],
    access: 'deaccessions.write', params: idParamsSchema, body: deaccessionApprovalSchema, response: { description: 'The deaccession', schema: deaccessionEnvelope },
  }),
  complete: endpoint({
    method: 'post', path: '/api/deaccessions/:id/complete', summary: 'Completes an approved deaccession: the print becomes deaccessioned and read-only', tags: ['deaccessions'],
    access: 'deaccessions.write', params: idParamsSchema, body: deaccessionCompletionSchema, response: { description: 'The deaccession', schema: deaccessionEnvelope },
  }),
  withdraw: endpoint({
    method: 'post', path: '/api/deaccessions/:id/withdraw', summary: 'Withdraws a proposal not yet completed, with the reason; it stays in the record', tags: ['deaccessions'],
    access: 'deaccessions.write', params: idParamsSchema, body: deaccessionWithdrawSchema, response: { description: 'The deaccession', schema: deaccessionEnvelope },
  }),
};

const voidBody = z.object({ reason: z.string().trim().min(3, 'Say why (at least 3 characters)').max(500, 'At most 500 characters') });

/** Voiding a mistaken record: kept and shown struck through, left out of every analysis. */
export const voidsApi = {
  session: endpoint({
    method: 'post', path: '/api/measurement-sessions/:id/void',
    summary: 'Voids a measurement session with a reason: kept, shown struck through, left out of rates, projections, the schedule and research outcomes', tags: ['measurements'],
    access: 'measurements.write', params: idParamsSchema, body: voidBody, response: { description: 'The voided session', schema: dataEnvelope(sessionSchema) },
  }),
  captureDate: endpoint({
    method: 'post', path: '/api/images/:id/void-capture-date', summary: "Voids an image's mistaken capture date with a reason: the image keeps no date, the voided one stays on record", tags: ['images'],
    access: 'measurements.write', params: idParamsSchema, body: voidBody.extend({ version: z.number().int().min(1) }), response: { description: 'The image', schema: dataEnvelope(imageSchema) },
  }),
};
