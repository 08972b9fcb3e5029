import { roundsApi, scheduleApi } from '@toneledger/common/api/inspections';
import { implement, type RouteDef } from '../../http/route';
import { listRounds, roundDetail } from '../../services/round-detail.service';
import { createRound, listAssignees, updateRound } from '../../services/round.service';
import { worklist } from '../../services/worklist.service';

/** The work list (`scheduleApi.worklist`) and inspection rounds. A print's own schedule is in schedule.routes.ts. */
export function worklistRoutes(): RouteDef[] {
  return implement({ worklist: scheduleApi.worklist }, {
    worklist: async ({ query }) => worklist(query),
  });
}

export function roundsRoutes(): RouteDef[] {
  return implement(roundsApi, {
    list: async ({ query }) => {
      const { data, total } = await listRounds(query);
      return { data, pagination: { page: query.page, pageSize: query.pageSize, total } };
    },
    create: async ({ body, actor, requestId }) => ({ data: await createRound(body, actor, requestId) }),
    get: async ({ params }) => ({ data: await roundDetail(params.id) }),
    update: async ({ params, body, actor, requestId }) => ({ data: await updateRound(params.id, body, actor, requestId) }),
    assignees: async () => ({ data: await listAssignees() }),
  });
}
