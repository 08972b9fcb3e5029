import { rm } from 'node:fs/promises';
import { z } from 'zod';
import { dataEnvelope } from '@toneledger/common/schemas/envelope';
import { idParamsSchema } from '@toneledger/common/schemas/catalogue';
import {
  alignmentInputSchema, alignmentSchema, fixityAlertSchema, fixityResultSchema, imageDeleteSchema, imageSchema, imageUpdateSchema,
  imageUploadFieldsSchema, timelineEntrySchema,
} from '@toneledger/common/schemas/images';
import { route, type RouteDef } from '../../http/route';
import { idOf } from '../../middleware/request-id';
import { validationFailed } from '../../errors';
import { receiveImage } from '../../services/image-ingest';
import {
  checkFixity, fixityAlerts, getAlignment, getImage, listImages, openVariant, presentFixity, presentImage, saveAlignment, storeImage,
  updateImage, withdrawImage,
} from '../../services/image.service';
import { printTimeline } from '../../services/timeline.service';
import { QUEUES } from '../../jobs/queue';
import { FixityCheck } from '../../models';
import type { AppDeps } from '../../deps';

export function imagesRoutes(deps: AppDeps): RouteDef[] {
  return [
    route({
      method: 'get', path: '/api/prints/:id/images', summary: "A print's images, oldest capture first (withdrawn ones on request, for staff)", tags: ['images'],
      access: 'images.read', params: idParamsSchema, query: z.object({ includeWithdrawn: z.enum(['true', 'false']).optional() }),
      response: { description: 'Images', schema: dataEnvelope(z.array(imageSchema)) },
      handler: async ({ params, query, user }) => ({ data: await listImages(params.id, user!.role, query.includeWithdrawn === 'true') }),
    }),
    route({
      method: 'post', path: '/api/prints/:id/images',
      summary: 'Uploads one image (multipart: file, viewType, capturedOn?, notes?); type checked by content; SHA-256 kept', tags: ['images'],
      access: 'images.write', params: idParamsSchema, requestContentType: 'multipart/form-data', status: 201,
      response: { description: 'The stored image (display copies follow in the background)', schema: dataEnvelope(imageSchema) },
      handler: async ({ params, req, user }) => {
        const file = await receiveImage(req, deps.env.IMAGE_MAX_MB * 1024 * 1024);
        try {
          const fields = imageUploadFieldsSchema.safeParse(file.fields);
          if (!fields.success) throw validationFailed(fields.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message, code: i.code })));
          const image = await storeImage({ store: deps.store, queue: deps.queue }, params.id, file, fields.data, { id: user!.id, name: user!.name }, idOf(req));
          return { data: presentImage(image, user!.role, null) };
        } finally {
          await rm(file.tempDir, { recursive: true, force: true });
        }
      },
    }),
    route({
      method: 'get', path: '/api/images/:id', summary: 'One image with its EXIF summary and last fixity result', tags: ['images'],
      access: 'images.read', params: idParamsSchema, response: { description: 'The image', schema: dataEnvelope(imageSchema) },
      handler: async ({ params, user }) => ({ data: (await getImage(params.id, user!.role)).dto }),
    }),
    route({
      method: 'get', path: '/api/images/:id/file/:variant', summary: 'The image bytes through the app (thumb, screen, or original for staff)', tags: ['images'],
      access: 'images.read', params: z.object({ id: idParamsSchema.shape.id, variant: z.enum(['thumb', 'screen', 'original']) }),
      response: { description: 'Image bytes', contentType: 'image/*' },
      handler: async ({ params, user, res }) => {
        const { stream, contentType, row } = await openVariant(deps.store, params.id, params.variant, user!.role);
        res.setHeader('Content-Type', contentType);
        res.setHeader('Cache-Control', 'private, max-age=3600');
        res.setHeader('X-Content-Type-Options', 'nosniff');
        if (params.variant === 'original') {
          res.setHeader('Content-Disposition', `attachment; filename="${row.fileName.replace(/[^A-Za-z0-9._-]/g, '_')}"`);
          res.setHeader('Digest', `sha-256=${Buffer.from(row.sha256, 'hex').toString('base64')}`);
        }
        await new Promise<void>((resolve, reject) => {
          stream.on('error', reject);
          res.on('finish', resolve);
          res.on('close', resolve);
          stream.pipe(res);
        });
      },
    }),
    route({
      method: 'patch', path: '/api/images/:id', summary: "Edits an image's view type, capture date or notes", tags: ['images'],
      access: 'images.write', params: idParamsSchema, body: imageUpdateSchema, response: { description: 'The image', schema: dataEnvelope(imageSchema) },
      handler: async ({ params, body, user, req }) => ({ data: await updateImage(params.id, body, { id: user!.id, name: user!.name, role: user!.role }, idOf(req)) }),
    }),
    route({
      method: 'post', path: '/api/images/:id/withdraw', summary: 'Withdraws an image: recorded, files kept for the retention period, then purged', tags: ['images'],
      access: 'images.write', params: idParamsSchema, body: imageDeleteSchema, response: { description: 'The withdrawn image', schema: dataEnvelope(imageSchema) },
      handler: async ({ params, body, user, req }) => ({ data: await withdrawImage(params.id, body, { id: user!.id, name: user!.name, role: user!.role }, idOf(req)) }),
    }),
    route({
      method: 'get', path: '/api/images/:id/fixity', summary: 'Every fixity check of one image, newest first', tags: ['fixity'],
      access: 'catalogue.read_restricted', params: idParamsSchema, response: { description: 'Checks', schema: dataEnvelope(z.array(fixityResultSchema)) },
      handler: async ({ params, user }) => {
        await getImage(params.id, user!.role);
        const rows = await FixityCheck.findAll({ where: { imageId: params.id }, order: [['checkedAt', 'DESC'], ['id', 'DESC']] });
        return { data: rows.map(presentFixity) };
      },
    }),
    route({
      method: 'post', path: '/api/images/:id/fixity', summary: 'Checks one image now', tags: ['fixity'],
      access: 'fixity.manage', params: idParamsSchema, body: z.object({}).optional(), response: { description: 'The result', schema: dataEnvelope(fixityResultSchema) },
      handler: async ({ params, user }) => {
        const { row } = await getImage(params.id, user!.role);
        return { data: presentFixity(await checkFixity(deps.store, row)) };
      },
    }),
    route({
      method: 'post', path: '/api/admin/fixity/run', summary: 'Starts a fixity check of every stored original (in the background)', tags: ['fixity'],
      access: 'fixity.manage', body: z.object({}).optional(), status: 202, response: { description: 'Queued', schema: dataEnvelope(z.object({ jobId: z.string().nullable() })) },
      handler: async () => ({ data: { jobId: deps.queue ? await deps.queue.send(QUEUES.fixity, {}) : null } }),
    }),
    route({
      method: 'get', path: '/api/admin/fixity/alerts', summary: 'Images whose latest fixity check did not match', tags: ['fixity'],
      access: 'fixity.manage', response: { description: 'Alerts', schema: dataEnvelope(z.array(fixityAlertSchema)) },
      handler: async () => ({ data: await fixityAlerts() }),
    }),
    route({
      method: 'put', path: '/api/image-alignments', summary: 'Saves how one image lines up over another of the same print', tags: ['images'],
      access: 'images.write', body: alignmentInputSchema, response: { description: 'The alignment', schema: dataEnvelope(alignmentSchema) },
      handler: async ({ body, user }) => ({ data: await saveAlignment(body, { id: user!.id, name: user!.name }) }),
    }),
    route({
      method: 'get', path: '/api/image-alignments', summary: 'The saved alignment of two images, or null', tags: ['images'],
      access: 'images.read', query: z.object({ baseImageId: idParamsSchema.shape.id, otherImageId: idParamsSchema.shape.id }),
      response: { description: 'The alignment', schema: dataEnvelope(alignmentSchema.nullable()) },
      handler: async ({ query }) => ({ data: await getAlignment(query.baseImageId, query.otherImageId) }),
    }),
    route({
      method: 'get', path: '/api/prints/:id/timeline', summary: "One timeline of a print's life: cataloguing, movements, condition, images", tags: ['prints'],
      access: 'catalogue.read', params: idParamsSchema, response: { description: 'Newest first', schema: dataEnvelope(z.array(timelineEntrySchema)) },
      handler: async ({ params, user }) => ({ data: await printTimeline(params.id, user!.role) }),
    }),
  ];
}
