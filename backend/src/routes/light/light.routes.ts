import { lightApi, lightSettingsApi } from '@toneledger/common/api/light';
import { implement, type RouteDef } from '../../http/route';
import { getLightSettings } from '../../services/light-settings.service';
import { overBudget, overrideResponsivity, printLight } from '../../services/light.service';
import { lightRecomputeProgress, saveLightSettings } from '../../services/light-recompute.service';
import type { AppDeps } from '../../deps';

export function lightRoutes(deps: Pick<AppDeps, 'queue'>): RouteDef[] {
  return [
    ...implement(lightApi, {
      print: async ({ params, query }) => ({ data: await printLight(params.id, query.asOf) }),
      override: async ({ params, body, actor, requestId }) => ({ data: await overrideResponsivity(params.id, body, actor, requestId) }),
      overBudget: async () => ({ data: await overBudget() }),
      recompute: async () => ({ data: await lightRecomputeProgress() }),
    }),
    ...implement(lightSettingsApi, {
      get: async () => ({ data: await getLightSettings() }),
      put: async ({ body, actor, requestId }) => ({ data: await saveLightSettings(body, actor, requestId, { queue: deps.queue }) }),
    }),
  ];
}
