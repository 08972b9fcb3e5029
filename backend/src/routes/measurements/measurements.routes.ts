import { z } from 'zod';
import { dataEnvelope, pageEnvelope } from '@toneledger/common/schemas/envelope';
import { idParamsSchema } from '@toneledger/common/schemas/catalogue';
import {
  baselineChoiceSchema, csvMappingSchema, csvPreviewSchema, leaderSchema, leadersQuerySchema, measurementSettingsSchema,
  printMeasurementsSchema, sessionInputSchema, sessionSchema, spotInputSchema, spotSchema, spotUpdateSchema,
} from '@toneledger/common/schemas/measurements';
import { route, type RouteDef } from '../../http/route';
import { AppError, validationFailed } from '../../errors';
import { idOf } from '../../middleware/request-id';
import { singleUpload } from '../../middleware/single-upload';
import {
  MAX_CSV_BYTES, chooseBaseline, createSpot, getMeasurementSettings, listLeaders, previewCsv, printMeasurements, putMeasurementSettings,
  recordSession, updateSpot,
} from '../../services/measurement.service';

const spotEnvelope = dataEnvelope(spotSchema);


/** The multipart text field `mapping`: JSON per csvMappingSchema, problems named by their path inside it. */
const previewFieldsSchema = z.object({
  mapping: z
    .string()
    .optional()
    .transform((s, ctx) => {
      if (s === undefined || s.trim() === '') return undefined;
      try {
        return JSON.parse(s) as unknown;
      } catch {
        ctx.addIssue({ code: 'custom', message: 'The mapping is not valid JSON' });
        return z.NEVER;
      }
    })
    .pipe(csvMappingSchema.optional()),
});

export function measurementsRoutes(): RouteDef[] {
  return [
    route({
      method: 'get', path: '/api/settings/measurements', summary: 'The ΔE00 taken as a noticeable change', tags: ['settings', 'measurements'],
      access: 'measurements.read', response: { description: 'Measurement settings', schema: dataEnvelope(measurementSettingsSchema) },
      handler: async () => ({ data: await getMeasurementSettings() }),
    }),
    route({
      method: 'put', path: '/api/settings/measurements', summary: 'Changes the noticeable ΔE00 used for projections', tags: ['settings', 'measurements'],
      access: 'settings.manage', body: measurementSettingsSchema, response: { description: 'Measurement settings', schema: dataEnvelope(measurementSettingsSchema) },
      handler: async ({ body, user, req }) => ({ data: await putMeasurementSettings(body, { id: user!.id, name: user!.name }, idOf(req)) }),
    }),

    route({
      method: 'get', path: '/api/prints/:id/measurements',
      summary: "A print's spots, each with its change against its baseline, rate and projection; the sessions newest first", tags: ['measurements'],
      access: 'measurements.read', params: idParamsSchema, response: { description: 'Measurements of the print', schema: dataEnvelope(printMeasurementsSchema) },
      handler: async ({ params }) => ({ data: await printMeasurements(params.id) }),
    }),

    route({
      method: 'post', path: '/api/prints/:id/measurement-spots', summary: 'Registers a spot to measure (409 if the print has one of that name)', tags: ['measurements'],
      access: 'measurements.write', params: idParamsSchema, body: spotInputSchema, status: 201, response: { description: 'The new spot', schema: spotEnvelope },
      handler: async ({ params, body, user, req }) => ({ data: await createSpot(params.id, body, { id: user!.id, name: user!.name }, idOf(req)) }),
    }),
    route({
      method: 'patch', path: '/api/measurement-spots/:id', summary: 'Renames, moves or describes a spot; a stale version gets 409', tags: ['measurements'],
      access: 'measurements.write', params: idParamsSchema, body: spotUpdateSchema, response: { description: 'The spot', schema: spotEnvelope },
      handler: async ({ params, body, user, req }) => ({ data: await updateSpot(params.id, body, { id: user!.id, name: user!.name }, idOf(req)) }),
    }),
    route({
      method: 'put', path: '/api/measurement-spots/:id/baseline',
      summary: 'Chooses the baseline session of a spot, saying why (null returns to the first session); the session must have measured the spot',
      tags: ['measurements'],
      access: 'measurements.write', params: idParamsSchema, body: baselineChoiceSchema, response: { description: 'The spot', schema: spotEnvelope },
      handler: async ({ params, body, user, req }) => ({ data: await chooseBaseline(params.id, body, { id: user!.id, name: user!.name }, idOf(req)) }),
    }),

    // Sessions are the record: there is no route to change or delete one.
    route({
      method: 'post', path: '/api/prints/:id/measurement-sessions',
      summary: 'Records a measurement session with its readings, all or nothing; readings are averaged per spot', tags: ['measurements'],
      access: 'measurements.write', params: idParamsSchema, body: sessionInputSchema, status: 201,
      response: { description: 'The session as stored', schema: dataEnvelope(sessionSchema) },
      handler: async ({ params, body, user, req }) => ({ data: await recordSession(params.id, body, { id: user!.id, name: user!.name }, idOf(req)) }),
    }),
    route({
      method: 'post', path: '/api/prints/:id/measurement-sessions/csv-preview',
      summary: "Reads an instrument's CSV (field file, ≤ 5 MB; optional field mapping as JSON) and shows the readings by spot and every problem by row and column; writes nothing",
      tags: ['measurements'],
      access: 'measurements.write', params: idParamsSchema, before: [singleUpload('file', MAX_CSV_BYTES)], requestContentType: 'multipart/form-data', body: previewFieldsSchema,
      response: { description: 'The preview', schema: dataEnvelope(csvPreviewSchema) },
      handler: async ({ params, body, req }) => {
        const file = req.file;
        if (!file) throw validationFailed([{ path: 'file', message: 'Choose a CSV file', code: 'required' }]);
        const text = new TextDecoder('utf-8', { fatal: false }).decode(file.buffer);
        if (text.includes('\u0000') || text.includes('\uFFFD')) {
          throw new AppError('unsupported_media_type', 415, 'The file is not UTF-8 text. Export the CSV as UTF-8.');
        }
        return { data: await previewCsv(params.id, text, body.mapping ?? null) };
      },
    }),

    route({
      method: 'get', path: '/api/measurements/leaders',
      summary: 'Spots across the collection ranked by fading rate or by latest ΔE00, filtered by process and toner class', tags: ['measurements'],
      access: 'measurements.read', query: leadersQuerySchema, response: { description: 'A page of spots', schema: pageEnvelope(leaderSchema) },
      handler: async ({ query }) => {
        const { rows, total } = await listLeaders(query);
        return { data: rows, pagination: { page: query.page, pageSize: query.pageSize, total } };
      },
    }),
  ];
}
