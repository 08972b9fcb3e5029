import { printDeletion } from '../../services/print-deletion';
import { printsApi } from '@toneledger/common/api/prints';
import { implement, type RouteDef } from '../../http/route';
import {
  createPrint, deletePrint, getPrint, listMovements, listPrints, movePrint, printHistory, replaceSteps, updatePrint,
} from '../../services/print.service';
import { printJson, writePrintsCsv, writeStepsCsv } from '../../services/print-export.service';
import { printTimeline } from '../../services/timeline.service';

export function printsRoutes(): RouteDef[] {
  return implement(printsApi, {
    list: async ({ query, actor }) => {
      const { rows, total, estimated } = await listPrints(query, actor.role);
      return { data: rows, pagination: { page: query.page, pageSize: query.pageSize, total, ...(estimated ? { estimated } : {}) } };
    },
    exportCsv: async ({ query, actor, res }) => {
      res.setHeader('Content-Type', 'text/csv; charset=utf-8');
      res.setHeader('Content-Disposition', `attachment; filename="prints-${new Date().toISOString().slice(0, 10)}.csv"`);
      await writePrintsCsv(query, actor.role, res);
      res.end();
    },
    exportStepsCsv: async ({ query, actor, res }) => {
      res.setHeader('Content-Type', 'text/csv; charset=utf-8');
      res.setHeader('Content-Disposition', `attachment; filename="prints-steps-${new Date().toISOString().slice(0, 10)}.csv"`);
      await writeStepsCsv(query, actor.role, res);
      res.end();
    },
    create: async ({ body, actor, requestId }) => ({ data: await createPrint(body, actor, requestId) }),
    get: async ({ params, actor }) => ({ data: await getPrint(params.id, actor.role) }),
    update: async ({ params, body, actor, requestId }) => ({ data: await updatePrint(params.id, body, actor, requestId) }),
    deletion: async ({ params }) => ({ data: await printDeletion(params.id) }),
    remove: async ({ params, query, actor, requestId }) => {
      await deletePrint(params.id, query.version, actor, requestId);
      return { data: { id: params.id } };
    },
    replaceSteps: async ({ params, body, actor, requestId }) => ({ data: await replaceSteps(params.id, body, actor, requestId) }),
    movements: async ({ params }) => ({ data: await listMovements(params.id) }),
    move: async ({ params, body, actor, requestId }) => ({ data: await movePrint(params.id, body, actor, requestId) }),
    history: async ({ params, actor }) => ({ data: await printHistory(params.id, actor.role) }),
    exportJson: async ({ params, actor, res }) => {
      const doc = await printJson(params.id, actor.role);
      res.setHeader('Content-Disposition', `attachment; filename="print-${doc.print.accessionNumber.replace(/[^A-Za-z0-9._-]/g, '_')}.json"`);
      res.json(doc);
    },
    timeline: async ({ params, actor }) => ({ data: await printTimeline(params.id, actor.role) }),
  });
}
