import { climateApi, climateSettingsApi } from '@toneledger/common/api/climate';
import { implement, type RouteDef } from '../../http/route';
import { singleUpload, uploadedText } from '../../middleware/single-upload';
import { getClimateSettings, putClimateSettings } from '../../services/climate-settings.service';
import {
  CLIMATE_SAVE_AS, MAX_CLIMATE_BYTES, acceptClimateFile, checkClimateFile, discardClimateFile, getClimateFile, listClimateFiles, uploadClimateFile,
} from '../../services/climate-file.service';
import { climateRooms, climateSeries, climateSummary } from '../../services/climate.service';

export function climateRoutes(): RouteDef[] {
  return [
    ...implement(climateSettingsApi, {
      get: async () => ({ data: await getClimateSettings() }),
      put: async ({ body, actor, requestId }) => ({ data: await putClimateSettings(body, actor, requestId) }),
    }),
    ...implement(climateApi, {
      rooms: async ({ query }) => ({ data: await climateRooms(query) }),
      summary: async ({ params, query }) => ({ data: await climateSummary(params.id, query) }),
      series: async ({ params, query }) => ({ data: await climateSeries(params.id, query) }),
      files: async ({ params }) => ({ data: await listClimateFiles(params.id) }),
      upload: {
        before: [singleUpload('file', MAX_CLIMATE_BYTES)],
        handler: async ({ params, req, actor, requestId }) => ({ data: await uploadClimateFile(params.id, uploadedText(req, CLIMATE_SAVE_AS), actor, requestId) }),
      },
      get: async ({ params }) => ({ data: await getClimateFile(params.id) }),
      check: async ({ params, body }) => ({ data: await checkClimateFile(params.id, body.mapping) }),
      accept: async ({ params, body, actor, requestId }) => ({ data: await acceptClimateFile(params.id, body.mapping, actor, requestId) }),
      discard: async ({ params, actor, requestId, res }) => {
        await discardClimateFile(params.id, actor, requestId);
        res.status(204).end();
        return undefined;
      },
    }),
  ];
}
