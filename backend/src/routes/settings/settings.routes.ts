import { catalogueSettingsApi } from '@toneledger/common/api/reference';
import { implement, type RouteDef } from '../../http/route';
import { getCatalogueSettings, putCatalogueSettings } from '../../services/settings.service';

export function settingsRoutes(): RouteDef[] {
  return implement(catalogueSettingsApi, {
    get: async () => ({ data: await getCatalogueSettings() }),
    put: async ({ body, actor, requestId }) => ({ data: await putCatalogueSettings(body, actor, requestId) }),
  });
}
