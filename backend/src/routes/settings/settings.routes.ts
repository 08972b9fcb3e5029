import { dataEnvelope } from '@toneledger/common/schemas/envelope';
import { catalogueSettingsSchema } from '@toneledger/common/schemas/catalogue';
import { route, type RouteDef } from '../../http/route';
import { idOf } from '../../middleware/request-id';
import { getCatalogueSettings, putCatalogueSettings } from '../../services/settings.service';

export function settingsRoutes(): RouteDef[] {
  return [
    route({
      method: 'get', path: '/api/settings/catalogue', summary: "The institution's name and accession-number pattern", tags: ['settings'],
      access: 'catalogue.read', response: { description: 'Catalogue settings', schema: dataEnvelope(catalogueSettingsSchema) },
      handler: async () => ({ data: await getCatalogueSettings() }),
    }),
    route({
      method: 'put', path: '/api/settings/catalogue', summary: 'Changes the catalogue settings (the pattern is checked)', tags: ['settings'],
      access: 'settings.manage', body: catalogueSettingsSchema, response: { description: 'Catalogue settings', schema: dataEnvelope(catalogueSettingsSchema) },
      handler: async ({ body, user, req }) => ({ data: await putCatalogueSettings(body, { id: user!.id, name: user!.name }, idOf(req)) }),
    }),
  ];
}
