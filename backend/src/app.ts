import path from 'node:path';
import { existsSync } from 'node:fs';
import express, { type Express } from 'express';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import { stdSerializers, type Logger } from 'pino';
import type { AppDeps } from './deps';
import { requestId, idOf } from './middleware/request-id';
import { sameOriginWrites } from './middleware/same-origin';
import { apiNotFound, errorHandler } from './middleware/error-handler';
import { loadUser, sessionMiddleware } from './auth/session';
import { mount, type RouteDef } from './http/route';
import { openApiDocument } from './http/openapi';
import { pgIdempotencyStore } from './http/idempotency';
import { authRoutes } from './routes/auth/auth.routes';
import { meRoutes } from './routes/me/me.routes';
import { usersRoutes } from './routes/users/users.routes';
import { auditRoutes } from './routes/audit/audit.routes';
import { devMailRoutes } from './routes/dev-mail/dev-mail.routes';
import { systemRoutes } from './routes/system/system.routes';
import { printsRoutes } from './routes/prints/prints.routes';
import { bulkRoutes } from './routes/bulk/bulk.routes';
import { referenceRoutes } from './routes/reference/reference.routes';
import { settingsRoutes } from './routes/settings/settings.routes';
import { importsRoutes } from './routes/imports/imports.routes';
import { imagesRoutes } from './routes/images/images.routes';
import { iiifRoutes } from './routes/iiif/iiif.routes';
import { conditionRoutes } from './routes/condition/condition.routes';
import { measurementsRoutes } from './routes/measurements/measurements.routes';
import { exhibitionsRoutes } from './routes/exhibitions/exhibitions.routes';
import { lightRoutes } from './routes/light/light.routes';
import { loansRoutes } from './routes/loans/loans.routes';
import { climateRoutes } from './routes/climate/climate.routes';
import { remindersRoutes } from './routes/reminders/reminders.routes';
import { roundsRoutes, worklistRoutes } from './routes/inspections/rounds.routes';
import { scheduleRoutes } from './routes/inspections/schedule.routes';
import { researchRoutes } from './routes/research/research.routes';
import { proceduresRoutes } from './routes/procedures/procedures.routes';
import { exportsRoutes } from './routes/exports/exports.routes';
import { preservationRoutes } from './routes/preservation/preservation.routes';

/** Every route the app serves, in one list: Express mounts it and OpenAPI describes it. */
export function allRoutes(deps: AppDeps): RouteDef[] {
  const routes: RouteDef[] = [
    ...systemRoutes(deps, () => openApiDocument(routes, deps.version)),
    ...authRoutes(deps),
    ...meRoutes(deps),
    ...usersRoutes(),
    ...auditRoutes(),
    ...devMailRoutes(deps),
    ...printsRoutes(),
    ...bulkRoutes(),
    ...referenceRoutes(),
    ...settingsRoutes(),
    ...importsRoutes(deps),
    ...imagesRoutes(deps),
    ...iiifRoutes(deps),
    ...conditionRoutes(),
    ...proceduresRoutes(),
    ...measurementsRoutes(),
    ...exhibitionsRoutes(),
    ...lightRoutes(deps),
    ...loansRoutes(),
    ...climateRoutes(),
    ...remindersRoutes(deps),
    ...worklistRoutes(),
    ...roundsRoutes(),
    ...scheduleRoutes(deps),
    ...researchRoutes(),
    ...exportsRoutes(),
    ...preservationRoutes(deps),
  ];
  return routes;
}

const strictUtf8 = new TextDecoder('utf-8', { fatal: true });

/**
 * A JSON body must be UTF-8 (RFC 8259); bytes that are not would otherwise be read as U+FFFD and
 * stored without a word. Refused here, before parsing; the error handler answers 400.
 */
function refuseInvalidUtf8(_req: unknown, _res: unknown, buf: Buffer): void {
  try {
    strictUtf8.decode(buf);
  } catch {
    throw Object.assign(new Error('The request body is not valid UTF-8.'), { status: 400, type: 'entity.verify.failed', expose: true });
  }
}

