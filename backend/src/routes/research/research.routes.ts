import { researchApi } from '@toneledger/common/api/research';
import { implement, type RouteDef } from '../../http/route';
import { cohortPrints, factorValues, runCohort } from '../../services/cohort.service';
import { writeCohortPackage } from '../../services/cohort-export';
import { deleteSavedQuery, getSavedQuery, listSavedQueries, saveQuery, updateSavedQuery } from '../../services/research-query.service';

export function researchRoutes(): RouteDef[] {
  return implement(researchApi, {
    run: async ({ query, body }) => ({ data: await runCohort(body, { figures: query.figures }) }),
    prints: async ({ body }) => cohortPrints(body),
    export: async ({ body, actor, requestId, res }) => {
      res.setHeader('Content-Type', 'application/zip');
      res.setHeader('Content-Disposition', `attachment; filename="cohort-${new Date().toISOString().slice(0, 10)}.zip"`);
      await writeCohortPackage(body, actor, requestId, res);
      res.end();
    },
    listSaved: async ({ query, actor }) => listSavedQueries(query, actor),
    getSaved: async ({ params, actor }) => ({ data: await getSavedQuery(params.id, actor) }),
    save: async ({ body, actor, requestId }) => ({ data: await saveQuery(body, actor, requestId) }),
    updateSaved: async ({ params, body, actor, requestId }) => ({ data: await updateSavedQuery(params.id, body, actor, requestId) }),
    deleteSaved: async ({ params, query, actor, requestId, res }) => {
      await deleteSavedQuery(params.id, query.version, actor, requestId);
      res.status(204).end();
      return undefined;
    },
    factors: async () => ({ data: await factorValues() }),
  });
}
