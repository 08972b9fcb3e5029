import { systemApi } from '@toneledger/common/api/system';
import { implement, type RouteDef } from '../../http/route';
import { checkHealth } from '../../services/health.service';
import { AppError } from '../../errors';
import type { AppDeps } from '../../deps';

/** Health, and the OpenAPI document of `routes` (every route the app serves, this one included). */
export function systemRoutes(deps: AppDeps, openApi: () => Record<string, unknown>): RouteDef[] {
  return implement(systemApi, {
    health: async () => {
      const health = await checkHealth(deps.pool, deps.store, deps.version);
      if (health.status !== 'ok') {
        const down = Object.values(health.checks)
          .filter((c) => !c.ok)
          .map((c) => c.error)
          .join('; ');
        throw new AppError('service_unavailable', 503, down, health);
      }
      return { data: health };
    },
    openapi: () => openApi(),
  });
}
