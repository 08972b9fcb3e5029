import { describe, expect, it } from 'vitest';
import { ApiError, apiRequest, requestData, requestPage, toQueryString } from '@/lib/api-client';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';

describe('toQueryString', () => {
  it('leaves out undefined, null and empty values and encodes the rest', () => {
    expect(toQueryString({ page: 2, q: 'iron blue & gold', role: undefined, actorId: null, action: '' })).toBe(
      '?page=2&q=iron+blue+%26+gold',
    );
  });

  it('is empty when nothing is left', () => {
    expect(toQueryString({ q: undefined })).toBe('');
    expect(toQueryString(undefined)).toBe('');
  });
});

describe('requestData / requestPage', () => {
  it('returns the data of a { data } envelope and sends JSON with same-origin credentials', async () => {
    const { requests, fetchMock } = mockFetch({
      'PATCH /api/users/u1/role': () => json({ data: { id: 'u1', role: 'viewer' } }),
    });
    const data = await requestData<{ id: string; role: string }>('/api/users/u1/role', {
      method: 'PATCH',
      body: { role: 'viewer' },
    });
    expect(data).toEqual({ id: 'u1', role: 'viewer' });
    expect(requests[0]?.body).toEqual({ role: 'viewer' });
    expect(requests[0]?.headers['content-type']).toBe('application/json');
    expect(fetchMock.mock.calls[0]?.[1]?.credentials).toBe('same-origin');
  });

  it('sends a FormData body as it is, leaving the multipart content type to the browser', async () => {
    const { fetchMock } = mockFetch({ 'POST /api/imports': () => json({ data: { id: 'job1' } }, 202) });
    const form = new FormData();
    form.append('file', new Blob(['accession_number\n'], { type: 'text/csv' }), 'prints.csv');
    const data = await requestData<{ id: string }>('/api/imports', { method: 'POST', body: form });
    expect(data).toEqual({ id: 'job1' });
    const init = fetchMock.mock.calls[0]?.[1];
    expect(init?.body).toBe(form);
    expect((init?.headers as Record<string, string>)['content-type']).toBeUndefined();
  });

  it('sends no content-type and no body on a GET', async () => {
    const { requests } = mockFetch({ 'GET /api/health': () => json({ data: { status: 'ok' } }) });
    await requestData('/api/health');
    expect(requests[0]?.headers['content-type']).toBeUndefined();
    expect(requests[0]?.body).toBeUndefined();
  });

  it('returns a page envelope with its pagination, passing the query through', async () => {
    const { requests } = mockFetch({
      'GET /api/users': () => json({ data: [{ id: 'a' }], pagination: { page: 3, pageSize: 25, total: 51 } }),
    });
    const page = await requestPage('/api/users', { query: { page: 3, pageSize: 25, sort: '-name' } });
    expect(page.pagination).toEqual({ page: 3, pageSize: 25, total: 51 });
    expect(page.data).toHaveLength(1);
    expect(requests[0]?.search.get('sort')).toBe('-name');
    expect(requests[0]?.search.get('page')).toBe('3');
  });

  it('rejects a list answer that has no pagination', async () => {
    mockFetch({ 'GET /api/users': () => json({ data: [] }) });
    await expect(requestPage('/api/users')).rejects.toMatchObject({ code: 'internal_error' });
  });
});

describe('error envelopes', () => {
  it('throws an ApiError carrying code, status, message and request id', async () => {
    mockFetch({
      'PATCH /api/users/u1/role': () =>
        errorResponse(409, 'conflict', 'At least one administrator must remain.', { requestId: 'req-42' }),
    });
    const error = await requestData('/api/users/u1/role', { method: 'PATCH', body: { role: 'viewer' } }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({
      code: 'conflict',
      status: 409,
      message: 'At least one administrator must remain.',
      requestId: 'req-42',
    });
  });

  it('exposes the field issues of a validation error', async () => {
    const details = [{ path: 'to', message: 'Enter an e-mail address', code: 'invalid_format' }];
    mockFetch({ 'POST /api/dev/mail/test': () => errorResponse(400, 'validation_failed', 'Check the form', { details }) });
    const error = (await apiRequest('/api/dev/mail/test', { method: 'POST', body: { to: 'x' } }).catch((e: unknown) => e)) as ApiError;
    expect(error.code).toBe('validation_failed');
    expect(error.details).toEqual(details);
    expect(error.fieldIssues).toEqual(details);
  });

  it('gives no field issues when details are absent or malformed', () => {
    expect(new ApiError({ code: 'conflict', status: 409, message: 'x' }).fieldIssues).toEqual([]);
    expect(new ApiError({ code: 'validation_failed', status: 400, message: 'x', details: { nope: 1 } }).fieldIssues).toEqual([]);
  });

  it('maps a non-envelope error answer to a code from its status, keeping the x-request-id header', async () => {
    mockFetch({
      'GET /api/me': () => new Response('<html>Bad gateway</html>', { status: 502, statusText: 'Bad Gateway', headers: { 'x-request-id': 'edge-7' } }),
      'GET /api/audit': () => new Response('', { status: 401 }),
    });
    await expect(requestData('/api/me')).rejects.toMatchObject({ code: 'internal_error', status: 502, requestId: 'edge-7' });
    await expect(requestData('/api/audit')).rejects.toMatchObject({ code: 'unauthenticated', status: 401, requestId: null });
  });

  it('turns a network failure into service_unavailable with status 0', async () => {
    mockFetch({
      'GET /api/me': () => {
        throw new TypeError('Failed to fetch');
      },
    });
    await expect(requestData('/api/me')).rejects.toMatchObject({ name: 'ApiError', code: 'service_unavailable', status: 0 });
  });

  it('rejects a successful answer that is not an envelope', async () => {
    mockFetch({ 'GET /api/me': () => new Response('<!doctype html><title>app</title>', { status: 200 }) });
    await expect(requestData('/api/me')).rejects.toMatchObject({ code: 'internal_error', status: 200 });
  });

  it('passes an abort through untouched', async () => {
    mockFetch({
      'GET /api/users': () => {
        throw new DOMException('aborted', 'AbortError');
      },
    });
    await expect(requestData('/api/users')).rejects.toMatchObject({ name: 'AbortError' });
  });
});
