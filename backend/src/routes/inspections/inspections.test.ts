import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { QueryTypes } from 'sequelize';
import { ROLES, type Role } from '@toneledger/common/domain/roles';
import { DEMO_ACCOUNTS } from '../../seed/demo-accounts';
import { testApp, sessionFor } from '../../../test/app';
import { createLocation } from '../../../test/factories';
import { db } from '../../db';
import { settleSchedules } from '../../services/schedule-jobs';

const t = testApp();
const c = {} as Record<Role, string>;

const api = (who: Role | null) => {
  const withCookie = <R extends supertest.Test>(r: R) => (who ? r.set('Cookie', c[who]) : r);
  return {
    get: (url: string) => withCookie(supertest(t.app).get(url)),
    post: (url: string, body: object = {}, key?: string) => {
      const r = withCookie(supertest(t.app).post(url).set('Origin', t.origin));
      return (key ? r.set('Idempotency-Key', key) : r).send(body);
    },
    patch: (url: string, body: object) => withCookie(supertest(t.app).patch(url).set('Origin', t.origin)).send(body),
  };
};

const paths = (res: { body: { error: { details?: { path: string }[] } } }) => (res.body.error.details ?? []).map((d) => d.path);
const UNKNOWN = '00000000-0000-4000-8000-00000000000f';
/** A calendar day n days from today (UTC), the server's reference for the windows. */
const day = (n: number) => new Date(Date.now() + n * 86_400_000).toISOString().slice(0, 10);

// One accession base per run; the numbers 2 and 10 check natural order (common practice: 2 before 10).
const base = `2098.${Date.now() % 100000}`;
let building: string; let aisle: string; let bay: string; let elsewhere: string;
const p: Record<string, { id: string; accessionNumber: string }> = {};
let conservatorId: string;
let registrarId: string;

async function newPrint(n: number, locationId: string) {
  const res = await api('registrar').post('/api/prints', {
    accessionNumber: `${base}.${n}`, title: `Harbour study ${n}`, process: 'gelatin_silver_developing_out', locationId,
  });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.data as { id: string; accessionNumber: string };
}

/** The schedule rows of the test, as the risk model would write them: due in n days, risk, reasons, main factor's words. */
const ROWS: [key: string, dueIn: number, risk: string, rank: number, reasons: string[], text: string][] = [
  ['a', -10, 'urgent', 4, ['condition', 'never_checked'], 'graded poor at the last check'],
  ['b', 10, 'high', 3, ['light'], 'on display for 90 days this year'],
  ['c', 60, 'moderate', 2, ['climate'], 'store room RH above 60% for weeks'],
  ['d', 200, 'low', 1, ['vulnerable_process'], 'selenium-toned print'],
  ['e', -1, 'high', 3, ['light'], 'lent twice in three years'],
  ['f', -5, 'urgent', 4, ['fading'], 'fading 0.6 ΔE00 a year'],
];

/**
 * Writes the rows straight to the table once the schedule work has settled (creating a print or
 * signing a report makes the risk model recompute its row), so the figures are the test's own.
 */
async function pinSchedules() {
  await settleSchedules();
  for (const [key, dueIn, risk, rank, reasons, text] of ROWS) {
    await db().query(
      `INSERT INTO print_schedules (print_id, computed_due_on, due_on, interval_months, risk, risk_rank, factors, reasons, main_reason, last_checked_on)
       VALUES ($1, $2, $2, 12, $3, $4, $5::jsonb, $6::text[], $7, NULL)
       ON CONFLICT (print_id) DO UPDATE SET computed_due_on = EXCLUDED.computed_due_on, due_on = EXCLUDED.due_on, risk = EXCLUDED.risk,
         risk_rank = EXCLUDED.risk_rank, factors = EXCLUDED.factors, reasons = EXCLUDED.reasons, main_reason = EXCLUDED.main_reason,
         last_checked_on = NULL, override_due_on = NULL`,
      { bind: [p[key]!.id, day(dueIn), risk, rank, JSON.stringify([{ code: reasons[0], text, months: -6, dueBy: null }]), reasons, text] },
    );
  }
}

