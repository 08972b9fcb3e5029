import { conditionSettingsApi, conditionTermsApi, reportsApi } from '@toneledger/common/api/condition';
import { implement, type RouteDef } from '../../http/route';
import {
  addAddendum, createReport, createTerm, discardReport, getConditionSettings, getReport, listReports, listTerms, putConditionSettings,
  signReport, updateReport, updateTerm,
} from '../../services/condition.service';
import { conditionWork } from '../../services/condition-work.service';

export function conditionRoutes(): RouteDef[] {
  return [
    ...implement(conditionSettingsApi, {
      get: async () => ({ data: await getConditionSettings() }),
      put: async ({ body, actor, requestId }) => ({ data: await putConditionSettings(body, actor, requestId) }),
    }),
    ...implement(conditionTermsApi, {
      list: async ({ query }) => ({ data: await listTerms(query.all === 'true') }),
      create: async ({ body, actor, requestId }) => ({ data: await createTerm(body, actor, requestId) }),
      update: async ({ params, body, actor, requestId }) => ({ data: await updateTerm(params.code, body, actor, requestId) }),
    }),
    ...implement(reportsApi, {
      work: async ({ actor }) => ({ data: await conditionWork(actor.id) }),
      list: async ({ params }) => ({ data: await listReports(params.id) }),
      create: async ({ params, body, actor, requestId }) => ({ data: await createReport(params.id, body, actor, requestId) }),
      get: async ({ params }) => ({ data: await getReport(params.id) }),
      update: async ({ params, body, actor, requestId }) => ({ data: await updateReport(params.id, body, actor, requestId) }),
      discard: async ({ params, query, actor, requestId }) => {
        await discardReport(params.id, query.version, actor, requestId);
        return { data: { id: params.id } };
      },
      sign: async ({ params, body, actor, requestId }) => ({ data: await signReport(params.id, body.version, actor, requestId) }),
      addAddendum: async ({ params, body, actor, requestId }) => ({ data: await addAddendum(params.id, body.text, actor, requestId) }),
    }),
  ];
}
