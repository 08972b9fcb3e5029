import { z } from 'zod';
import { dataEnvelope } from '../schemas/envelope';
import { capturedMailSchema, testMailSchema } from '../schemas/system';
import { endpoint } from './endpoint';

export const devMailApi = {
  list: endpoint({
    method: 'get', path: '/api/dev/mail', summary: 'Messages caught by the local mail sink, newest first (development and tests only)',
    tags: ['development'], access: 'dev_mail.read',
    response: { description: 'Captured messages', schema: dataEnvelope(z.array(capturedMailSchema)) },
  }),
  sendTest: endpoint({
    method: 'post', path: '/api/dev/mail/test', summary: 'Sends a test message through the configured mail transport', tags: ['development'],
    access: 'dev_mail.read', body: testMailSchema, status: 202,
    response: { description: 'Accepted by the mail server', schema: dataEnvelope(z.object({ messageId: z.string() })) },
  }),
};
