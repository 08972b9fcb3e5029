import { remindersApi } from '@toneledger/common/api/inspections';
import { implement, type RouteDef } from '../../http/route';
import { getReminders, listDigests, revokeFeed, rotateFeed, saveReminders } from '../../services/reminders.service';
import { calendarFeed } from '../../services/calendar-feed.service';
import type { AppDeps } from '../../deps';

export function remindersRoutes(deps: Pick<AppDeps, 'env'>): RouteDef[] {
  return implement(remindersApi, {
    get: async ({ actor }) => ({ data: await getReminders(actor.id) }),
    put: async ({ body, actor, requestId }) => ({ data: await saveReminders(actor, body, requestId) }),
    rotateFeed: async ({ actor, requestId }) => ({ data: await rotateFeed(actor, deps.env.PUBLIC_URL, requestId) }),
    revokeFeed: async ({ actor, requestId, res }) => {
      await revokeFeed(actor, requestId);
      res.status(204).end();
    },
    feed: async ({ params, res }) => {
      const body = await calendarFeed(params.token, deps.env.PUBLIC_URL);
      res.status(200).type('text/calendar; charset=utf-8').setHeader('Content-Disposition', 'inline; filename="inspections.ics"');
      res.send(body);
    },
    digests: async ({ query }) => listDigests(query),
  });
}
