import { z } from 'zod';
import { dataEnvelope } from '../schemas/envelope';
import {
  climateCheckInputSchema, climateFileSchema, climatePeriodQuerySchema, climateRoomSchema, climateSeriesSchema, climateSettingsSchema,
  climateSummarySchema,
} from '../schemas/climate';
import { idParamsSchema } from '../schemas/primitives';
import { endpoint } from './endpoint';
import { settingsSection } from './settings-section';

export const climateSettingsApi = settingsSection({
  name: 'climate', title: 'Climate settings', read: 'climate.read', schema: climateSettingsSchema, tags: ['settings', 'climate'],
  readSummary: 'Target temperature and RH ranges (with their source), the reference climate and the isoperm constants',
  changeSummary: 'Changes the target ranges, the reference climate and the isoperm constants',
});

export const climateApi = {
  rooms: endpoint({
    method: 'get', path: '/api/climate/rooms', summary: "Every location holding logger readings, its figures over the period side by side (the last 365 days by default)",
    tags: ['climate'], access: 'climate.read', query: climatePeriodQuerySchema,
    response: { description: 'Rooms', schema: dataEnvelope(z.array(climateRoomSchema)) },
  }),
  summary: endpoint({
    method: 'get', path: '/api/locations/:id/climate', summary: "A location's climate over a period: min/max/mean, time outside the targets, excursions, gaps, relative permanence",
    tags: ['climate'], access: 'climate.read', params: idParamsSchema, query: climatePeriodQuerySchema,
    response: { description: 'Climate figures', schema: dataEnvelope(climateSummarySchema) },
  }),
  series: endpoint({
    method: 'get', path: '/api/locations/:id/climate/series', summary: "A location's readings over a period for a chart, averaged into at most about 1,000 buckets (with each bucket's min and max)",
    tags: ['climate'], access: 'climate.read', params: idParamsSchema, query: climatePeriodQuerySchema,
    response: { description: 'Series', schema: dataEnvelope(climateSeriesSchema) },
  }),
  files: endpoint({
    method: 'get', path: '/api/locations/:id/climate-files', summary: 'The logger files loaded or waiting for a location, newest first',
    tags: ['climate'], access: 'climate.read', params: idParamsSchema,
    response: { description: 'Files', schema: dataEnvelope(z.array(climateFileSchema)) },
  }),
  upload: endpoint({
    method: 'post', path: '/api/locations/:id/climate-files',
    summary: 'Uploads a logger CSV (field `file`) for a location: answers its columns, first rows and a suggested mapping; no reading is written yet',
    tags: ['climate'], access: 'climate.write', params: idParamsSchema, requestContentType: 'multipart/form-data', status: 201,
    response: { description: 'The uploaded file', schema: dataEnvelope(climateFileSchema) },
  }),
  get: endpoint({
    method: 'get', path: '/api/climate-files/:id', summary: 'One logger file with its mapping and check',
    tags: ['climate'], access: 'climate.read', params: idParamsSchema,
    response: { description: 'The file', schema: dataEnvelope(climateFileSchema) },
  }),
  check: endpoint({
    method: 'post', path: '/api/climate-files/:id/check',
    summary: 'Reads every row with a mapping: the preview, the bad rows named, the span and the duplicates; nothing is written to the readings',
    tags: ['climate'], access: 'climate.write', params: idParamsSchema, body: climateCheckInputSchema,
    response: { description: 'The checked file', schema: dataEnvelope(climateFileSchema) },
  }),
  accept: endpoint({
    method: 'post', path: '/api/climate-files/:id/accept',
    summary: "Writes the checked file's readings (409 while any row is bad or the file is not checked); readings already held are kept; the prints stored there are rescheduled",
    tags: ['climate'], access: 'climate.write', params: idParamsSchema, body: climateCheckInputSchema,
    response: { description: 'The accepted file', schema: dataEnvelope(climateFileSchema) },
  }),
  discard: endpoint({
    method: 'delete', path: '/api/climate-files/:id', summary: 'Discards a file not yet accepted (its text is dropped; the discard is audited)',
    tags: ['climate'], access: 'climate.write', params: idParamsSchema, status: 204, response: { description: 'Discarded' },
  }),
};
