import { dataEnvelope, pageEnvelope } from '../schemas/envelope';
import {
  baselineChoiceSchema, csvPreviewFieldsSchema, csvPreviewSchema, leaderSchema, leadersQuerySchema, measurementSettingsSchema,
  printMeasurementsSchema, sessionInputSchema, sessionSchema, spotInputSchema, spotSchema, spotUpdateSchema,
} from '../schemas/measurements';
import { idParamsSchema } from '../schemas/primitives';
import { endpoint } from './endpoint';
import { settingsSection } from './settings-section';

const spotEnvelope = dataEnvelope(spotSchema);

export const measurementSettingsApi = settingsSection({
  name: 'measurements', title: 'Measurement settings', read: 'measurements.read', schema: measurementSettingsSchema, tags: ['settings', 'measurements'],
  readSummary: 'The ΔE00 taken as a noticeable change', changeSummary: 'Changes the noticeable ΔE00 used for projections',
});

export const measurementsApi = {
  forPrint: endpoint({
    method: 'get', path: '/api/prints/:id/measurements',
    summary: "A print's spots, each with its change against its baseline, rate and projection; the sessions newest first", tags: ['measurements'],
    access: 'measurements.read', params: idParamsSchema, response: { description: 'Measurements of the print', schema: dataEnvelope(printMeasurementsSchema) },
  }),
  createSpot: endpoint({
    method: 'post', path: '/api/prints/:id/measurement-spots', summary: 'Registers a spot to measure (409 if the print has one of that name)', tags: ['measurements'],
    access: 'measurements.write', params: idParamsSchema, body: spotInputSchema, status: 201, idempotent: true, response: { description: 'The new spot', schema: spotEnvelope },
  }),
  updateSpot: endpoint({
    method: 'patch', path: '/api/measurement-spots/:id', summary: 'Renames, moves or describes a spot; a stale version gets 409', tags: ['measurements'],
    access: 'measurements.write', params: idParamsSchema, body: spotUpdateSchema, response: { description: 'The spot', schema: spotEnvelope },
  }),
  chooseBaseline: endpoint({
    method: 'put', path: '/api/measurement-spots/:id/baseline',
    summary: 'Chooses the baseline session of a spot, saying why (null returns to the first session); the session must have measured the spot',
    tags: ['measurements'],
    access: 'measurements.write', params: idParamsSchema, body: baselineChoiceSchema, response: { description: 'The spot', schema: spotEnvelope },
  }),
  // Sessions are the record: there is no endpoint to change or delete one.
  recordSession: endpoint({
    method: 'post', path: '/api/prints/:id/measurement-sessions',
    summary: 'Records a measurement session with its readings, all or nothing; readings are averaged per spot', tags: ['measurements'],
    access: 'measurements.write', params: idParamsSchema, body: sessionInputSchema, status: 201, idempotent: true,
    response: { description: 'The session as stored', schema: dataEnvelope(sessionSchema) },
  }),
  previewCsv: endpoint({
    method: 'post', path: '/api/prints/:id/measurement-sessions/csv-preview',
    summary: "Reads an instrument's CSV (field file, ≤ 5 MB; optional field mapping as JSON) and shows the readings by spot and every problem by row and column; writes nothing",
    tags: ['measurements'],
    access: 'measurements.write', params: idParamsSchema, requestContentType: 'multipart/form-data', body: csvPreviewFieldsSchema,
    response: { description: 'The preview', schema: dataEnvelope(csvPreviewSchema) },
  }),
  leaders: endpoint({
    method: 'get', path: '/api/measurements/leaders',
    summary: 'Spots across the collection ranked by fading rate or by latest ΔE00, filtered by process and toner class', tags: ['measurements'],
    access: 'measurements.read', query: leadersQuerySchema, response: { description: 'A page of spots', schema: pageEnvelope(leaderSchema) },
  }),
};
