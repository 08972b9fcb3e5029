import { z } from 'zod';
import {
  pathOf, type BodyIn, type DataOf, type Endpoint, type ParamsIn, type QueryIn, type ResponseOf,
} from '@toneledger/common/api/endpoint';
import {
  ERROR_CODES,
  errorEnvelopeSchema,
  fieldIssueSchema,
  type ErrorCode,
  type FieldIssue,
} from '@toneledger/common/schemas/envelope';

/** A failed request, carrying the server's error envelope. */
export class ApiError extends Error {
  readonly code: ErrorCode;
  readonly status: number;
  readonly requestId: string | null;
  readonly details: unknown;

  constructor(init: { code: ErrorCode; status: number; message: string; requestId?: string | null; details?: unknown }) {
    super(init.message);
    this.name = 'ApiError';
    this.code = init.code;
    this.status = init.status;
    this.requestId = init.requestId ?? null;
    this.details = init.details;
  }

  /** The per-field problems of a `validation_failed` error; empty for any other error. */
  get fieldIssues(): FieldIssue[] {
    const parsed = z.array(fieldIssueSchema).safeParse(this.details);
    return parsed.success ? parsed.data : [];
  }
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}

export type QueryValue = string | number | boolean | null | undefined;

/** Builds `?a=1&b=x` from an object, leaving out empty values. Returns '' when nothing is left. */
export function toQueryString(query: Record<string, QueryValue> | undefined): string {
  if (!query) return '';
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) {
    if (value === undefined || value === null || value === '') continue;
    params.set(key, String(value));
  }
  const text = params.toString();
  return text ? `?${text}` : '';
}

const METHODS = { get: 'GET', post: 'POST', put: 'PUT', patch: 'PATCH', delete: 'DELETE' } as const;

interface RequestOptions {
  method: (typeof METHODS)[Endpoint['method']];
  query?: Record<string, QueryValue>;
  /** Sent as JSON, or as multipart/form-data when it is a FormData (file uploads). */
  body?: unknown;
  signal?: AbortSignal;
  /** Sent as the `Idempotency-Key` header (creates marked `idempotent` in the contract). */
  idempotencyKey?: string;
}

const STATUS_CODES: Record<number, ErrorCode> = {
  400: 'validation_failed',
  401: 'unauthenticated',
  403: 'forbidden',
  404: 'not_found',
  409: 'conflict',
  422: 'unprocessable',
  413: 'payload_too_large',
  415: 'unsupported_media_type',
  503: 'service_unavailable',
};

function parseJson(text: string): unknown {
  if (!text) return undefined;
  try {
    return JSON.parse(text);
  } catch {
    return undefined;
  }
}

/** A failed answer as an ApiError: from the server's error envelope, or, when there is none, from the HTTP status. */
function errorFrom(json: unknown, status: number, statusText: string, requestId: string | null): ApiError {
  const envelope = errorEnvelopeSchema.safeParse(json);
  if (envelope.success) {
    const { code, status: envelopeStatus, message, requestId: envelopeRequestId, details } = envelope.data.error;
    return new ApiError({ code, status: envelopeStatus, message, requestId: envelopeRequestId, details });
  }
  return new ApiError({
    code: STATUS_CODES[status] ?? 'internal_error',
    status,
    message: `The server answered ${status}${statusText ? ` ${statusText}` : ''}.`,
    requestId,
  });
}

const unreachable = () =>
  new ApiError({ code: 'service_unavailable', status: 0, message: 'Could not reach the server. Check the connection and try again.' });

const unreadable = (status: number, requestId: string | null) =>
  new ApiError({ code: 'internal_error', status, message: 'The server sent an answer this page cannot read.', requestId });

/**
 * Sends a request to our own server and returns its JSON answer (undefined when there is none) with
 * its status and request id. Any non-2xx answer becomes an ApiError; so does a failure to reach the server.
 */
