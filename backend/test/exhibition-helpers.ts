import supertest from 'supertest';
import { expect } from 'vitest';
import { ROLES, type Role } from '@toneledger/common/domain/roles';
import { sessionFor, type TestApp } from './app';
import { accession } from './factories';

/** Signed-in callers for every role, and small helpers for exhibitions and display periods. */
export async function exhibitionClient(t: TestApp) {
  const c = {} as Record<Role, string>;
  for (const r of ROLES) c[r] = await sessionFor(t.app, r);
  const as = (who: Role | null) => {
    const withCookie = (r: supertest.Test) => (who ? r.set('Cookie', c[who]) : r);
    return {
      get: (url: string) => withCookie(supertest(t.app).get(url)),
      post: (url: string, body?: object) => withCookie(supertest(t.app).post(url).set('Origin', t.origin)).send(body ?? {}),
      patch: (url: string, body: object) => withCookie(supertest(t.app).patch(url).set('Origin', t.origin)).send(body),
      put: (url: string, body: object) => withCookie(supertest(t.app).put(url).set('Origin', t.origin)).send(body),
      delete: (url: string) => withCookie(supertest(t.app).delete(url).set('Origin', t.origin)),
    };
  };

  async function newPrint(process = 'gelatin_silver_developing_out', title = 'Quay lamps in fog') {
    const res = await as('registrar').post('/api/prints', { accessionNumber: accession(), title, process });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body.data as { id: string; version: number; accessionNumber: string };
  }

  async function newExhibition(venues: { name: string; opensOn: string; closesOn: string; place?: string }[], title = `Calder Reach rooms ${Math.random().toString(36).slice(2, 7)}`) {
    const res = await as('registrar').post('/api/exhibitions', { title, organiser: 'Calder Reach Collection', venues });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body.data as { id: string; version: number; title: string; venues: { id: string; name: string }[] };
  }

  async function addObjects(exhibition: { id: string }, printIds: string[]) {
    const current = (await as('registrar').get(`/api/exhibitions/${exhibition.id}`)).body.data;
    const res = await as('registrar').post(`/api/exhibitions/${exhibition.id}/objects`, { printIds, version: current.version });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    return res.body.data;
  }

  async function display(exhibitionId: string, body: Record<string, unknown>, who: Role = 'registrar') {
    const res = await as(who).post(`/api/exhibitions/${exhibitionId}/displays`, body);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body.data as { id: string; version: number; luxHours: number };
  }

  return { c, as, newPrint, newExhibition, addObjects, display };
}

export const paths = (res: { body: { error: { details?: { path: string }[] } } }) => (res.body.error.details ?? []).map((d) => d.path);

/** 'YYYY-MM-DD' n days from today (UTC). */
export function daysFromToday(n: number): string {
  return new Date(Date.now() + n * 86_400_000).toISOString().slice(0, 10);
}
