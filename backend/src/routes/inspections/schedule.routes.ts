import { scheduleApi } from '@toneledger/common/api/inspections';
import { implement, type RouteDef } from '../../http/route';
import { overrideSchedule, printSchedule } from '../../services/schedule.service';
import { installScheduleWake, scheduleRecomputeProgress, startScheduleRecompute } from '../../services/schedule-jobs';
import type { AppDeps } from '../../deps';

/**
 * A print's next-inspection date, a conservator's override and the full recompute. Building these
 * routes also installs what waking the schedule work does for this app: the queued job, or the work
 * in this process when the app has no queue (testApp).
 */
export function scheduleRoutes(deps: Pick<AppDeps, 'queue'>): RouteDef[] {
  installScheduleWake(deps.queue);
  return implement({ print: scheduleApi.print, override: scheduleApi.override, recompute: scheduleApi.recompute, recomputeStatus: scheduleApi.recomputeStatus }, {
    print: async ({ params }) => ({ data: await printSchedule(params.id) }),
    override: async ({ params, body, actor, requestId }) => ({ data: await overrideSchedule(params.id, body, actor, requestId) }),
    recompute: async () => ({ data: await startScheduleRecompute(deps.queue) }),
    recomputeStatus: async () => ({ data: await scheduleRecomputeProgress() }),
  });
}
