import type { ErrorCode, FieldIssue } from '@toneledger/common/schemas/envelope';

/** A failure the client may see. Anything else becomes internal_error. */
export class AppError extends Error {
  constructor(
    readonly code: ErrorCode,
    readonly status: number,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'AppError';
  }
}

export const validationFailed = (issues: FieldIssue[], message = 'The request has invalid fields.') =>
  new AppError('validation_failed', 400, message, issues);
export const unauthenticated = (message = 'Sign in to continue.') => new AppError('unauthenticated', 401, message);
export const forbidden = (message = 'Your role does not allow this.') => new AppError('forbidden', 403, message);
export const notFound = (what = 'The resource') => new AppError('not_found', 404, `${what} was not found.`);
export const conflict = (message: string, details?: unknown) => new AppError('conflict', 409, message, details);
export const serviceUnavailable = (message: string) => new AppError('service_unavailable', 503, message);
