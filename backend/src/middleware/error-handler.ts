import type { NextFunction, Request, Response } from 'express';
import type { ErrorEnvelope } from '@toneledger/common/schemas/envelope';
import { AppError, DATABASE_RETRY_AFTER_S, databaseUnavailable, isDatabaseUnavailable } from '../errors';
import { idOf } from './request-id';

interface HttpishError {
  type?: string;
  status?: number;
  statusCode?: number;
  expose?: boolean;
}

/** Errors from body parsers and other libraries that carry a client status. */
function fromLibrary(err: HttpishError): AppError | null {
  const status = err.status ?? err.statusCode;
  if (!status || status >= 500) return null;
  switch (err.type) {
    case 'entity.too.large':
      return new AppError('payload_too_large', 413, 'The request body is too large.');
    case 'entity.parse.failed':
      return new AppError('validation_failed', 400, 'The request body is not valid JSON.', []);
    case 'entity.verify.failed':
      // The JSON parser's verify step (app.ts) refuses a body that is not valid UTF-8.
      return new AppError('validation_failed', 400, 'The request body is not valid UTF-8 text; send it as UTF-8.', []);
    case 'charset.unsupported':
    case 'encoding.unsupported':
      return new AppError('unsupported_media_type', 415, 'The request body encoding is not supported.');
    default:
      if (status === 413) return new AppError('payload_too_large', 413, 'The request body is too large.');
      if (status === 415) return new AppError('unsupported_media_type', 415, 'This content type is not accepted.');
      if (status === 404) return new AppError('not_found', 404, 'Not found.');
      return new AppError('validation_failed', 400, 'The request could not be read.', []);
  }
}

export function envelopeFor(err: AppError, requestId: string): ErrorEnvelope {
  return {
    error: {
      code: err.code,
      message: err.message,
      status: err.status,
      requestId,
      ...(err.details !== undefined ? { details: err.details } : {}),
    },
  };
}

export function errorHandler(err: unknown, req: Request, res: Response, _next: NextFunction): void {
  // The database stopped or restarting (from a query, the session store or the job queue): 503, not 500.
  const down = !(err instanceof AppError) && isDatabaseUnavailable(err);
  const known = err instanceof AppError ? err : down ? databaseUnavailable() : fromLibrary(err as HttpishError);
  const appErr = known ?? new AppError('internal_error', 500, 'Something went wrong on the server. The request id identifies it in the log.');
  if (down) {
    req.log?.warn({ err }, 'request failed: the database cannot be reached');
    if (!res.headersSent) res.setHeader('Retry-After', String(DATABASE_RETRY_AFTER_S));
  } else if (!known || appErr.status >= 500) {
    req.log?.error({ err }, 'request failed');
  } else {
    req.log?.info({ code: appErr.code, status: appErr.status }, 'request refused');
  }
  if (res.headersSent) return;
  res.status(appErr.status).json(envelopeFor(appErr, idOf(req)));
}

export function apiNotFound(req: Request, _res: Response, next: NextFunction): void {
  next(new AppError('not_found', 404, `No API route for ${req.method} ${req.path}.`));
}
