import { fixityApi, imagesApi } from '@toneledger/common/api/images';
import { implement, type RouteDef } from '../../http/route';
import { imageUpload, uploadedImage } from '../../middleware/image-upload';
import {
  checkFixityNow, fixityAlerts, fixityHistory, getAlignment, imageFor, listImages, openVariant, saveAlignment, updateImage, uploadImage,
  withdrawImage,
} from '../../services/image.service';
import { downloadName } from '../../services/image-signature';
import { QUEUES } from '../../jobs/queue';
import type { AppDeps } from '../../deps';

export function imagesRoutes(deps: AppDeps): RouteDef[] {
  return [
    ...implement(imagesApi, {
      list: async ({ params, query, actor }) => ({ data: await listImages(params.id, actor.role, query.includeWithdrawn === 'true') }),
      upload: {
        before: [imageUpload(deps.env.IMAGE_MAX_MB * 1024 * 1024)],
        // The text fields are the endpoint's body, checked by the contract; the middleware removes the temporary file when the answer ends.
        handler: async ({ params, body, req, actor, requestId }) =>
          ({ data: await uploadImage({ store: deps.store, queue: deps.queue }, params.id, uploadedImage(req), body, actor, requestId) }),
      },
      get: async ({ params, actor }) => ({ data: await imageFor(params.id, actor.role) }),
      file: async ({ params, actor, res }) => {
        const { stream, contentType, row } = await openVariant(deps.store, params.id, params.variant, actor.role);
        res.setHeader('Content-Type', contentType);
        res.setHeader('Cache-Control', 'private, max-age=3600');
        res.setHeader('X-Content-Type-Options', 'nosniff');
        if (params.variant === 'original') {
          res.setHeader('Content-Disposition', `attachment; filename="${downloadName(row.fileName, contentType)}"`);
          res.setHeader('Digest', `sha-256=${Buffer.from(row.sha256, 'hex').toString('base64')}`);
        }
        await new Promise<void>((resolve, reject) => {
          stream.on('error', reject);
          res.on('finish', resolve);
          res.on('close', resolve);
          stream.pipe(res);
        });
      },
      update: async ({ params, body, actor, requestId }) => ({ data: await updateImage(params.id, body, actor, requestId) }),
      withdraw: async ({ params, body, actor, requestId }) =>
        ({ data: await withdrawImage(params.id, body, actor, requestId, deps.env.IMAGE_RETENTION_DAYS) }),
      saveAlignment: async ({ body, actor }) => ({ data: await saveAlignment(body, actor) }),
      alignment: async ({ query }) => ({ data: await getAlignment(query.baseImageId, query.otherImageId) }),
    }),
    ...implement(fixityApi, {
      history: async ({ params, actor }) => ({ data: await fixityHistory(params.id, actor.role) }),
      check: async ({ params, actor }) => ({ data: await checkFixityNow(deps.store, params.id, actor.role) }),
      runAll: async () => ({ data: { jobId: deps.queue ? await deps.queue.send(QUEUES.fixity, {}) : null } }),
      alerts: async () => ({ data: await fixityAlerts() }),
    }),
  ];
}
