import { displaysApi, exhibitionsApi } from '@toneledger/common/api/exhibitions';
import { implement, type RouteDef } from '../../http/route';
import {
  addObjects, createExhibition, decideObject, deleteExhibition, exhibitionChecklistCsv, exhibitionDetail, listExhibitions, removeObject, updateExhibition,
} from '../../services/exhibition.service';
import { createDisplay, deleteDisplay, updateDisplay } from '../../services/display.service';

export function exhibitionsRoutes(): RouteDef[] {
  return [
    ...implement(exhibitionsApi, {
      list: async ({ query }) => {
        const { rows, total } = await listExhibitions(query);
        return { data: rows, pagination: { page: query.page, pageSize: query.pageSize, total } };
      },
      create: async ({ body, actor, requestId }) => ({ data: await createExhibition(body, actor, requestId) }),
      get: async ({ params }) => ({ data: await exhibitionDetail(params.id) }),
      update: async ({ params, body, actor, requestId }) => ({ data: await updateExhibition(params.id, body, actor, requestId) }),
      remove: async ({ params, query, actor, requestId }) => {
        await deleteExhibition(params.id, query.version, actor, requestId);
        return { data: { id: params.id } };
      },
      addObjects: async ({ params, body, actor, requestId }) => ({ data: await addObjects(params.id, body, actor, requestId) }),
      removeObject: async ({ params, query, actor, requestId }) => ({ data: await removeObject(params.id, params.printId, query.version, actor, requestId) }),
      decide: async ({ params, body, actor, requestId }) => ({ data: await decideObject(params.id, params.printId, body, actor, requestId) }),
      checklistCsv: async ({ params, res }) => {
        const { title, csv } = await exhibitionChecklistCsv(params.id);
        const stem = title.replace(/[^A-Za-z0-9._-]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 80) || 'exhibition';
        res.setHeader('Content-Type', 'text/csv; charset=utf-8');
        res.setHeader('Content-Disposition', `attachment; filename="objects-${stem}.csv"`);
        res.end(csv);
      },
    }),
    ...implement(displaysApi, {
      create: async ({ params, body, actor, requestId }) => ({ data: await createDisplay(params.id, body, actor, requestId) }),
      update: async ({ params, body, actor, requestId }) => ({ data: await updateDisplay(params.id, body, actor, requestId) }),
      remove: async ({ params, query, actor, requestId }) => {
        await deleteDisplay(params.id, query.version, actor, requestId);
        return { data: { id: params.id } };
      },
    }),
  ];
}
