import { z } from 'zod';
import { errorEnvelopeSchema } from '@toneledger/common/schemas/envelope';
import type { Endpoint } from '@toneledger/common/api/endpoint';
import type { RouteDef } from './route';

type Json = Record<string, unknown>;

function schemaOf(s: z.ZodType, io: 'input' | 'output'): Json {
  const out = z.toJSONSchema(s, { io, unrepresentable: 'any', target: 'draft-2020-12' }) as Json;
  delete out.$schema;
  return out;
}

function parametersOf(def: Endpoint): Json[] {
  const params: Json[] = [];
  // Path parameters carry the types of the params schema (a uuid, a code), not a bare string.
  const pathProps = def.params ? ((schemaOf(def.params, 'input').properties ?? {}) as Record<string, Json>) : {};
  for (const name of def.path.match(/:([A-Za-z0-9_]+)/g) ?? []) {
    const key = name.slice(1);
    params.push({ name: key, in: 'path', required: true, schema: pathProps[key] ?? { type: 'string' } });
  }
  if (def.idempotent) {
    params.push({
      name: 'Idempotency-Key', in: 'header', required: false, schema: { type: 'string', minLength: 1, maxLength: 200 },
      description:
        'Makes the create safe to retry: the same key (per user) with the same request within 24 hours returns the first answer '
        + '(status and body, with the header Idempotent-Replayed: true) and creates nothing more; the same key with a different '
        + 'request is 422 unprocessable; while the first request is still running, 409 conflict. A refused request keeps nothing.',
    });
  }
  if (def.query) {
    const json = schemaOf(def.query, 'input');
    const props = (json.properties ?? {}) as Record<string, Json>;
    const required = new Set((json.required as string[] | undefined) ?? []);
    for (const [name, schema] of Object.entries(props)) {
      params.push({ name, in: 'query', required: required.has(name) && !('default' in schema), schema });
    }
  }
  return params;
}

/** OpenAPI 3.1, generated from the same route list that Express mounts. */
export function openApiDocument(defs: RouteDef[], version: string): Json {
  const paths: Record<string, Json> = {};
  const error = { content: { 'application/json': { schema: { $ref: '#/components/schemas/ErrorEnvelope' } } } };
  for (const { endpoint: def } of defs) {
    const path = def.path.replace(/:([A-Za-z0-9_]+)/g, '{$1}');
    const responses: Record<string, Json> = {
      [String(def.status ?? 200)]: {
        description: def.response.description,
        ...(def.response.schema
          ? { content: { [def.response.contentType ?? 'application/json']: { schema: schemaOf(def.response.schema, 'output') } } }
          : def.response.contentType
            ? { content: { [def.response.contentType]: { schema: { type: 'string' } } } }
            : {}),
      },
    };
    if (def.params || def.query || def.body) responses['400'] = { description: 'validation_failed', ...error };
    if (def.access !== 'public') responses['401'] = { description: 'unauthenticated', ...error };
    if (def.access !== 'public' && def.access !== 'signed_in') responses['403'] = { description: `forbidden (needs ${def.access})`, ...error };
    if (def.method !== 'get') responses['403'] ??= { description: 'forbidden (cross-site request)', ...error };
    if (def.params) responses['404'] = { description: 'not_found', ...error };
    if (def.idempotent) {
      responses['409'] ??= { description: 'conflict (also: a request with the same Idempotency-Key is still running)', ...error };
      responses['422'] = { description: 'unprocessable (the Idempotency-Key was used for a different request)', ...error };
    }
    responses['500'] = { description: 'internal_error', ...error };
    paths[path] ??= {};
    paths[path][def.method] = {
      summary: def.summary,
      tags: def.tags,
      'x-access': def.access,
      parameters: parametersOf(def),
      ...(def.body ? { requestBody: { required: true, content: { 'application/json': { schema: schemaOf(def.body, 'input') } } } } : {}),
      ...(def.requestContentType === 'multipart/form-data'
        ? { requestBody: { required: true, content: { 'multipart/form-data': { schema: { type: 'object', properties: { file: { type: 'string', format: 'binary' } }, required: ['file'] } } } } }
        : {}),
      responses,
      ...(def.access === 'public' ? {} : { security: [{ session: [] }] }),
    };
  }
  return {
    openapi: '3.1.0',
    info: { title: 'Toneledger API', version, description: 'Records of toned gelatin silver prints: catalogue, condition, measurements, schedule, research.' },
    paths,
    components: {
      schemas: { ErrorEnvelope: schemaOf(errorEnvelopeSchema, 'output') },
      securitySchemes: { session: { type: 'apiKey', in: 'cookie', name: 'toneledger.sid' } },
    },
  };
}
