import { importsApi } from '@toneledger/common/api/imports';
import { IMPORT_COLUMNS } from '@toneledger/common/schemas/catalogue';
import { implement, type RouteDef } from '../../http/route';
import { singleUpload, uploadedText } from '../../middleware/single-upload';
import { MAX_IMPORT_BYTES, commitImport, getImport, startImport } from '../../services/import.service';

export function importsRoutes(): RouteDef[] {
  return implement(importsApi, {
    template: ({ res }) => {
      res.setHeader('Content-Type', 'text/csv; charset=utf-8');
      res.setHeader('Content-Disposition', 'attachment; filename="prints-import-template.csv"');
      res.send(`${IMPORT_COLUMNS.join(',')}\r\n`);
    },
    start: {
      before: [singleUpload('file', MAX_IMPORT_BYTES)],
      handler: async ({ req, actor }) => {
        const { name, text } = uploadedText(req, 'Save the spreadsheet as "CSV UTF-8".');
        return { data: await startImport(name || 'upload.csv', text, actor) };
      },
    },
    get: async ({ params }) => ({ data: await getImport(params.id) }),
    commit: async ({ params, actor, requestId }) => ({ data: await commitImport(params.id, actor, requestId) }),
  });
}
