import { describe, expect, it } from 'vitest';
import express from 'express';
import supertest from 'supertest';
import pino from 'pino';
import { z } from 'zod';
import { endpoint } from '@toneledger/common/api/endpoint';
import { errorHandler } from '../middleware/error-handler';
import { implement, mount } from './route';

/** An app with one endpoint whose handler answers `answer`, logging into `lines`. */
function appAnswering(answer: unknown, checkResponses: boolean) {
  const lines: Record<string, unknown>[] = [];
  const logger = pino({ level: 'info' }, { write: (line: string) => lines.push(JSON.parse(line)) });
  const contract = {
    thing: endpoint({
      method: 'get', path: '/api/things/:id', summary: 'One thing', tags: ['test'], access: 'public',
      params: z.object({ id: z.string().uuid() }), response: { description: 'The thing', schema: z.object({ data: z.object({ n: z.number() }) }) },
    }),
  };
  const app = express();
  app.use((req, _res, next) => {
    req.log = logger;
    next();
  });
  const router = express.Router();
  mount(router, implement(contract, { thing: () => answer as { data: { n: number } } }), { checkResponses });
  app.use(router);
  app.use(errorHandler);
  return { app, lines };
}

const ID = '0b9d7c1e-2f3a-4b5c-8d6e-7f8091a2b3c4';

describe('mount()', () => {
  it('answers with the handler result when it matches the response schema', async () => {
    const { app } = appAnswering({ data: { n: 3 } }, true);
    const res = await supertest(app).get(`/api/things/${ID}`);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ data: { n: 3 } });
  });

  it('a path parameter of the wrong type is a 400 naming it', async () => {
    const { app } = appAnswering({ data: { n: 3 } }, true);
    const res = await supertest(app).get('/api/things/not-a-uuid');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(res.body.error.details[0].path).toBe('params.id');
  });

  it('a response that breaks its contract is a 500 in development, with the zod issues in the log and not in the answer', async () => {
    const { app, lines } = appAnswering({ data: { n: 'three' } }, true);
    const res = await supertest(app).get(`/api/things/${ID}`);
    expect(res.status).toBe(500);
    expect(res.body.error.code).toBe('internal_error');
    expect(JSON.stringify(res.body)).not.toContain('three');
    const logged = lines.find((l) => l.msg === 'response did not match its contract');
    expect(logged?.endpoint).toBe('GET /api/things/:id');
    expect(logged?.issues).toEqual([expect.objectContaining({ path: ['data', 'n'], code: 'invalid_type' })]);
  });

  it('in production the response is not checked', async () => {
    const { app } = appAnswering({ data: { n: 'three' } }, false);
    const res = await supertest(app).get(`/api/things/${ID}`);
    expect(res.status).toBe(200);
  });
});
