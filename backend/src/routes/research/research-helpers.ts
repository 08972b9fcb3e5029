import supertest from 'supertest';
import { expect } from 'vitest';
import { ROLES, type Role } from '@toneledger/common/domain/roles';
import { sessionFor, type TestApp } from '../../../test/app';
import { QueryTypes } from 'sequelize';
import { db } from '../../db';
import { settleSchedules } from '../../services/schedule-jobs';

/** Test helpers for the research API: callers per role and a small cohort made through the API (prints, signed reports, measurement sessions). */
export function researchClient(t: TestApp) {
  const c = {} as Record<Role, string>;
  const api = (who: Role | null) => {
    const withCookie = <R extends supertest.Test>(r: R) => (who ? r.set('Cookie', c[who]) : r);
    return {
      get: (url: string) => withCookie(supertest(t.app).get(url)),
      post: (url: string, body: object = {}) => withCookie(supertest(t.app).post(url).set('Origin', t.origin)).send(body),
      put: (url: string, body: object) => withCookie(supertest(t.app).put(url).set('Origin', t.origin)).send(body),
      patch: (url: string, body: object) => withCookie(supertest(t.app).patch(url).set('Origin', t.origin)).send(body),
      delete: (url: string) => withCookie(supertest(t.app).delete(url).set('Origin', t.origin)),
    };
  };
  const signInAll = async () => { for (const r of ROLES) c[r] = await sessionFor(t.app, r); };

  async function newPrint(accessionNumber: string, locationId: string, extra: Record<string, unknown> = {}) {
    const res = await api('registrar').post('/api/prints', { accessionNumber, title: `Estuary study ${accessionNumber}`, process: 'gelatin_silver_developing_out', locationId, ...extra });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body.data as { id: string; accessionNumber: string };
  }

  /** A process step written straight to the table (the catalogue's own tests cover the steps API). */
  async function addStep(printId: string, position: number, type: string, extra: { alkaline?: boolean | null; tonerClass?: string; timeSeconds?: number } = {}) {
    await db().query(
      'INSERT INTO process_steps (print_id, position, type, alkaline, toner_class, time_seconds) VALUES ($1, $2, $3, $4, $5, $6)',
      { bind: [printId, position, type, extra.alkaline ?? null, extra.tonerClass ?? null, extra.timeSeconds ?? null] },
    );
  }

  /** A signed report examined on `on`, graded, with the given terms observed. */
  async function signedReport(printId: string, on: string, grade: string, terms: string[] = []) {
    const observations = terms.map((termCode) => ({ termCode, side: 'recto', area: 'image', extent: 'localised', severity: 'slight' }));
    const draft = await api('conservator').post(`/api/prints/${printId}/condition-reports`, { examinedOn: on, context: 'routine', grade, observations });
    expect(draft.status, JSON.stringify(draft.body)).toBe(201);
    const signed = await api('conservator').post(`/api/condition-reports/${draft.body.data.id}/sign`, { version: draft.body.data.version });
    expect(signed.status, JSON.stringify(signed.body)).toBe(200);
  }

  async function newSpot(printId: string, name: string, purpose: string) {
    const res = await api('conservator').post(`/api/prints/${printId}/measurement-spots`, { name, purpose });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body.data as { id: string };
  }

  async function session(printId: string, measuredOn: string, readings: { spotId: string; lab: { L: number; a: number; b: number }; density?: number }[]) {
    const res = await api('conservator').post(`/api/prints/${printId}/measurement-sessions`, {
      measuredOn, instrument: 'Spectrodensitometer, 4 mm aperture', illuminant: 'D50', observer: '2', geometry: '45/0', condition: 'M1',
      readings: readings.map((r) => ({ spotId: r.spotId, readings: [r.lab], ...(r.density !== undefined ? { density: r.density, densityType: 'visual' } : {}) })),
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
  }

  return { c, api, signInAll, newPrint, addStep, signedReport, newSpot, session };
}

/**
 * Waits until none of these prints is marked stale. `settleSchedules` waits for this process's work
 * only: another test file's app on the same database may have taken some of the marks (SKIP LOCKED)
 * and not yet committed; the marks go with its commit, and the outcomes with them.
 */
export async function settleOutcomes(printIds: string[]): Promise<void> {
  for (let i = 0; i < 600; i += 1) {
    await settleSchedules();
    const [{ n }] = await db().query<{ n: number }>('SELECT count(*)::int AS n FROM schedule_stale WHERE print_id = ANY ($1::uuid[])', { bind: [printIds], type: QueryTypes.SELECT });
    if (n === 0) return;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error('the stale marks of the test prints were not worked off within a minute');
}

export const paths = (res: { body: { error?: { details?: { path: string }[] } } }) => (res.body.error?.details ?? []).map((d) => d.path);
