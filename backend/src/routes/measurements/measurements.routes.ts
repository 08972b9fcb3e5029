import { measurementSettingsApi, measurementsApi } from '@toneledger/common/api/measurements';
import { implement, type RouteDef } from '../../http/route';
import { singleUpload, uploadedText } from '../../middleware/single-upload';
import {
  MAX_CSV_BYTES, chooseBaseline, createSpot, getMeasurementSettings, listLeaders, previewCsv, printMeasurements, putMeasurementSettings,
  recordSession, updateSpot,
} from '../../services/measurement.service';

export function measurementsRoutes(): RouteDef[] {
  return [
    ...implement(measurementSettingsApi, {
      get: async () => ({ data: await getMeasurementSettings() }),
      put: async ({ body, actor, requestId }) => ({ data: await putMeasurementSettings(body, actor, requestId) }),
    }),
    ...implement(measurementsApi, {
      forPrint: async ({ params }) => ({ data: await printMeasurements(params.id) }),
      createSpot: async ({ params, body, actor, requestId }) => ({ data: await createSpot(params.id, body, actor, requestId) }),
      updateSpot: async ({ params, body, actor, requestId }) => ({ data: await updateSpot(params.id, body, actor, requestId) }),
      chooseBaseline: async ({ params, body, actor, requestId }) => ({ data: await chooseBaseline(params.id, body, actor, requestId) }),
      recordSession: async ({ params, body, actor, requestId }) => ({ data: await recordSession(params.id, body, actor, requestId) }),
      previewCsv: {
        before: [singleUpload('file', MAX_CSV_BYTES)],
        handler: async ({ params, body, req }) => {
          const { text } = uploadedText(req, 'Export the CSV as UTF-8.');
          return { data: await previewCsv(params.id, text, body.mapping ?? null) };
        },
      },
      leaders: async ({ query }) => {
        const { rows, total } = await listLeaders(query);
        return { data: rows, pagination: { page: query.page, pageSize: query.pageSize, total } };
      },
    }),
  ];
}
