import { dataEnvelope } from '@toneledger/common/schemas/envelope';
import { healthSchema } from '@toneledger/common/schemas/system';
import { route, type RouteDef } from '../../http/route';
import { checkHealth } from '../../services/health.service';
import { AppError } from '../../errors';
import type { AppDeps } from '../../deps';

export function systemRoutes(deps: AppDeps): RouteDef[] {
  return [
    route({
      method: 'get',
      path: '/api/health',
      summary: 'Checks PostgreSQL and object storage; 503 names what is down',
      tags: ['system'],
      access: 'public',
      response: { description: 'Everything answers', schema: dataEnvelope(healthSchema) },
      handler: async () => {
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
    }),
  ];
}
