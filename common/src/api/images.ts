import { z } from 'zod';
import { dataEnvelope } from '../schemas/envelope';
import {
  alignmentInputSchema, alignmentSchema, fixityAlertSchema, fixityResultSchema, imageDeleteSchema, imageSchema, imageUpdateSchema,
  imageUploadFieldsSchema,
} from '../schemas/images';
import { emptyBodySchema, id, idParamsSchema } from '../schemas/primitives';
import { endpoint } from './endpoint';

const imageEnvelope = dataEnvelope(imageSchema);

export const imagesApi = {
  list: endpoint({
    method: 'get', path: '/api/prints/:id/images', summary: "A print's images, oldest capture first (withdrawn ones on request, for staff)", tags: ['images'],
    access: 'images.read', params: idParamsSchema, query: z.object({ includeWithdrawn: z.enum(['true', 'false']).optional() }),
    response: { description: 'Images', schema: dataEnvelope(z.array(imageSchema)) },
  }),
  upload: endpoint({
    method: 'post', path: '/api/prints/:id/images',
    summary: 'Uploads one image (multipart: file, viewType, capturedOn?, notes?); type checked by content; SHA-256 kept', tags: ['images'],
    access: 'images.write', params: idParamsSchema, requestContentType: 'multipart/form-data', body: imageUploadFieldsSchema, status: 201,
    response: { description: 'The stored image (display copies follow in the background)', schema: imageEnvelope },
  }),
  get: endpoint({
    method: 'get', path: '/api/images/:id', summary: 'One image with its EXIF summary and last fixity result', tags: ['images'],
    access: 'images.read', params: idParamsSchema, response: { description: 'The image', schema: imageEnvelope },
  }),
  file: endpoint({
    method: 'get', path: '/api/images/:id/file/:variant', summary: 'The image bytes through the app (thumb, screen, or original for staff)', tags: ['images'],
    access: 'images.read', params: z.object({ id, variant: z.enum(['thumb', 'screen', 'original']) }),
    response: { description: 'Image bytes', contentType: 'image/*' },
  }),
  update: endpoint({
    method: 'patch', path: '/api/images/:id', summary: "Edits an image's view type, capture date or notes", tags: ['images'],
    access: 'images.write', params: idParamsSchema, body: imageUpdateSchema, response: { description: 'The image', schema: imageEnvelope },
  }),
  withdraw: endpoint({
    method: 'post', path: '/api/images/:id/withdraw', summary: 'Withdraws an image: recorded, files kept for the retention period, then purged', tags: ['images'],
    access: 'images.write', params: idParamsSchema, body: imageDeleteSchema, response: { description: 'The withdrawn image', schema: imageEnvelope },
  }),
  saveAlignment: endpoint({
    method: 'put', path: '/api/image-alignments', summary: 'Saves how one image lines up over another of the same print', tags: ['images'],
    access: 'images.write', body: alignmentInputSchema, response: { description: 'The alignment', schema: dataEnvelope(alignmentSchema) },
  }),
  alignment: endpoint({
    method: 'get', path: '/api/image-alignments', summary: 'The saved alignment of two images, or null', tags: ['images'],
    access: 'images.read', query: z.object({ baseImageId: id, otherImageId: id }),
    response: { description: 'The alignment', schema: dataEnvelope(alignmentSchema.nullable()) },
  }),
};

export const fixityApi = {
  history: endpoint({
    method: 'get', path: '/api/images/:id/fixity', summary: 'Every fixity check of one image, newest first', tags: ['fixity'],
    access: 'catalogue.read_restricted', params: idParamsSchema, response: { description: 'Checks', schema: dataEnvelope(z.array(fixityResultSchema)) },
  }),
  check: endpoint({
    method: 'post', path: '/api/images/:id/fixity', summary: 'Checks one image now', tags: ['fixity'],
    access: 'fixity.manage', params: idParamsSchema, body: emptyBodySchema, response: { description: 'The result', schema: dataEnvelope(fixityResultSchema) },
  }),
  runAll: endpoint({
    method: 'post', path: '/api/admin/fixity/run', summary: 'Starts a fixity check of every stored original (in the background)', tags: ['fixity'],
    access: 'fixity.manage', body: emptyBodySchema, status: 202,
    response: { description: 'Queued', schema: dataEnvelope(z.object({ jobId: z.string().nullable() })) },
  }),
  alerts: endpoint({
    method: 'get', path: '/api/admin/fixity/alerts', summary: 'Images whose latest fixity check did not match', tags: ['fixity'],
    access: 'fixity.read', response: { description: 'Alerts', schema: dataEnvelope(z.array(fixityAlertSchema)) },
  }),
};
