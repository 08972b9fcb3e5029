import { vi } from 'vitest';

export interface RecordedRequest {
  method: string;
  url: string;
  path: string;
  search: URLSearchParams;
  body: unknown;
  headers: Record<string, string>;
}

type Handler = (request: RecordedRequest) => Response | Promise<Response>;

export function json(body: unknown, status = 200, headers: Record<string, string> = {}): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json', ...headers } });
}

export function errorResponse(status: number, code: string, message: string, extra: Record<string, unknown> = {}): Response {
  return json({ error: { code, message, status, requestId: 'req-test-1', ...extra } }, status);
}

/**
 * Replaces global fetch with a router of `"METHOD /path"` handlers; records every request.
 * An unmatched request fails the test loudly.
 */
export function mockFetch(handlers: Record<string, Handler>) {
  const requests: RecordedRequest[] = [];
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
    const url = typeof input === 'string' ? input : input instanceof URL ? input.href : input.url;
    const parsed = new URL(url, 'http://toneledger.test');
    const method = (init.method ?? 'GET').toUpperCase();
    const headers = Object.fromEntries(new Headers(init.headers).entries());
    const body = typeof init.body === 'string' ? JSON.parse(init.body) : undefined;
    const request: RecordedRequest = { method, url, path: parsed.pathname, search: parsed.searchParams, body, headers };
    requests.push(request);
    const handler = handlers[`${method} ${parsed.pathname}`];
    if (!handler) throw new Error(`Unexpected request in test: ${method} ${url}`);
    return handler(request);
  });
  vi.stubGlobal('fetch', fetchMock);
  return { requests, fetchMock };
}
