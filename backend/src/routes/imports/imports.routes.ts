import { importsApi } from '@toneledger/common/api/imports';
import type { AppDeps } from '../../deps';
import { implement, type RouteDef } from '../../http/route';
import { fileUploads, uploadedText, uploadedTextOf } from '../../middleware/single-upload';
import { templateCsv } from '../../services/import-csv';
import { MAX_IMPORT_BYTES, commitImport, getImport, listImportRows, startImport } from '../../services/import.service';

const SAVE_AS = 'Save the spreadsheet as "CSV UTF-8".';

export function importsRoutes(deps: Pick<AppDeps, 'queue'>): RouteDef[] {
  return implement(importsApi, {
    template: ({ query, res }) => {
      res.setHeader('Content-Type', 'text/csv; charset=utf-8');
      res.setHeader('Content-Disposition', `attachment; filename="${query.file}-import-template.csv"`);
      res.send(templateCsv(query.file));
    },
    start: {
      before: [fileUploads(['file', 'steps'], MAX_IMPORT_BYTES)],
      handler: async ({ req, actor }) => {
        const prints = uploadedText(req, SAVE_AS);
        const steps = uploadedTextOf(req, 'steps', SAVE_AS);
        return {
          data: await startImport(
            { prints: { name: prints.name || 'prints.csv', text: prints.text }, steps: steps ? { name: steps.name || 'steps.csv', text: steps.text } : null },
            actor,
            { queue: deps.queue, log: req.log },
          ),
        };
      },
    },
    get: async ({ params }) => ({ data: await getImport(params.id) }),
    rows: async ({ params, query }) => {
      const { rows, total } = await listImportRows(params.id, query);
      return { data: rows, pagination: { page: query.page, pageSize: query.pageSize, total } };
    },
    commit: async ({ params, body, actor, requestId, req }) => ({ data: await commitImport(params.id, body.mode, actor, requestId, { queue: deps.queue, log: req.log }) }),
  });
}