async function send(path: string, options: RequestOptions): Promise<{ json: unknown; status: number; requestId: string | null }> {
  const { method, query, body, signal, idempotencyKey } = options;
  const headers: Record<string, string> = { accept: 'application/json' };
  if (idempotencyKey) headers['idempotency-key'] = idempotencyKey;
  const isForm = typeof FormData !== 'undefined' && body instanceof FormData;
  // The browser sets a multipart content type, with its boundary, for a FormData body.
  if (body !== undefined && !isForm) headers['content-type'] = 'application/json';

  let response: Response;
  try {
    response = await fetch(`${path}${toQueryString(query)}`, {
      method,
      headers,
      body: body === undefined ? undefined : isForm ? (body as FormData) : JSON.stringify(body),
      credentials: 'same-origin',
      signal,
    });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw unreachable();
  }

  const json = parseJson(await response.text());
  const requestId = response.headers.get('x-request-id');
  if (!response.ok) throw errorFrom(json, response.status, response.statusText, requestId);
  return { json, status: response.status, requestId };
}

export { ERROR_CODES };

/** What a call sends: the endpoint's own params, query and body types (params and body required when it has them). */
export type CallInput<E extends Endpoint> = (ParamsIn<E> extends undefined ? { params?: undefined } : { params: ParamsIn<E> }) &
  (QueryIn<E> extends undefined ? { query?: undefined } : { query?: QueryIn<E> }) &
  (BodyIn<E> extends undefined ? { body?: undefined } : { body: BodyIn<E> }) & { signal?: AbortSignal };

type OptionalIfEmpty<E extends Endpoint> = ParamsIn<E> extends undefined ? (BodyIn<E> extends undefined ? [input?: CallInput<E>] : [input: CallInput<E>]) : [input: CallInput<E>];

/** The URL of an endpoint with its params and query (for links and downloads: CSV, JSON files, image bytes). */
export function urlOf<E extends Endpoint>(e: E, input: { params?: ParamsIn<E>; query?: QueryIn<E> } = {}): string {
  return `${pathOf(e, input.params as Record<string, unknown> | undefined)}${toQueryString(input.query as Record<string, QueryValue> | undefined)}`;
}

/**
 * The success answer checked against the endpoint's response schema: a drifted answer (or a page
 * that is not JSON at all) is an error, never a wrong screen.
 */
function parseAnswer<E extends Endpoint>(e: E, json: unknown, status: number, requestId: string | null): ResponseOf<E> {
  const schema = e.response.schema;
  if (!schema) return json as ResponseOf<E>;
  const parsed = schema.safeParse(json);
  if (!parsed.success) throw unreadable(status, requestId);
  return parsed.data as ResponseOf<E>;
}

/**
 * Idempotency keys of creates whose outcome is unknown, by request (method, path, canonical body).
 * A create marked `idempotent` gets a fresh key (crypto.randomUUID); when it gets no answer (the
 * connection dropped, a gateway timed out) or the server is still handling it, the key is kept, so
 * sending the same request again (the person presses Save again on the unchanged form) carries the
 * same key and the server answers with the first result instead of a second record. Any answer
 * ends the key; a changed form is a different request and gets a new one.
 */
const pendingKeys = new Map<string, string>();

function canonical(value: unknown): string {
  if (value === null || typeof value !== 'object') return JSON.stringify(value) ?? 'null';
  if (Array.isArray(value)) return `[${value.map(canonical).join(',')}]`;
  const entries = Object.entries(value as Record<string, unknown>).filter(([, v]) => v !== undefined).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonical(v)}`).join(',')}}`;
}

/** The outcome of a create is still unknown after this error: keep its key for a retry. */
function outcomeUnknown(error: unknown): boolean {
  if (!isApiError(error)) return false;
  if (error.status === 0 || error.status >= 502) return true;
  return error.status === 409 && (error.details as { idempotency?: string } | undefined)?.idempotency === 'in_progress';
}

/**
 * Calls an endpoint of the contract by name: builds the URL from its path and params, sends the
 * query and body, and returns the envelope parsed with its response schema. Errors are ApiErrors.
 * A create marked `idempotent` carries an `Idempotency-Key` (see `pendingKeys`).
 */
