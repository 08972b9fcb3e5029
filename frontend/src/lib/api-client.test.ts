import { afterEach, describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import { endpoint } from '@toneledger/common/api/endpoint';
import { devMailApi } from '@toneledger/common/api/dev-mail';
import { imagesApi } from '@toneledger/common/api/images';
import { importsApi } from '@toneledger/common/api/imports';
import { printsApi } from '@toneledger/common/api/prints';
import { makersApi } from '@toneledger/common/api/reference';
import { fixityApi } from '@toneledger/common/api/images';
import { systemApi } from '@toneledger/common/api/system';
import { auditApi, meApi, usersApi } from '@toneledger/common/api/users';
import { dataEnvelope } from '@toneledger/common/schemas/envelope';
import { ApiError, call, callData, toQueryString, uploadWithProgress, urlOf } from '@/lib/api-client';
import { FakeXhr } from '@/test/fake-xhr';
import { errorResponse, json, mockFetch } from '@/test/fetch-mock';
import { makeMe, makeUser } from '@/test/fixtures';

const USER_ID = '5d0c0f5e-8a7b-4c2d-9e1f-112233445566';
const PRINT_ID = '11111111-2222-4333-8444-555555555555';

/** Test endpoints: a path parameter that is not an id, to see it encoded; a multipart upload with a small answer. */
const byName = endpoint({
  method: 'get', path: '/api/things/:name', summary: 'A thing by name', tags: ['test'], access: 'public',
  params: z.object({ name: z.string() }), response: { description: 'The thing', schema: dataEnvelope(z.object({ name: z.string() })) },
});
const uploadFile = endpoint({
  method: 'post', path: '/api/files', summary: 'Takes a file', tags: ['test'], access: 'public', requestContentType: 'multipart/form-data',
  status: 202, response: { description: 'Accepted', schema: dataEnvelope(z.object({ id: z.string() })) },
});

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

describe('urlOf', () => {
  it('puts each path parameter in its place, URL-encoded', () => {
    expect(urlOf(byName, { params: { name: 'a/b c?&' } })).toBe('/api/things/a%2Fb%20c%3F%26');
    expect(urlOf(imagesApi.file, { params: { id: PRINT_ID, variant: 'thumb' } })).toBe(`/api/images/${PRINT_ID}/file/thumb`);
  });

  it('adds the query without its empty values', () => {
    expect(urlOf(printsApi.exportCsv, { query: { q: 'harbour wall', sort: '-dateMade', tonerClass: undefined, locationId: '' } })).toBe(
      '/api/prints/export.csv?q=harbour+wall&sort=-dateMade',
    );
    expect(urlOf(printsApi.exportCsv, { query: {} })).toBe('/api/prints/export.csv');
    expect(urlOf(importsApi.template)).toBe('/api/imports/template.csv');
  });

  it('refuses to build a path with a parameter missing', () => {
    expect(() => urlOf(printsApi.exportJson, { params: { id: '' } })).toThrow(/Missing path parameter "id"/);
  });
});

describe('call / callData', () => {
  it('returns the data of a { data } envelope and sends JSON with same-origin credentials', async () => {
    const user = makeUser({ id: USER_ID, role: 'viewer' });
    const { requests, fetchMock } = mockFetch({ [`PATCH /api/users/${USER_ID}/role`]: () => json({ data: user }) });
    const data = await callData(usersApi.changeRole, { params: { id: USER_ID }, body: { role: 'viewer' } });
    expect(data).toEqual(user);
    expect(requests[0]?.method).toBe('PATCH');
    expect(requests[0]?.body).toEqual({ role: 'viewer' });
    expect(requests[0]?.headers['content-type']).toBe('application/json');
    expect(requests[0]?.headers.accept).toBe('application/json');
    expect(fetchMock.mock.calls[0]?.[1]?.credentials).toBe('same-origin');
  });

  it('builds the URL from the endpoint, its encoded params and its query', async () => {
    const { requests } = mockFetch({ 'GET /api/things/a%2Fb%20c': () => json({ data: { name: 'a/b c' } }) });
    expect(await callData(byName, { params: { name: 'a/b c' } })).toEqual({ name: 'a/b c' });
    expect(requests[0]?.url).toBe('/api/things/a%2Fb%20c');
  });

  it('sends a FormData body as it is, leaving the multipart content type to the browser', async () => {
    const { fetchMock } = mockFetch({ 'POST /api/files': () => json({ data: { id: 'job1' } }, 202) });
    const form = new FormData();
    form.append('file', new Blob(['accession_number\n'], { type: 'text/csv' }), 'prints.csv');
    expect(await callData(uploadFile, { body: form })).toEqual({ id: 'job1' });
    const init = fetchMock.mock.calls[0]?.[1];
    expect(init?.method).toBe('POST');
    expect(init?.body).toBe(form);
    expect((init?.headers as Record<string, string>)['content-type']).toBeUndefined();
  });

  it('sends no content-type and no body on a GET', async () => {
    const { requests } = mockFetch({ 'GET /api/me': () => json({ data: makeMe('viewer') }) });
    await callData(meApi.get);
    expect(requests[0]?.method).toBe('GET');
    expect(requests[0]?.headers['content-type']).toBeUndefined();
    expect(requests[0]?.body).toBeUndefined();
  });

  it('returns a page envelope with its pagination, passing the query through without empty values', async () => {
    const { requests } = mockFetch({
      'GET /api/users': () => json({ data: [makeUser()], pagination: { page: 3, pageSize: 25, total: 51 } }),
    });
    const page = await call(usersApi.list, { query: { page: 3, pageSize: 25, sort: '-name', q: '' } });
    expect(page.pagination).toEqual({ page: 3, pageSize: 25, total: 51 });
    expect(page.data).toHaveLength(1);
    expect(Object.fromEntries(requests[0]!.search)).toEqual({ page: '3', pageSize: '25', sort: '-name' });
  });

  it('rejects a list answer that has no pagination', async () => {
    mockFetch({ 'GET /api/users': () => json({ data: [] }) });
    await expect(call(usersApi.list, { query: {} })).rejects.toMatchObject({ name: 'ApiError', code: 'internal_error', status: 200 });
  });

  it('rejects an answer that does not match the endpoint’s response schema, keeping its request id', async () => {
    mockFetch({ 'GET /api/me': () => json({ data: { id: 'not-a-user' } }, 200, { 'x-request-id': 'req-drift' }) });
    const error = await callData(meApi.get).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({ code: 'internal_error', status: 200, requestId: 'req-drift', message: 'The server sent an answer this page cannot read.' });
  });

  it('rejects a successful answer that is not JSON at all', async () => {
    mockFetch({ 'GET /api/me': () => new Response('<!doctype html><title>app</title>', { status: 200 }) });
    await expect(callData(meApi.get)).rejects.toMatchObject({ code: 'internal_error', status: 200 });
  });

  it('returns an answer as it is when the endpoint has no envelope (the OpenAPI document)', async () => {
    mockFetch({ 'GET /api/openapi.json': () => json({ openapi: '3.1.0' }) });
    expect(await call(systemApi.openapi)).toEqual({ openapi: '3.1.0' });
  });
});

describe('Idempotency-Key', () => {
  const maker = { id: PRINT_ID, name: 'A. Maker', lifeDates: null, notes: null, printCount: 0, version: 1 };
  const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/;

  it('is sent on creates marked idempotent in the contract, a fresh one per request, and on nothing else', async () => {
    const { requests } = mockFetch({
      'POST /api/makers': () => json({ data: maker }, 201),
      [`POST /api/images/${PRINT_ID}/fixity`]: () => new Response('{}', { status: 500 }),
      [`PATCH /api/users/${USER_ID}/role`]: () => json({ data: makeUser({ id: USER_ID }) }),
    });
    await call(makersApi.create, { body: { name: 'A. Maker' } }).catch(() => undefined);
    await call(makersApi.create, { body: { name: 'A. Maker' } }).catch(() => undefined);
    await call(fixityApi.check, { params: { id: PRINT_ID }, body: {} }).catch(() => undefined);
    await call(usersApi.changeRole, { params: { id: USER_ID }, body: { role: 'viewer' } }).catch(() => undefined);
    expect(requests[0]?.headers['idempotency-key']).toMatch(UUID);
    // Both creates were answered: the second is a new request with a new key.
    expect(requests[1]?.headers['idempotency-key']).toMatch(UUID);
    expect(requests[1]?.headers['idempotency-key']).not.toBe(requests[0]?.headers['idempotency-key']);
    expect(requests[2]?.headers['idempotency-key']).toBeUndefined();
    expect(requests[3]?.headers['idempotency-key']).toBeUndefined();
  });

  it('keeps the key when a create got no answer, so sending it again unchanged is a retry; a changed body gets a new key', async () => {
    let drop = true;
    const { requests } = mockFetch({
      'POST /api/makers': () => {
        if (drop) throw new TypeError('Failed to fetch');
        return json({ data: maker }, 201);
      },
    });
    await expect(call(makersApi.create, { body: { name: 'A. Maker', notes: 'x' } })).rejects.toMatchObject({ status: 0 });
    await expect(call(makersApi.create, { body: { name: 'Another maker' } })).rejects.toMatchObject({ status: 0 });
    drop = false;
    // The same submission, keys in another order: the same request.
    await call(makersApi.create, { body: { notes: 'x', name: 'A. Maker' } });
    const keys = requests.map((r) => r.headers['idempotency-key']);
    expect(keys[2]).toBe(keys[0]);
    expect(keys[1]).not.toBe(keys[0]);
    // Answered now: the next create of the same body is a new request.
    await call(makersApi.create, { body: { name: 'A. Maker', notes: 'x' } });
    expect(requests[3]?.headers['idempotency-key']).not.toBe(keys[0]);
  });

  it('maps a 422 without an envelope to unprocessable', async () => {
    mockFetch({ 'POST /api/makers': () => new Response('', { status: 422 }) });
    await expect(call(makersApi.create, { body: { name: 'A. Maker' } })).rejects.toMatchObject({ code: 'unprocessable', status: 422 });
  });
});

describe('error envelopes', () => {
  it('throws an ApiError carrying code, status, message and request id', async () => {
    mockFetch({
      [`PATCH /api/users/${USER_ID}/role`]: () =>
        errorResponse(409, 'conflict', 'At least one administrator must remain.', { requestId: 'req-42' }),
    });
    const error = await callData(usersApi.changeRole, { params: { id: USER_ID }, body: { role: 'viewer' } }).catch((e: unknown) => e);
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
    const error = (await callData(devMailApi.sendTest, { body: { to: 'x' } }).catch((e: unknown) => e)) as ApiError;
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
    await expect(callData(meApi.get)).rejects.toMatchObject({ code: 'internal_error', status: 502, requestId: 'edge-7' });
    await expect(call(auditApi.list, { query: {} })).rejects.toMatchObject({ code: 'unauthenticated', status: 401, requestId: null });
  });

  it('turns a network failure into service_unavailable with status 0', async () => {
    mockFetch({
      'GET /api/me': () => {
        throw new TypeError('Failed to fetch');
      },
    });
    await expect(callData(meApi.get)).rejects.toMatchObject({ name: 'ApiError', code: 'service_unavailable', status: 0 });
  });

  it('passes an abort through untouched', async () => {
    mockFetch({
      'GET /api/users': () => {
        throw new DOMException('aborted', 'AbortError');
      },
    });
    await expect(call(usersApi.list, { query: {}, signal: new AbortController().signal })).rejects.toMatchObject({ name: 'AbortError' });
  });
});

describe('uploadWithProgress', () => {
  afterEach(() => {
    FakeXhr.sent = [];
  });

  const image = {
    id: 'b1111111-2222-4333-8444-555555555555', printId: PRINT_ID, viewType: 'recto', capturedOn: null, notes: null, fileName: 'recto.tif',
    contentType: 'image/tiff', sizeBytes: 1000, width: 40, height: 30, sha256: 'a'.repeat(64),
    exif: { capturedAt: null, make: null, model: null, lens: null, exposureTime: null, fNumber: null, iso: null, focalLength: null },
    derivatives: 'pending', urls: { thumb: null, screen: null, original: null }, lastFixity: null, uploadedAt: '2024-01-02T10:00:00.000Z',
    uploadedBy: null, withdrawn: null, version: 1,
  };

  function upload(signal?: AbortSignal) {
    vi.stubGlobal('XMLHttpRequest', FakeXhr);
    const form = new FormData();
    form.append('viewType', 'recto');
    const progress: number[] = [];
    const done = uploadWithProgress(imagesApi.upload, { params: { id: PRINT_ID }, body: form, signal }, (f) => progress.push(f));
    return { done, progress, form };
  }

  it('posts the form to the endpoint’s URL, reports progress and resolves with the parsed data', async () => {
    FakeXhr.answer = () => ({ status: 201, body: { data: image } });
    const { done, progress, form } = upload();
    expect(await done).toEqual(image);
    expect(progress).toEqual([0.4, 1]);
    const sent = FakeXhr.sent[0]!;
    expect(sent.method).toBe('POST');
    expect(sent.url).toBe(`/api/prints/${PRINT_ID}/images`);
    expect(sent.body).toBe(form);
    expect(sent.headers.accept).toBe('application/json');
  });

  it('rejects with an ApiError from the error envelope', async () => {
    FakeXhr.answer = () => ({
      status: 413,
      body: { error: { code: 'payload_too_large', message: 'Too large', status: 413, requestId: 'req-413' } },
    });
    await expect(upload().done).rejects.toMatchObject({ name: 'ApiError', code: 'payload_too_large', status: 413, requestId: 'req-413', message: 'Too large' });
  });

  it('maps an answer without an envelope to a code from its status', async () => {
    FakeXhr.answer = () => ({ status: 415, text: '<html>no</html>', requestId: 'edge-9' });
    await expect(upload().done).rejects.toMatchObject({ code: 'unsupported_media_type', status: 415, requestId: 'edge-9' });
  });

  it('rejects a successful answer that does not match the schema', async () => {
    FakeXhr.answer = () => ({ status: 201, body: { data: { id: 'x' } } });
    const { done, progress } = upload();
    await expect(done).rejects.toMatchObject({ code: 'internal_error', status: 201 });
    expect(progress).not.toContain(1);
  });

  it('turns a network failure into service_unavailable with status 0', async () => {
    FakeXhr.answer = () => 'network-error';
    await expect(upload().done).rejects.toMatchObject({ name: 'ApiError', code: 'service_unavailable', status: 0 });
  });

  it('aborts the request when its signal is aborted', async () => {
    FakeXhr.answer = () => ({ status: 201, body: { data: image } });
    const controller = new AbortController();
    const { done } = upload(controller.signal);
    controller.abort();
    await expect(done).rejects.toMatchObject({ name: 'AbortError' });
  });
});