export function buildApp(deps: AppDeps, logger: Logger): Express {
  const { env } = deps;
  const app = express();
  app.disable('x-powered-by');
  // No ETag on answers sent with res.send/res.json: every API answer is no-store, so nothing would
  // ever ask with If-None-Match, and hashing each body costs time on every request. Static files
  // (express.static, sendFile) keep their own validators.
  app.set('etag', false);
  app.set('trust proxy', env.TRUST_PROXY === 'false' ? false : env.TRUST_PROXY);
  app.set('query parser', 'extended');

  app.use(requestId);
  app.use(
    pinoHttp({
      logger,
      genReqId: (req) => idOf(req as express.Request),
      // One line per request: the request line and the answer's status. Headers are not written
      // (every answer carries the whole Content-Security-Policy; the cookie would be redacted
      // anyway): serialising them cost more than the rest of the line.
      wrapSerializers: false,
      serializers: {
        req: (req: express.Request) => ({ id: idOf(req), method: req.method, url: req.originalUrl ?? req.url, remoteAddress: req.socket?.remoteAddress }),
        res: (res: express.Response) => ({ statusCode: res.statusCode }),
        err: stdSerializers.err,
      },
      autoLogging: { ignore: (req) => req.url === '/api/health' || Boolean(req.url?.startsWith('/assets/')) },
      // Every request is logged in production; on a developer's terminal only refusals and failures.
      customLogLevel: (_req, res, err) =>
        err || res.statusCode >= 500 ? 'error' : res.statusCode >= 400 ? 'warn' : env.NODE_ENV === 'production' ? 'info' : 'debug',
    }),
  );

  const issuerOrigin = new URL(env.OIDC_ISSUER).origin;
  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          // The one hash is the empty text: the deep-zoom viewer puts an empty marked <style> in the page
          // so OpenSeadragon adds no inline styles of its own (features/condition/components/deep-zoom.tsx).
          styleSrc: ["'self'", "'sha256-47DEQpj8HBSa+/TImW+5JCeuQeRkm5NMpJWZG3hSuFU='"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'"],
          connectSrc: ["'self'"],
          objectSrc: ["'none'"],
          baseUri: ["'self'"],
          frameAncestors: ["'none'"],
          formAction: ["'self'", issuerOrigin],
          ...(env.PUBLIC_URL.startsWith('https://') ? { upgradeInsecureRequests: [] } : {}),
        },
      },
      strictTransportSecurity: env.PUBLIC_URL.startsWith('https://'),
    }),
  );

  // The built client: served before sessions and request logging, so assets never touch the session store.
  const staticDir = env.STATIC_DIR ?? path.resolve(import.meta.dirname, '../../frontend/dist');
  const hasClient = existsSync(path.join(staticDir, 'index.html'));
  if (hasClient) {
    app.use(
      '/assets',
      express.static(path.join(staticDir, 'assets'), { index: false, immutable: true, maxAge: '1y', fallthrough: false }),
    );
  }

  // Every answer under /api and /auth depends on the session (or says something about it): never
  // stored by a browser or a proxy. A route that may be cached (image bytes) sets its own header.
  app.use(['/api', '/auth'], (_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });

  app.use(express.json({ limit: '1mb', verify: refuseInvalidUtf8 }));
  app.use(sameOriginWrites([env.PUBLIC_URL, ...env.ALLOWED_ORIGINS]));
  app.use(sessionMiddleware(env, deps.pool));
  app.use(loadUser(env, deps.pool));

  const router = express.Router();
  mount(router, allRoutes(deps), { checkResponses: env.NODE_ENV !== 'production', idempotency: pgIdempotencyStore(deps.pool) });
  app.use(router);
  app.use('/api', apiNotFound);
  app.use('/auth', apiNotFound);
  if (hasClient) {
    // Every other GET is a client route: the app shell decides what to show (including not-found).
    app.get('/{*splat}', (_req, res) => {
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(path.join(staticDir, 'index.html'));
    });
  }

  app.use(errorHandler);
  return app;
}
