import { bulkApi, savedSearchesApi } from '@toneledger/common/api/bulk';
import { implement, type RouteDef } from '../../http/route';
import {
  applyExhibition, applyMove, applyRehouse, applyRound, applyStatus, previewExhibition, previewMove, previewRehouse, previewRound, previewStatus,
} from '../../services/bulk.service';
import { writeSelectionCsv, writeSelectionJson } from '../../services/bulk-export';
import { createSavedSearch, deleteSavedSearch, listSavedSearches, updateSavedSearch } from '../../services/saved-search.service';

const day = () => new Date().toISOString().slice(0, 10);

export function bulkRoutes(): RouteDef[] {
  return [
    ...implement(bulkApi, {
      movePreview: async ({ body, actor }) => ({ data: await previewMove(body, actor) }),
      move: async ({ body, actor, requestId }) => ({ data: await applyMove(body, actor, requestId) }),
      rehousePreview: async ({ body, actor }) => ({ data: await previewRehouse(body, actor) }),
      rehouse: async ({ body, actor, requestId }) => ({ data: await applyRehouse(body, actor, requestId) }),
      statusPreview: async ({ body, actor }) => ({ data: await previewStatus(body, actor) }),
      status: async ({ body, actor, requestId }) => ({ data: await applyStatus(body, actor, requestId) }),
      roundPreview: async ({ body, actor }) => ({ data: await previewRound(body, actor) }),
      round: async ({ body, actor, requestId }) => ({ data: await applyRound(body, actor, requestId) }),
      exhibitionPreview: async ({ body, actor }) => ({ data: await previewExhibition(body, actor) }),
      exhibition: async ({ body, actor, requestId }) => ({ data: await applyExhibition(body, actor, requestId) }),
      exportCsv: async ({ body, actor, res }) => {
        res.setHeader('Content-Type', 'text/csv; charset=utf-8');
        res.setHeader('Content-Disposition', `attachment; filename="prints-selection-${day()}.csv"`);
        await writeSelectionCsv(body.selection, actor.role, res);
        res.end();
      },
      exportJson: async ({ body, actor, res }) => {
        await writeSelectionJson(body.selection, actor.role, res, () => {
          res.setHeader('Content-Type', 'application/json; charset=utf-8');
          res.setHeader('Content-Disposition', `attachment; filename="prints-selection-${day()}.json"`);
        });
        res.end();
      },
    }),
    ...implement(savedSearchesApi, {
      list: async ({ actor }) => ({ data: await listSavedSearches(actor) }),
      create: async ({ body, actor, requestId }) => ({ data: await createSavedSearch(body, actor, requestId) }),
      update: async ({ params, body, actor, requestId }) => ({ data: await updateSavedSearch(params.id, body, actor, requestId) }),
      remove: async ({ params, query, actor, requestId }) => {
        await deleteSavedSearch(params.id, query.version, actor, requestId);
        return { data: { id: params.id } };
      },
    }),
  ];
}
