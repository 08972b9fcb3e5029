import type { Request, RequestHandler, Response, Router } from 'express';
import type { z } from 'zod';
import { can } from '@toneledger/common/domain/roles';
import type {
  Access, BodyOut, Contract, Endpoint, ParamsOut, QueryOut, ResponseIn,
} from '@toneledger/common/api/endpoint';
import type { FieldIssue } from '@toneledger/common/schemas/envelope';
import { forbidden, unauthenticated, validationFailed, AppError } from '../errors';
import type { CurrentUser } from '../auth/current-user';
import { idOf } from '../middleware/request-id';
import { textProblems } from './input-text';
import { bodyHash, idempotencyKeyOf, IDEMPOTENCY_HEADER, type IdempotencyStore } from './idempotency';

export type { Access };

/** What a handler gets: parsed inputs, the signed-in user (never null unless the endpoint is public), the request id. */
export interface HandlerInput<E extends Endpoint> {
  params: ParamsOut<E>;
  query: QueryOut<E>;
  body: BodyOut<E>;
  actor: E['access'] extends 'public' ? CurrentUser | null : CurrentUser;
  requestId: string;
  req: Request;
  res: Response;
}

/**
 * Implements one endpoint. The return value is checked against the response schema at compile time;
 * an endpoint without a schema (a file download, a redirect) answers through `res` and returns nothing.
 */
export type Handler<E extends Endpoint> = (input: HandlerInput<E>) => Promise<ResponseIn<E>> | ResponseIn<E>;

export type Implementation<E extends Endpoint> =
  | Handler<E>
  | { /** Express middleware run after the access check and before validation (e.g. multer). */ before: RequestHandler[]; handler: Handler<E> };

/** An endpoint with its implementation: what `mount()` serves and the OpenAPI document lists. */
export interface RouteDef {
  endpoint: Endpoint;
  before: RequestHandler[];
  handler: (input: HandlerInput<Endpoint>) => unknown;
}

/** Implements every endpoint of a contract by name; a missing or extra name is a compile error. */
export function implement<C extends Contract>(contract: C, handlers: { [K in keyof C]: Implementation<C[K]> }): RouteDef[] {
  return Object.keys(contract).map((name) => {
    const impl = handlers[name] as Implementation<Endpoint>;
    const { before, handler } = typeof impl === 'function' ? { before: [], handler: impl } : impl;
    return { endpoint: contract[name]!, before, handler: handler as RouteDef['handler'] };
  });
}

function issues(error: z.ZodError, prefix: string) {
  return error.issues.map((i) => ({
    path: [prefix, ...i.path.map(String)].filter(Boolean).join('.'),
    message: i.message,
    code: i.code,
  }));
}

/** Express 5 exposes req.query as a getter: redefine it on the instance to write parsed values back. */
function writeBack(req: Request, key: 'params' | 'query' | 'body', value: unknown) {
  Object.defineProperty(req, key, { value, writable: true, enumerable: true, configurable: true });
}

export function checkAccess(access: Access, user: CurrentUser | null): void {
  if (access === 'public') return;
  if (!user) throw unauthenticated();
  if (access === 'signed_in') return;
  if (!can(user.role, access)) throw forbidden();
}

export interface MountOptions {
  /** In development and test, responses are checked against their declared schema. */
  checkResponses: boolean;
  /**
   * Where `Idempotency-Key`s of endpoints marked `idempotent` are kept. Without a store the header
   * is ignored (unit tests of mount() alone).
   */
  idempotency?: IdempotencyStore;
}

export function mount(router: Router, defs: RouteDef[], options: MountOptions): void {
  for (const { endpoint: def, before, handler } of defs) {
    const access: RequestHandler = (req, _res, next) => {
      checkAccess(def.access, req.user ?? null);
      next();
    };
    router[def.method](def.path, access, ...before, async (req: Request, res: Response) => {
      const key = def.idempotent && options.idempotency && req.user ? idempotencyKeyOf(req.headers[IDEMPOTENCY_HEADER]) : null;
      const rawBody: unknown = req.body;
      const parts = [
        ['params', def.params],
        ['query', def.query],
        ['body', def.body],
      ] as const;
      // The input rules first, over everything the request carries (declared or not): see http/input-text.ts.
      const found: FieldIssue[] = parts.flatMap(([key]) => textProblems(key === 'body' ? req.body : req[key], key === 'body' ? '' : key));
      const textPaths = new Set(found.map((i) => i.path));
      for (const [key, schema] of parts) {
        if (!schema) continue;
        const raw = key === 'body' ? (req.body ?? {}) : req[key];
        const parsed = schema.safeParse(raw);
        if (parsed.success) writeBack(req, key, parsed.data);
        else found.push(...issues(parsed.error, key === 'body' ? '' : key).filter((i) => !textPaths.has(i.path)));
      }
      if (found.length) {
        const nf = found.find((i) => i.path.startsWith('params'));
        throw validationFailed(found, nf ? nf.message : 'The request has invalid fields.');
      }
      const run = async () => {
        const result = await handler({
          params: req.params as never,
          query: req.query as never,
          body: req.body as never,
          actor: (req.user ?? null) as never,
          requestId: idOf(req),
          req,
          res,
        });
        if (res.headersSent || result === undefined) return undefined;
        if (options.checkResponses && def.response.schema) {
          const check = def.response.schema.safeParse(result);
          if (!check.success) {
            req.log?.error({ endpoint: `${def.method.toUpperCase()} ${def.path}`, issues: check.error.issues }, 'response did not match its contract');
            throw new AppError('internal_error', 500, 'Response did not match its contract.', undefined);
          }
        }
        return result;
      };
      const status = def.status ?? 200;
      if (!key || !options.idempotency || !req.user) {
        const result = await run();
        if (result !== undefined) res.status(status).json(result);
        return;
      }
      // A create sent with an Idempotency-Key: the first answer is kept and a retry gets it again.
      const store = options.idempotency;
      const userId = req.user.id;
      const claim = await store.claim(userId, key, `${def.method.toUpperCase()} ${req.baseUrl}${req.path}`, bodyHash(rawBody));
      if (claim.kind === 'replay') {
        res.setHeader('Idempotent-Replayed', 'true');
        res.status(claim.status).json(claim.response);
        return;
      }
      let result: unknown;
      try {
        result = await run();
      } catch (err) {
        // A refusal or failure wrote nothing (services work in one transaction): the key is free again.
        await store.release(userId, key);
        throw err;
      }
      if (result === undefined) {
        await store.release(userId, key);
        return;
      }
      await store.settle(userId, key, status, result);
      res.status(status).json(result);
    });
  }
}