export async function call<E extends Endpoint>(e: E, ...[input]: OptionalIfEmpty<E>): Promise<ResponseOf<E>> {
  const { params, query, body, signal } = (input ?? {}) as { params?: Record<string, unknown>; query?: Record<string, QueryValue>; body?: unknown; signal?: AbortSignal };
  const path = pathOf(e, params);
  const request = e.idempotent ? `${e.method} ${path} ${canonical(body ?? {})}` : null;
  const idempotencyKey = request ? (pendingKeys.get(request) ?? crypto.randomUUID()) : undefined;
  if (request && idempotencyKey) pendingKeys.set(request, idempotencyKey);
  try {
    const { json, status, requestId } = await send(path, { method: METHODS[e.method], query, body, signal, idempotencyKey });
    if (request) pendingKeys.delete(request);
    return parseAnswer(e, json, status, requestId);
  } catch (error) {
    if (request && !outcomeUnknown(error)) pendingKeys.delete(request);
    throw error;
  }
}

/** `call`, returning the `data` of the envelope. */
export async function callData<E extends Endpoint>(e: E, ...args: OptionalIfEmpty<E>): Promise<DataOf<E>> {
  const envelope = (await call(e, ...args)) as { data: DataOf<E> };
  return envelope.data;
}

/**
 * A multipart upload with progress (XMLHttpRequest: fetch does not report upload progress). Resolves
 * with the `data` of the answer; rejects with an ApiError from the error envelope or the HTTP status.
 */
export function uploadWithProgress<E extends Endpoint & { requestContentType: 'multipart/form-data' }>(
  e: E,
  input: Pick<CallInput<E>, 'params'> & { body: FormData; signal?: AbortSignal },
  onProgress?: (fraction: number) => void,
): Promise<DataOf<E>> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open(METHODS[e.method], pathOf(e, input.params as Record<string, unknown> | undefined));
    xhr.setRequestHeader('accept', 'application/json');
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable && event.total > 0) onProgress?.(event.loaded / event.total);
    };
    xhr.onload = () => {
      const json = parseJson(xhr.responseText);
      if (xhr.status < 200 || xhr.status >= 300) {
        reject(errorFrom(json, xhr.status, xhr.statusText, xhr.getResponseHeader('x-request-id')));
        return;
      }
      try {
        const data = (parseAnswer(e, json, xhr.status, xhr.getResponseHeader('x-request-id')) as { data: DataOf<E> }).data;
        onProgress?.(1);
        resolve(data);
      } catch (err) {
        reject(err);
      }
    };
    xhr.onerror = () => reject(unreachable());
    xhr.onabort = () => reject(new DOMException('The upload was cancelled.', 'AbortError'));
    input.signal?.addEventListener('abort', () => xhr.abort(), { once: true });
    xhr.send(input.body);
  });
}

/**
 * Calls an endpoint that answers with a file (a POST whose body says what to put in it, e.g. a data
 * package zip): the bytes as a Blob and the file name from Content-Disposition. Errors are ApiErrors.
 */
export async function callFile<E extends Endpoint>(e: E, ...[input]: OptionalIfEmpty<E>): Promise<{ blob: Blob; fileName: string | null }> {
  const { params, body, signal } = (input ?? {}) as { params?: Record<string, unknown>; body?: unknown; signal?: AbortSignal };
  let response: Response;
  try {
    response = await fetch(pathOf(e, params), {
      method: METHODS[e.method],
      headers: { accept: e.response.contentType ?? '*/*', ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
      body: body === undefined ? undefined : JSON.stringify(body),
      credentials: 'same-origin',
      signal,
    });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw unreachable();
  }
  const requestId = response.headers.get('x-request-id');
  if (!response.ok) throw errorFrom(parseJson(await response.text()), response.status, response.statusText, requestId);
  const disposition = response.headers.get('content-disposition') ?? '';
  const fileName = /filename="?([^";]+)"?/i.exec(disposition)?.[1] ?? null;
  return { blob: await response.blob(), fileName };
}
