import type { Request, RequestHandler, Response, Router } from 'express';
import { z } from 'zod';
import { can, type Permission } from '@toneledger/common/domain/roles';
import { forbidden, unauthenticated, validationFailed, AppError } from '../errors';
import type { CurrentUser } from '../auth/current-user';

/** Who may call a route: anyone, any signed-in user, or holders of one permission. */
export type Access = 'public' | 'signed_in' | Permission;

type AnyObject = z.ZodType<Record<string, unknown>>;

export interface RouteResponse {
  description: string;
  schema?: z.ZodType;
  contentType?: string;
}

export interface RouteInput<P, Q, B> {
  params: P;
  query: Q;
  body: B;
  user: CurrentUser | null;
  req: Request;
  res: Response;
}

export interface RouteDef<P = any, Q = any, B = any> {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  path: string;
  summary: string;
  tags: string[];
  access: Access;
  params?: z.ZodType<P>;
  query?: z.ZodType<Q>;
  body?: z.ZodType<B>;
  /** The success status and its body schema; other statuses are added from the access rule and inputs. */
  status?: number;
  response?: RouteResponse;
  /** Express middleware run after the access check and before validation (e.g. multer for uploads). */
  before?: RequestHandler[];
  /** Request body types other than JSON, for the OpenAPI document. */
  requestContentType?: string;
  /** Returns the body to send as JSON with `status`; return undefined when the handler answered itself. */
  handler: (input: RouteInput<P, Q, B>) => Promise<unknown> | unknown;
}

/** Typed identity helper so each route file gets inference for its handler. */
export function route<P = Record<string, never>, Q = Record<string, never>, B = undefined>(
  def: RouteDef<P, Q, B>,
): RouteDef<P, Q, B> {
  return def;
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
}

export function mount(router: Router, defs: RouteDef[], options: MountOptions): void {
  for (const def of defs) {
    const access: RequestHandler = (req, _res, next) => {
      checkAccess(def.access, req.user ?? null);
      next();
    };
    router[def.method](def.path, access, ...(def.before ?? []), async (req: Request, res: Response) => {
      const user = req.user ?? null;
      const parts = [
        ['params', def.params],
        ['query', def.query],
        ['body', def.body],
      ] as const;
      const found: ReturnType<typeof issues> = [];
      for (const [key, schema] of parts) {
        if (!schema) continue;
        const raw = key === 'body' ? (req.body ?? {}) : req[key];
        const parsed = schema.safeParse(raw);
        if (parsed.success) writeBack(req, key, parsed.data);
        else found.push(...issues(parsed.error, key === 'body' ? '' : key));
      }
      if (found.length) {
        const nf = found.find((i) => i.path.startsWith('params'));
        throw validationFailed(found, nf ? nf.message : 'The request has invalid fields.');
      }
      const result = await def.handler({
        params: req.params as never,
        query: req.query as never,
        body: req.body as never,
        user,
        req,
        res,
      });
      if (res.headersSent || result === undefined) return;
      if (options.checkResponses && def.response?.schema) {
        const check = def.response.schema.safeParse(result);
        if (!check.success) {
          throw new AppError('internal_error', 500, 'Response did not match its contract.', undefined);
        }
      }
      res.status(def.status ?? 200).json(result);
    });
  }
}

export type { AnyObject };
