import { rm } from 'node:fs/promises';
import { preservationApi } from '@toneledger/common/api/preservation';
import type { AppDeps } from '../../deps';
import { validationFailed } from '../../errors';
import { implement, type RouteDef } from '../../http/route';
import { bagUpload } from '../../middleware/bag-upload';
import { MAX_BAG_BYTES, assertEmptyInstallation, getBagJob, listBagJobs, sendBag, startExport, startImport } from '../../services/preservation.service';

export function preservationRoutes(deps: Pick<AppDeps, 'queue' | 'store'>): RouteDef[] {
  const runner = (log: { error(obj: object, msg: string): void }) => ({ queue: deps.queue, store: deps.store, log });
  return implement(preservationApi, {
    startExport: async ({ body, actor, requestId, req }) => ({ data: await startExport(body, actor, requestId, runner(req.log)) }),
    list: async ({ actor }) => ({ data: await listBagJobs(actor) }),
    get: async ({ params, actor }) => ({ data: await getBagJob(params.id, actor) }),
    download: async ({ params, actor, requestId, res }) => {
      await sendBag(params.id, actor, requestId, deps.store, res);
    },
    startImport: {
      before: [
        // Refuse before receiving a large file when the installation is not empty.
        async (_req, _res, next) => {
          try {
            await assertEmptyInstallation();
            next();
          } catch (err) {
            next(err);
          }
        },
        bagUpload('bag', MAX_BAG_BYTES),
      ],
      handler: async ({ req, actor, requestId }) => {
        const file = req.file;
        if (!file) throw validationFailed([{ path: 'bag', message: 'Choose a bag (a .tar file)', code: 'required' }]);
        try {
          return { data: await startImport({ path: file.path, size: file.size, name: file.originalname.slice(0, 200) }, actor, requestId, runner(req.log)) };
        } finally {
          await rm(file.path, { force: true });
        }
      },
    },
  });
}
