import { z } from 'zod';
import { dataEnvelope } from '../schemas/envelope';
import { healthSchema } from '../schemas/system';
import { endpoint } from './endpoint';

export const systemApi = {
  health: endpoint({
    method: 'get', path: '/api/health', summary: 'Checks PostgreSQL and object storage; 503 names what is down', tags: ['system'],
    access: 'public', response: { description: 'Everything answers', schema: dataEnvelope(healthSchema) },
  }),
  openapi: endpoint({
    method: 'get', path: '/api/openapi.json', summary: 'This document', tags: ['system'],
    access: 'public', response: { description: 'OpenAPI 3.1 description of every route', schema: z.record(z.string(), z.unknown()) },
  }),
};
