import { lightApi, lightSettingsApi } from '@toneledger/common/api/light';
import { implement, type RouteDef } from '../../http/route';
import { getLightSettings } from '../../services/light-settings.service';
import { overBudget, overrideResponsivity, printLight, saveLightSettings } from '../../services/light.service';

export function lightRoutes(): RouteDef[] {
  return [
    ...implement(lightApi, {
      print: async ({ params, query }) => ({ data: await printLight(params.id, query.asOf) }),
      override: async ({ params, body, actor, requestId }) => ({ data: await overrideResponsivity(params.id, body, actor, requestId) }),
      overBudget: async () => ({ data: await overBudget() }),
    }),
    ...implement(lightSettingsApi, {
      get: async () => ({ data: await getLightSettings() }),
      put: async ({ body, actor, requestId }) => ({ data: await saveLightSettings(body, actor, requestId) }),
    }),
  ];
}
