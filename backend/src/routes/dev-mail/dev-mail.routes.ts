import { z } from 'zod';
import { dataEnvelope } from '@toneledger/common/schemas/envelope';
import { capturedMailSchema, testMailSchema } from '@toneledger/common/schemas/system';
import { route, type RouteDef } from '../../http/route';
import { notFound } from '../../errors';
import { recordAudit } from '../../services/audit.service';
import { idOf } from '../../middleware/request-id';
import type { AppDeps } from '../../deps';

export function devMailRoutes(deps: AppDeps): RouteDef[] {
  const available = () => {
    if (deps.env.NODE_ENV === 'production' || !deps.mailer.hasSink) throw notFound('The local mail sink');
  };
  return [
    route({
      method: 'get',
      path: '/api/dev/mail',
      summary: 'Messages caught by the local mail sink, newest first (development and tests only)',
      tags: ['development'],
      access: 'dev_mail.read',
      response: { description: 'Captured messages', schema: dataEnvelope(z.array(capturedMailSchema)) },
      handler: async () => {
        available();
        return { data: await deps.mailer.captured() };
      },
    }),
    route({
      method: 'post',
      path: '/api/dev/mail/test',
      summary: 'Sends a test message through the configured mail transport',
      tags: ['development'],
      access: 'dev_mail.read',
      body: testMailSchema,
      status: 202,
      response: { description: 'Accepted by the mail server', schema: dataEnvelope(z.object({ messageId: z.string() })) },
      handler: async ({ body, user, req }) => {
        available();
        const to = body.to ?? user!.email;
        if (!to) throw notFound('An e-mail address for you');
        const sent = await deps.mailer.send({
          to,
          subject: 'Toneledger test message',
          text: `This is a test message sent by ${user!.name} from Toneledger at ${new Date().toISOString()}.`,
        });
        await recordAudit({ actor: { id: user!.id, name: user!.name }, action: 'mail.test_sent', entityType: 'mail', entityId: sent.messageId, after: { to }, requestId: idOf(req) });
        return { data: sent };
      },
    }),
  ];
}
