import { z } from 'zod';
import { dataEnvelope } from '../schemas/envelope';
import {
  addendumInputSchema, conditionSettingsSchema, conditionTermInputSchema, conditionTermSchema, conditionTermUpdateSchema, conditionWorkSchema, reportInputSchema,
  reportSchema, reportUpdateSchema,
} from '../schemas/condition';
import { deletedSchema, idParamsSchema, versionBodySchema, versionQuerySchema } from '../schemas/primitives';
import { endpoint } from './endpoint';
import { settingsSection } from './settings-section';

const reportEnvelope = dataEnvelope(reportSchema);
const termEnvelope = dataEnvelope(conditionTermSchema);

export const conditionSettingsApi = settingsSection({
  name: 'condition', title: 'Condition settings', read: 'condition.read', schema: conditionSettingsSchema, tags: ['settings', 'condition'],
  readSummary: 'The written definition of each overall grade', changeSummary: 'Changes the grade definitions shown to examiners',
});

export const conditionTermsApi = {
  list: endpoint({
    method: 'get', path: '/api/condition-terms', summary: 'The deterioration vocabulary: active terms in order (all=true adds inactive ones after)',
    tags: ['condition'], access: 'condition.read', query: z.object({ all: z.enum(['true', 'false']).optional() }),
    response: { description: 'Terms', schema: dataEnvelope(z.array(conditionTermSchema)) },
  }),
  create: endpoint({
    method: 'post', path: '/api/condition-terms', summary: 'Adds a term to the vocabulary (409 if the code is taken)', tags: ['condition'],
    access: 'settings.manage', body: conditionTermInputSchema, status: 201, idempotent: true, response: { description: 'The new term', schema: termEnvelope },
  }),
  update: endpoint({
    method: 'patch', path: '/api/condition-terms/:code', summary: 'Renames, describes or (de)activates a term; terms are never deleted', tags: ['condition'],
    access: 'settings.manage', params: z.object({ code: z.string().min(1) }), body: conditionTermUpdateSchema,
    response: { description: 'The term', schema: termEnvelope },
  }),
};

export const reportsApi = {
  work: endpoint({
    method: 'get', path: '/api/condition/work',
    summary: "The signed-in person's drafts (oldest change first) and latest signed reports, and the latest signed reports by anyone", tags: ['condition'],
    access: 'condition.read', response: { description: 'Drafts and recent reports', schema: dataEnvelope(conditionWorkSchema) },
  }),
  list: endpoint({
    method: 'get', path: '/api/prints/:id/condition-reports', summary: "A print's condition reports, newest examination first", tags: ['condition'],
    access: 'condition.read', params: idParamsSchema, response: { description: 'Reports', schema: dataEnvelope(z.array(reportSchema)) },
  }),
  create: endpoint({
    method: 'post', path: '/api/prints/:id/condition-reports', summary: 'Starts a draft report by the signed-in examiner', tags: ['condition'],
    access: 'condition.write', params: idParamsSchema, body: reportInputSchema, status: 201, idempotent: true, response: { description: 'The draft', schema: reportEnvelope },
  }),
  get: endpoint({
    method: 'get', path: '/api/condition-reports/:id', summary: 'One condition report with its observations and addenda', tags: ['condition'],
    access: 'condition.read', params: idParamsSchema, response: { description: 'The report', schema: reportEnvelope },
  }),
  update: endpoint({
    method: 'patch', path: '/api/condition-reports/:id',
    summary: 'Edits a draft (author only; observations, when given, replace the list; 409 when signed or stale)', tags: ['condition'],
    access: 'condition.write', params: idParamsSchema, body: reportUpdateSchema, response: { description: 'The draft', schema: reportEnvelope },
  }),
  discard: endpoint({
    method: 'delete', path: '/api/condition-reports/:id', summary: 'Discards a draft (author only); the draft stays in the audit trail', tags: ['condition'],
    access: 'condition.write', params: idParamsSchema, query: versionQuerySchema, response: { description: 'Discarded', schema: dataEnvelope(deletedSchema) },
  }),
  sign: endpoint({
    method: 'post', path: '/api/condition-reports/:id/sign', summary: 'Signs a draft (author only; needs a grade); the report is then locked', tags: ['condition'],
    access: 'condition.write', params: idParamsSchema, body: versionBodySchema, response: { description: 'The signed report', schema: reportEnvelope },
  }),
  addAddendum: endpoint({
    method: 'post', path: '/api/condition-reports/:id/addenda', summary: 'Adds a dated, attributed addendum to a signed report', tags: ['condition'],
    access: 'condition.write', params: idParamsSchema, body: addendumInputSchema, status: 201, idempotent: true,
    response: { description: 'The report with its addenda', schema: reportEnvelope },
  }),
};