beforeAll(async () => {
  for (const r of ROLES) c[r] = await sessionFor(t.app, r);
  const b = await createLocation(`Inspection wing ${base}`);
  const a = await createLocation('Aisle store', b);
  const y = await createLocation('Bay store', b);
  building = b.id; aisle = a.id; bay = y.id; elsewhere = (await createLocation(`Annexe ${base}`)).id;
  // a..d in the aisle (accession .10, .2, .3, .4), e in the bay, f in another building.
  p.a = await newPrint(10, aisle); p.b = await newPrint(2, aisle); p.c = await newPrint(3, aisle); p.d = await newPrint(4, aisle);
  p.e = await newPrint(5, bay); p.f = await newPrint(6, elsewhere);
  await pinSchedules();
  const users = await db().query<{ id: string; email: string }>('SELECT id, email FROM users WHERE email = ANY($1)', {
    bind: [DEMO_ACCOUNTS.map((d) => d.email)], type: QueryTypes.SELECT,
  });
  const idOf = (role: Role) => users.find((u) => u.email === DEMO_ACCOUNTS.find((d) => d.role === role)!.email)!.id;
  conservatorId = idOf('conservator'); registrarId = idOf('registrar');
});
afterAll(() => t.close());

const list = async (query: string, who: Role = 'conservator') => {
  const res = await api(who).get(`/api/inspections?locationId=${building}&${query}`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as { data: { printId: string; overdueDays: number; risk: string; round: { title: string } | null; locationLabel: string | null; mainReason: string; reasons: string[] }[];
    pagination: { total: number }; counts: { overdue: number; within30: number; within90: number; total: number } };
};
const ids = (body: { data: { printId: string }[] }) => body.data.map((r) => r.printId);
const of = (...keys: string[]) => keys.map((k) => p[k].id);

describe('work list', () => {
  it('windows count from today within the place and its sub-places; the page total is the window\'s count', async () => {
    const body = await list('window=90');
    // a (−10), e (−1) are overdue; b (+10) within 30; c (+60) within 90; d (+200) only in all. f is in another building.
    expect(body.counts).toEqual({ overdue: 2, within30: 3, within90: 4, total: 5 });
    expect(ids(body)).toEqual(of('a', 'e', 'b', 'c'));
    expect(body.pagination.total).toBe(4);
    const overdue = await list('window=overdue');
    expect(ids(overdue)).toEqual(of('a', 'e'));
    expect(overdue.data.map((r) => r.overdueDays)).toEqual([10, 1]);
    expect(ids(await list('window=30'))).toEqual(of('a', 'e', 'b'));
    expect(ids(await list('window=all'))).toEqual(of('a', 'e', 'b', 'c', 'd'));
    const aisleOnly = await api('conservator').get(`/api/inspections?locationId=${aisle}&window=all`);
    expect(aisleOnly.body.data.map((r: { printId: string }) => r.printId)).toEqual(of('a', 'b', 'c', 'd'));
    expect(aisleOnly.body.data[0].locationLabel).toBe(`Inspection wing ${base} › Aisle store`);
  });

  it('filters by risk and by reason (one of the print\'s reasons), the counts following the filter', async () => {
    const high = await list('window=all&risk=high');
    expect(ids(high)).toEqual(of('e', 'b'));
    expect(high.counts).toEqual({ overdue: 1, within30: 2, within90: 2, total: 2 });
    expect(ids(await list('window=all&reason=never_checked'))).toEqual(of('a'));
    const light = await list('window=all&reason=light');
    expect(ids(light)).toEqual(of('e', 'b'));
    expect(light.data[0].mainReason).toBe('lent twice in three years');
  });

  it('sorts by date either way, place, risk and accession number (natural order), and pages', async () => {
    expect(ids(await list('window=all&sort=-dueOn'))).toEqual(of('d', 'c', 'b', 'e', 'a'));
    // Aisle before Bay; inside the aisle .2, .3, .4, .10.
    expect(ids(await list('window=all&sort=location'))).toEqual(of('b', 'c', 'd', 'a', 'e'));
    expect(ids(await list('window=all&sort=risk'))).toEqual(of('a', 'e', 'b', 'c', 'd'));
    expect(ids(await list('window=all&sort=accessionNumber'))).toEqual(of('b', 'c', 'd', 'e', 'a'));
    const page2 = await list('window=all&pageSize=2&page=2');
    expect(ids(page2)).toEqual(of('b', 'c'));
    expect(page2.pagination.total).toBe(5);
  });

  it('follows a print that moves: the place filter reads the print\'s new place', async () => {
    const extra = await newPrint(7, aisle);
    await settleSchedules();
    await db().query(
      `INSERT INTO print_schedules (print_id, computed_due_on, due_on, interval_months, risk, risk_rank, reasons, main_reason)
       VALUES ($1, $2, $2, 12, 'low', 1, '{}', 'routine') ON CONFLICT (print_id) DO UPDATE SET due_on = EXCLUDED.due_on`,
      { bind: [extra.id, day(500)] },
    );
    const inAisle = await api('conservator').get(`/api/inspections?locationId=${aisle}&window=all`);
    expect(inAisle.body.data.map((r: { printId: string }) => r.printId)).toContain(extra.id);
    const { body: { data: print } } = await api('registrar').get(`/api/prints/${extra.id}`);
    const moved = await api('registrar').post(`/api/prints/${extra.id}/movements`, { toLocationId: elsewhere, reason: 'Rehoused in the annexe', version: print.version });
    expect(moved.status, JSON.stringify(moved.body)).toBe(201);
    const after = await api('conservator').get(`/api/inspections?locationId=${aisle}&window=all`);
    expect(after.body.data.map((r: { printId: string }) => r.printId)).toEqual(of('a', 'b', 'c', 'd'));
    const there = await api('conservator').get(`/api/inspections?locationId=${elsewhere}&window=all`);
    expect(there.body.data.map((r: { printId: string }) => r.printId)).toEqual([p.f.id, extra.id]);
    await db().query('DELETE FROM print_schedules WHERE print_id = $1', { bind: [extra.id] });
  });

  it('who reads: viewer 403, no session 401, researcher and registrar read', async () => {
    expect((await api('viewer').get('/api/inspections')).status).toBe(403);
    expect((await api(null).get('/api/inspections')).status).toBe(401);
    expect(ids(await list('window=overdue', 'researcher'))).toEqual(of('a', 'e'));
    expect(ids(await list('window=overdue', 'registrar'))).toEqual(of('a', 'e'));
  });

  it('refuses bad filters with 400 naming the field', async () => {
    for (const [q, field] of [['window=soon', 'window'], ['locationId=shelf-3', 'locationId'], ['sort=title', 'sort'], ['risk=extreme', 'risk'], ['reason=vibes', 'reason'], ['assigneeId=nobody', 'assigneeId'], ['pageSize=500', 'pageSize']]) {
      const res = await api('conservator').get(`/api/inspections?${q}`);
      expect(res.status, q).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(paths(res)[0]).toContain(field);
    }
  });
});

describe('rounds', () => {
  let round: { id: string; version: number; title: string; items: { printId: string }[] };

  it('a registrar reads but cannot plan (403); a round needs a conservator as assignee and existing prints (400)', async () => {
    const body = { title: 'Aisle check', plannedOn: day(7), assigneeId: conservatorId, printIds: of('a', 'b') };
    expect((await api('registrar').post('/api/inspection-rounds', body)).status).toBe(403);
    expect((await api('registrar').get('/api/inspection-rounds')).status).toBe(200);
    expect((await api('viewer').get('/api/inspection-rounds')).status).toBe(403);
    const notConservator = await api('conservator').post('/api/inspection-rounds', { ...body, assigneeId: registrarId });
    expect(notConservator.status).toBe(400);
    expect(paths(notConservator)).toEqual(['assigneeId']);
    const missing = await api('conservator').post('/api/inspection-rounds', { ...body, printIds: [p.a.id, UNKNOWN] });
    expect(missing.status).toBe(400);
    expect(paths(missing)).toEqual(['printIds.1']);
    const empty = await api('conservator').post('/api/inspection-rounds', { ...body, printIds: [] });
    expect(empty.status).toBe(400);
    expect(paths(empty)).toEqual(['printIds']);
    const badDate = await api('conservator').post('/api/inspection-rounds', { ...body, plannedOn: '2027-02-30' });
    expect(badDate.status).toBe(400);
    expect(paths(badDate)).toEqual(['plannedOn']);
    const assignees = await api('registrar').get('/api/inspection-assignees');
    expect(assignees.body.data.map((u: { id: string }) => u.id)).toContain(conservatorId);
    expect(assignees.body.data.map((u: { id: string }) => u.id)).not.toContain(registrarId);
  });

  it('plans a round (idempotent on retry, audited) with its prints in shelf order and what to look at', async () => {
    // A signed report on e gives it a last grade and an observation to look at.
    const draft = await api('conservator').post(`/api/prints/${p.e.id}/condition-reports`, {
      examinedOn: day(-400), context: 'routine', grade: 'fair',
      observations: [{ termCode: 'silver_mirroring', side: 'recto', area: 'margin', extent: 'localised', severity: 'moderate' }],
    });
    expect(draft.status, JSON.stringify(draft.body)).toBe(201);
    expect((await api('conservator').post(`/api/condition-reports/${draft.body.data.id}/sign`, { version: draft.body.data.version })).status).toBe(200);
    await pinSchedules();

    const key = `round-${base}`;
    const body = { title: 'Inspection wing, first pass', plannedOn: day(7), assigneeId: conservatorId, printIds: of('e', 'a', 'b') };
    const res = await api('conservator').post('/api/inspection-rounds', body, key);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    round = res.body.data;
    const again = await api('conservator').post('/api/inspection-rounds', body, key);
    expect(again.status).toBe(201);
    expect(again.headers['idempotent-replayed']).toBe('true');
    expect(again.body.data.id).toBe(round.id);
    const [{ n }] = await db().query<{ n: number }>('SELECT count(*)::int AS n FROM inspection_rounds WHERE title = $1', { bind: [body.title], type: QueryTypes.SELECT });
    expect(n).toBe(1);

    const detail = res.body.data;
    expect(detail).toMatchObject({ status: 'planned', version: 1, printCount: 3, checkedCount: 0, assignee: { id: conservatorId }, locationLabel: `Inspection wing ${base}` });
    // Shelf order: Aisle (.2 then .10) before Bay.
    expect(detail.items.map((i: { printId: string }) => i.printId)).toEqual(of('b', 'a', 'e'));
    const e = detail.items[2];
    expect(e).toMatchObject({ lastGrade: 'fair', lastCheckedOn: day(-400), dueOn: day(-1), checkedOn: null, conditionReportId: null });
    expect(e.lookAt[0]).toBe('lent twice in three years');
    expect(e.lookAt[1]).toMatch(/moderate, at the margin \(recto\)$/);
    const audit = await db().query<{ action: string }>('SELECT action FROM audit_events WHERE entity_id = $1', { bind: [round.id], type: QueryTypes.SELECT });
    expect(audit.map((a) => a.action)).toEqual(['inspection_round.created']);
  });

  it('the work list shows each print\'s open round and filters by assignee or by none', async () => {
    const mine = await list(`window=all&assigneeId=${conservatorId}`);
    expect(ids(mine)).toEqual(of('a', 'e', 'b'));
    expect(mine.data[0].round?.title).toBe('Inspection wing, first pass');
    expect(ids(await list('window=all&assigneeId=none'))).toEqual(of('c', 'd'));
    const listed = await api('researcher').get(`/api/inspection-rounds?assigneeId=${conservatorId}&status=planned&pageSize=200`);
    expect(listed.body.data.find((r: { id: string }) => r.id === round.id)).toMatchObject({ printCount: 3, checkedCount: 0 });
  });

  it('changes bump the version; an old version is a 409 with the round as it is now; prints are added and taken out', async () => {
    const renamed = await api('conservator').patch(`/api/inspection-rounds/${round.id}`, { title: 'Inspection wing, morning', version: 1 });
    expect(renamed.status, JSON.stringify(renamed.body)).toBe(200);
    expect(renamed.body.data.version).toBe(2);
    const stale = await api('conservator').patch(`/api/inspection-rounds/${round.id}`, { notes: 'Bring the loupe', version: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.details.current.title).toBe('Inspection wing, morning');
    const moved = await api('conservator').patch(`/api/inspection-rounds/${round.id}`, { addPrintIds: of('c'), removePrintIds: of('b'), version: 2 });
    expect(moved.status).toBe(200);
    expect(moved.body.data.version).toBe(3);
    expect(moved.body.data.items.map((i: { printId: string }) => i.printId)).toEqual(of('c', 'a', 'e'));
    const nothing = await api('conservator').patch(`/api/inspection-rounds/${round.id}`, { title: 'Inspection wing, morning', version: 3 });
    expect(nothing.body.data.version).toBe(3);
    expect((await api('registrar').patch(`/api/inspection-rounds/${round.id}`, { title: 'x', version: 3 })).status).toBe(403);
    const bad = await api('conservator').patch(`/api/inspection-rounds/${round.id}`, { addPrintIds: [UNKNOWN], version: 3 });
    expect(bad.status).toBe(400);
    expect(paths(bad)).toEqual(['addPrintIds.0']);
    const emptied = await api('conservator').patch(`/api/inspection-rounds/${round.id}`, { removePrintIds: of('a', 'c', 'e'), version: 3 });
    expect(emptied.status).toBe(400);
    expect((await api('conservator').patch(`/api/inspection-rounds/${UNKNOWN}`, { title: 'x', version: 1 })).status).toBe(404);
    round = (await api('conservator').get(`/api/inspection-rounds/${round.id}`)).body.data;
    expect(round.version).toBe(3);
  });

  it('signing a condition report checks the print off in its open rounds with the report and its date; a draft does not', async () => {
    const draft = await api('conservator').post(`/api/prints/${p.a.id}/condition-reports`, { examinedOn: day(0), context: 'routine', grade: 'good' });
    expect(draft.status).toBe(201);
    let detail = (await api('conservator').get(`/api/inspection-rounds/${round.id}`)).body.data;
    expect(detail.items.find((i: { printId: string }) => i.printId === p.a.id).checkedOn).toBeNull();
    const signed = await api('conservator').post(`/api/condition-reports/${draft.body.data.id}/sign`, { version: draft.body.data.version });
    expect(signed.status).toBe(200);
    detail = (await api('conservator').get(`/api/inspection-rounds/${round.id}`)).body.data;
    expect(detail.items.find((i: { printId: string }) => i.printId === p.a.id)).toMatchObject({ checkedOn: day(0), conditionReportId: draft.body.data.id, lastGrade: 'good' });
    expect(detail.checkedCount).toBe(1);
    // A cancelled round is left as it was.
    const other = await api('conservator').post('/api/inspection-rounds', { title: 'Bay only', plannedOn: day(3), assigneeId: conservatorId, printIds: of('e') });
    const cancelled = await api('conservator').patch(`/api/inspection-rounds/${other.body.data.id}`, { status: 'cancelled', version: 1 });
    expect(cancelled.body.data.status).toBe('cancelled');
    const d2 = await api('conservator').post(`/api/prints/${p.e.id}/condition-reports`, { examinedOn: day(0), context: 'routine', grade: 'fair' });
    await api('conservator').post(`/api/condition-reports/${d2.body.data.id}/sign`, { version: d2.body.data.version });
    const [open, closed] = await Promise.all([round.id, other.body.data.id].map(async (id) => (await api('conservator').get(`/api/inspection-rounds/${id}`)).body.data));
    expect(open.items.find((i: { printId: string }) => i.printId === p.e.id).conditionReportId).toBe(d2.body.data.id);
    expect(closed.items[0].checkedOn).toBeNull();
  });
});
