import type { z } from 'zod';
import type { Permission } from '../domain/roles';

/** Who may call an endpoint: anyone, any signed-in user, or holders of one permission. */
export type Access = 'public' | 'signed_in' | Permission;
export type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

/**
 * One endpoint, described once: the server mounts, checks and documents it from this, the client
 * builds its URL and parses its answer from this. Nothing about it is written anywhere else.
 */
export interface Endpoint {
  method: Method;
  /** Express-style path with `:name` parameters, e.g. `/api/prints/:id`. */
  path: string;
  summary: string;
  tags: readonly string[];
  access: Access;
  params?: z.ZodType;
  query?: z.ZodType;
  body?: z.ZodType;
  /** Success status; 200 when absent. */
  status?: number;
  /** The success answer: a JSON schema, or a content type for a file (CSV, a JSON download). */
  response: { description: string; schema?: z.ZodType; contentType?: string };
  /** A request body other than JSON (file uploads), for the OpenAPI document and the client. */
  requestContentType?: 'multipart/form-data';
  /**
   * A POST that creates a record: it honours an `Idempotency-Key` header, so a retry after a lost
   * answer returns the first answer instead of creating a second record (`backend/src/http/idempotency.ts`).
   * JSON bodies only: a multipart upload is not marked (its file is not part of the fingerprint).
   */
  idempotent?: true;
}

/** Declares an endpoint, keeping every literal (access, method, schemas) for the types below. */
export function endpoint<const E extends Endpoint>(def: E): E {
  return def;
}

/** A resource's endpoints by name. */
export type Contract = Record<string, Endpoint>;

type SchemaOf<E, K extends 'params' | 'query' | 'body'> = E extends { [P in K]: infer S extends z.ZodType } ? S : undefined;

/** What the server's handler receives, after parsing. */
export type ParamsOut<E extends Endpoint> = SchemaOf<E, 'params'> extends z.ZodType ? z.output<SchemaOf<E, 'params'>> : Record<string, never>;
export type QueryOut<E extends Endpoint> = SchemaOf<E, 'query'> extends z.ZodType ? z.output<SchemaOf<E, 'query'>> : Record<string, never>;
export type BodyOut<E extends Endpoint> = SchemaOf<E, 'body'> extends z.ZodType ? z.output<SchemaOf<E, 'body'>> : undefined;

/** What the client sends, before parsing. */
export type ParamsIn<E extends Endpoint> = SchemaOf<E, 'params'> extends z.ZodType ? z.input<SchemaOf<E, 'params'>> : undefined;
export type QueryIn<E extends Endpoint> = SchemaOf<E, 'query'> extends z.ZodType ? z.input<SchemaOf<E, 'query'>> : undefined;
export type BodyIn<E extends Endpoint> = E extends { requestContentType: 'multipart/form-data' }
  ? FormData
  : SchemaOf<E, 'body'> extends z.ZodType
    ? z.input<SchemaOf<E, 'body'>>
    : undefined;

type ResponseSchemaOf<E extends Endpoint> = E['response'] extends { schema: infer S extends z.ZodType } ? S : undefined;
/** The parsed success answer (the whole envelope). */
export type ResponseOf<E extends Endpoint> = ResponseSchemaOf<E> extends z.ZodType ? z.output<ResponseSchemaOf<E>> : unknown;
/** What a handler must return to satisfy the response schema. */
export type ResponseIn<E extends Endpoint> = ResponseSchemaOf<E> extends z.ZodType ? z.input<ResponseSchemaOf<E>> : void;
/** The `data` of the success envelope. */
export type DataOf<E extends Endpoint> = ResponseOf<E> extends { data: infer D } ? D : never;

/** Builds the path of an endpoint from its parameters (each one URL-encoded). */
export function pathOf(e: Pick<Endpoint, 'path'>, params?: Record<string, unknown>): string {
  return e.path.replace(/:([A-Za-z0-9_]+)/g, (_m, name: string) => {
    const value = params?.[name];
    if (value === undefined || value === null || value === '') throw new Error(`Missing path parameter "${name}" for ${e.path}`);
    return encodeURIComponent(String(value));
  });
}
