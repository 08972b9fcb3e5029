import { devMailApi } from '@toneledger/common/api/dev-mail';
import { implement, type RouteDef } from '../../http/route';
import { notFound } from '../../errors';
import { recordAudit } from '../../services/audit.service';
import type { AppDeps } from '../../deps';

export function devMailRoutes(deps: AppDeps): RouteDef[] {
  const available = () => {
    if (deps.env.NODE_ENV === 'production' || !deps.mailer.hasSink) throw notFound('The local mail sink');
  };
  return implement(devMailApi, {
    list: async () => {
      available();
      return { data: await deps.mailer.captured() };
    },
    sendTest: async ({ body, actor, requestId }) => {
      available();
      const to = body.to ?? actor.email;
      if (!to) throw notFound('An e-mail address for you');
      const sent = await deps.mailer.send({
        to,
        subject: 'Toneledger test message',
        text: `This is a test message sent by ${actor.name} from Toneledger at ${new Date().toISOString()}.`,
      });
      await recordAudit({ actor, action: 'mail.test_sent', entityType: 'mail', entityId: sent.messageId, after: { to }, requestId });
      return { data: sent };
    },
  });
}
