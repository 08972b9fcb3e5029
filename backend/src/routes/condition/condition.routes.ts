import { z } from 'zod';
import { dataEnvelope } from '@toneledger/common/schemas/envelope';
import { idParamsSchema } from '@toneledger/common/schemas/catalogue';
import {
  addendumInputSchema, conditionTermInputSchema, conditionTermSchema, conditionTermUpdateSchema, gradeDefinitionsSchema,
  reportInputSchema, reportSchema, reportUpdateSchema,
} from '@toneledger/common/schemas/condition';
import { route, type RouteDef } from '../../http/route';
import { idOf } from '../../middleware/request-id';
import {
  addAddendum, createReport, createTerm, discardReport, getConditionSettings, getReport, listReports, listTerms, putConditionSettings,
  signReport, updateReport, updateTerm,
} from '../../services/condition.service';

const conditionSettingsSchema = z.object({ grades: gradeDefinitionsSchema });
const reportEnvelope = dataEnvelope(reportSchema);
const termEnvelope = dataEnvelope(conditionTermSchema);
const versionBody = z.object({ version: z.number().int().min(1) });

export function conditionRoutes(): RouteDef[] {
  return [
    route({
      method: 'get', path: '/api/settings/condition', summary: 'The written definition of each overall grade', tags: ['settings', 'condition'],
      access: 'condition.read', response: { description: 'Condition settings', schema: dataEnvelope(conditionSettingsSchema) },
      handler: async () => ({ data: await getConditionSettings() }),
    }),
    route({
      method: 'put', path: '/api/settings/condition', summary: 'Changes the grade definitions shown to examiners', tags: ['settings', 'condition'],
      access: 'settings.manage', body: conditionSettingsSchema, response: { description: 'Condition settings', schema: dataEnvelope(conditionSettingsSchema) },
      handler: async ({ body, user, req }) => ({ data: await putConditionSettings(body, { id: user!.id, name: user!.name }, idOf(req)) }),
    }),

    route({
      method: 'get', path: '/api/condition-terms', summary: 'The deterioration vocabulary: active terms in order (all=true adds inactive ones after)', tags: ['condition'],
      access: 'condition.read', query: z.object({ all: z.enum(['true', 'false']).optional() }),
      response: { description: 'Terms', schema: dataEnvelope(z.array(conditionTermSchema)) },
      handler: async ({ query }) => ({ data: await listTerms(query.all === 'true') }),
    }),
    route({
      method: 'post', path: '/api/condition-terms', summary: 'Adds a term to the vocabulary (409 if the code is taken)', tags: ['condition'],
      access: 'settings.manage', body: conditionTermInputSchema, status: 201, response: { description: 'The new term', schema: termEnvelope },
      handler: async ({ body, user, req }) => ({ data: await createTerm(body, { id: user!.id, name: user!.name }, idOf(req)) }),
    }),
    route({
      method: 'patch', path: '/api/condition-terms/:code', summary: 'Renames, describes or (de)activates a term; terms are never deleted', tags: ['condition'],
      access: 'settings.manage', params: z.object({ code: z.string().min(1) }), body: conditionTermUpdateSchema,
      response: { description: 'The term', schema: termEnvelope },
      handler: async ({ params, body, user, req }) => ({ data: await updateTerm(params.code, body, { id: user!.id, name: user!.name }, idOf(req)) }),
    }),

    route({
      method: 'get', path: '/api/prints/:id/condition-reports', summary: "A print's condition reports, newest examination first", tags: ['condition'],
      access: 'condition.read', params: idParamsSchema, response: { description: 'Reports', schema: dataEnvelope(z.array(reportSchema)) },
      handler: async ({ params }) => ({ data: await listReports(params.id) }),
    }),
    route({
      method: 'post', path: '/api/prints/:id/condition-reports', summary: 'Starts a draft report by the signed-in examiner', tags: ['condition'],
      access: 'condition.write', params: idParamsSchema, body: reportInputSchema, status: 201, response: { description: 'The draft', schema: reportEnvelope },
      handler: async ({ params, body, user, req }) => ({ data: await createReport(params.id, body, { id: user!.id, name: user!.name }, idOf(req)) }),
    }),
    route({
      method: 'get', path: '/api/condition-reports/:id', summary: 'One condition report with its observations and addenda', tags: ['condition'],
      access: 'condition.read', params: idParamsSchema, response: { description: 'The report', schema: reportEnvelope },
      handler: async ({ params }) => ({ data: await getReport(params.id) }),
    }),
    route({
      method: 'patch', path: '/api/condition-reports/:id',
      summary: 'Edits a draft (author only; observations, when given, replace the list; 409 when signed or stale)', tags: ['condition'],
      access: 'condition.write', params: idParamsSchema, body: reportUpdateSchema, response: { description: 'The draft', schema: reportEnvelope },
      handler: async ({ params, body, user, req }) => ({ data: await updateReport(params.id, body, { id: user!.id, name: user!.name }, idOf(req)) }),
    }),
    route({
      method: 'delete', path: '/api/condition-reports/:id', summary: 'Discards a draft (author only); the draft stays in the audit trail', tags: ['condition'],
      access: 'condition.write', params: idParamsSchema, query: z.object({ version: z.coerce.number().int().min(1) }),
      response: { description: 'Discarded', schema: dataEnvelope(z.object({ id: z.string() })) },
      handler: async ({ params, query, user, req }) => {
        await discardReport(params.id, query.version, { id: user!.id, name: user!.name }, idOf(req));
        return { data: { id: params.id } };
      },
    }),
    route({
      method: 'post', path: '/api/condition-reports/:id/sign', summary: 'Signs a draft (author only; needs a grade); the report is then locked', tags: ['condition'],
      access: 'condition.write', params: idParamsSchema, body: versionBody, response: { description: 'The signed report', schema: reportEnvelope },
      handler: async ({ params, body, user, req }) => ({ data: await signReport(params.id, body.version, { id: user!.id, name: user!.name }, idOf(req)) }),
    }),
    route({
      method: 'post', path: '/api/condition-reports/:id/addenda', summary: 'Adds a dated, attributed addendum to a signed report', tags: ['condition'],
      access: 'condition.write', params: idParamsSchema, body: addendumInputSchema, status: 201, response: { description: 'The report with its addenda', schema: reportEnvelope },
      handler: async ({ params, body, user, req }) => ({ data: await addAddendum(params.id, body.text, { id: user!.id, name: user!.name }, idOf(req)) }),
    }),
  ];
}
