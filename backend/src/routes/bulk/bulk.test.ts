import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { QueryTypes } from 'sequelize';
import { ROLES, type Role } from '@toneledger/common/domain/roles';
import { compatibilityWarnings } from '@toneledger/common/domain/compatibility';
import { testApp, sessionFor } from '../../../test/app';
import { accession, createEnclosure, createImageRecord, createLocation } from '../../../test/factories';
import { db } from '../../db';
import { AuditEventModel, Image, Print } from '../../models';
import { DEMO_ACCOUNTS } from '../../seed/demo-accounts';

const t = testApp();
const c = {} as Record<Role, string>;
const word = `quayside${Date.now() % 1_000_000}`;
let store: { id: string; pathLabel: string };
let annexe: { id: string; pathLabel: string };
let buffered: { id: string; name: string };
let plain: { id: string; name: string };

beforeAll(async () => {
  for (const r of ROLES) c[r] = await sessionFor(t.app, r);
  const b = await createLocation(`Bulk wing ${word}`);
  store = await createLocation('Drawer 4', b);
  annexe = await createLocation(`Bulk annexe ${word}`);
  buffered = await createEnclosure({ name: `Buffered folder ${word}`, alkalineBuffered: true, patResult: 'passed' });
  plain = await createEnclosure({ name: `Unbuffered folder ${word}`, alkalineBuffered: false, patResult: 'passed' });
});
afterAll(() => t.close());

const post = (role: Role | null, url: string, body: object) => {
  const r = supertest(t.app).post(url).set('Origin', t.origin);
  return (role ? r.set('Cookie', c[role]) : r).send(body);
};

/** A print in the store, in the unbuffered folder; iron-blue toned when asked (a toning step of class iron_blue). */
async function newPrint(title: string, ironBlue = false): Promise<{ id: string; version: number }> {
  const res = await post('registrar', '/api/prints', {
    accessionNumber: accession(), title: `${title} ${word}`, process: 'gelatin_silver_developing_out', locationId: store.id, enclosureId: plain.id,
  });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  if (!ironBlue) return res.body.data;
  const toned = await supertest(t.app).put(`/api/prints/${res.body.data.id}/steps`).set('Origin', t.origin).set('Cookie', c.registrar).send({
    version: res.body.data.version, steps: [{ type: 'development' }, { type: 'toning', tonerClass: 'iron_blue' }],
  });
  expect(toned.status, JSON.stringify(toned.body)).toBe(200);
  return toned.body.data;
}

const ids = (...list: { id: string }[]) => ({ kind: 'ids' as const, ids: list.map((p) => p.id) });
const auditsOf = (printIds: string[], action: string) => AuditEventModel.count({ where: { entityType: 'print', entityId: printIds, action } });
async function preview(role: Role, action: string, body: object) {
  const res = await post(role, `/api/prints-bulk/${action}/preview`, body);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body.data;
}

describe('bulk rehouse', () => {
  it('a conservator previews and applies it: warnings counted by the compatibility rules, one audit entry per print, the stored warnings as previewed', async () => {
    const blue = [await newPrint('Blue dock 1', true), await newPrint('Blue dock 2', true), await newPrint('Blue dock 3', true)];
    const grey = await newPrint('Grey dock');
    const selection = ids(...blue, grey);
    const p = await preview('conservator', 'rehouse', { selection, enclosureId: buffered.id });
    expect(p).toMatchObject({ total: 4, changing: 4, unchanged: 0, refused: 0, tooMany: false });
    // Iron blue fades under alkaline conditions (Reilly 1986; Ware 2003): the rule flags the three toned prints, not the plain one.
    const expected = compatibilityWarnings({ process: 'gelatin_silver_developing_out', tonerClasses: ['iron_blue'], afterBaths: [], enclosure: { name: buffered.name, alkalineBuffered: true, patResult: 'passed' } });
    expect(expected.map((w) => w.code)).toEqual(['prussian_blue_in_buffered_enclosure']);
    expect(p.warnings).toHaveLength(1);
    expect(p.warnings[0]).toMatchObject({ code: 'prussian_blue_in_buffered_enclosure', count: 3, severity: 'high', offer: 'rehouse' });
    expect(p.warnings[0].message).toMatch(/^3 iron-blue prints would move into an alkaline-buffered enclosure/);
    expect([...p.warnings[0].printIds].sort()).toEqual(blue.map((b) => b.id).sort());

    const res = await post('conservator', '/api/prints-bulk/rehouse', { selection, enclosureId: buffered.id, fingerprint: p.fingerprint });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.data).toMatchObject({ changed: 4, unchanged: 0, refused: 0, auditEntries: 4 });
    for (const row of p.rows) {
      const got = (await supertest(t.app).get(`/api/prints/${row.printId}`).set('Cookie', c.conservator)).body.data;
      expect(got.enclosure.name).toBe(row.after);
      // The stored codes (the list's warning column) are those the print's own record computes.
      const stored = (await Print.findByPk(row.printId))!.warningCodes;
      expect([...stored].sort()).toEqual(got.warnings.map((w: { code: string }) => w.code).sort());
      for (const code of row.newWarnings) expect(stored).toContain(code);
    }
    expect(await auditsOf(selection.ids, 'print.rehoused')).toBe(4);
    for (const id of selection.ids) expect(await auditsOf([id], 'print.rehoused')).toBe(1);
  });

  it('refuses an apply whose selection changed since the preview (409 with a fresh preview); nothing is written', async () => {
    const a = await newPrint('Stale one');
    const b = await newPrint('Stale two');
    const p = await preview('registrar', 'rehouse', { selection: ids(a, b), enclosureId: buffered.id });
    const edit = await supertest(t.app).patch(`/api/prints/${b.id}`).set('Origin', t.origin).set('Cookie', c.registrar).send({ version: b.version, title: `Renamed ${word}` });
    expect(edit.status).toBe(200);
    const res = await post('registrar', '/api/prints-bulk/rehouse', { selection: ids(a, b), enclosureId: buffered.id, fingerprint: p.fingerprint });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('conflict');
    expect(res.body.error.details.preview.fingerprint).not.toBe(p.fingerprint);
    expect((await Print.findByPk(a.id))!.enclosureId).toBe(plain.id);
    expect(await auditsOf([a.id, b.id], 'print.rehoused')).toBe(0);
    // The fresh preview applies.
    const again = await post('registrar', '/api/prints-bulk/rehouse', { selection: ids(a, b), enclosureId: buffered.id, fingerprint: res.body.error.details.preview.fingerprint });
    expect(again.status).toBe(200);
    expect(again.body.data.changed).toBe(2);
  });
});

describe('roles', () => {
  it('a conservator may move and rehouse, but not change other fields or the status', async () => {
    const a = await newPrint('Role check');
    const moved = await post('conservator', `/api/prints/${a.id}/movements`, { toLocationId: annexe.id, reason: 'Survey', version: a.version });
    expect(moved.status, JSON.stringify(moved.body)).toBe(201);
    const patch = await supertest(t.app).patch(`/api/prints/${a.id}`).set('Origin', t.origin).set('Cookie', c.conservator).send({ version: moved.body.data.version, title: 'No' });
    expect(patch.status).toBe(403);
    expect((await post('conservator', '/api/prints-bulk/status/preview', { selection: ids(a), status: 'in_treatment' })).status).toBe(403);
    expect((await post('conservator', '/api/prints-bulk/rehouse/preview', { selection: ids(a), enclosureId: buffered.id })).status).toBe(200);
    expect((await post('conservator', '/api/prints-bulk/exhibition/preview', { selection: ids(a), exhibitionId: a.id })).status).toBe(403);
    for (const role of ['researcher', 'viewer'] as const) {
      expect((await post(role, '/api/prints-bulk/move/preview', { selection: ids(a), toLocationId: store.id, reason: 'x' })).status, role).toBe(403);
      expect((await post(role, '/api/prints-bulk/rehouse/preview', { selection: ids(a), enclosureId: plain.id })).status, role).toBe(403);
    }
    expect((await post(null, '/api/prints-bulk/move/preview', { selection: ids(a), toLocationId: store.id, reason: 'x' })).status).toBe(401);
    expect((await post('registrar', '/api/prints-bulk/round/preview', { selection: ids(a), roundId: a.id })).status).toBe(403);
  });
});

describe('select all matching', () => {
  it('the selection is the search, resolved on the server: every matching print moves, one movement and one audit entry each', async () => {
    const tag = `tidemark${Date.now() % 1_000_000}`;
    const made = [];
    for (let i = 0; i < 7; i++) made.push(await newPrint(`${tag} ${i}`));
    const selection = { kind: 'query', query: { q: tag } };
    const p = await preview('conservator', 'move', { selection, toLocationId: annexe.id, reason: 'Shelf survey' });
    expect(p.total).toBe(7);
    expect(p.rows.map((r: { printId: string }) => r.printId).sort()).toEqual(made.map((m) => m.id).sort());
    expect(p.rows.every((r: { before: string; after: string }) => r.before === store.pathLabel && r.after === annexe.pathLabel)).toBe(true);
    const res = await post('conservator', '/api/prints-bulk/move', { selection, toLocationId: annexe.id, reason: 'Shelf survey', fingerprint: p.fingerprint });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.data).toMatchObject({ changed: 7, auditEntries: 7 });
    const ids7 = made.map((m) => m.id);
    const [{ n }] = await db().query<{ n: number }>('SELECT count(*)::int AS n FROM movements WHERE print_id = ANY($1::uuid[]) AND to_location_id = $2', {
      bind: [ids7, annexe.id], type: QueryTypes.SELECT,
    });
    expect(n).toBe(7);
    expect(await auditsOf(ids7, 'print.moved')).toBe(7);
    // A print added to the search after the preview makes the old fingerprint stale.
    const p2 = await preview('conservator', 'move', { selection, toLocationId: store.id, reason: 'Back' });
    await newPrint(`${tag} late`);
    expect((await post('conservator', '/api/prints-bulk/move', { selection, toLocationId: store.id, reason: 'Back', fingerprint: p2.fingerprint })).status).toBe(409);
  });
});

describe('deaccessioned prints', () => {
  it('are listed as refused in the preview and never changed by the apply', async () => {
    const kept = await newPrint('Kept');
    const gone = await newPrint('Gone');
    await Print.update({ status: 'deaccessioned' }, { where: { id: gone.id } });
    const before = (await Print.findByPk(gone.id))!;
    for (const [action, extra] of [['move', { toLocationId: annexe.id, reason: 'Survey' }], ['rehouse', { enclosureId: buffered.id }], ['status', { status: 'in_treatment' }]] as const) {
      const p = await preview('registrar', action, { selection: ids(kept, gone), ...extra });
      expect(p.refused, action).toBe(1);
      expect(p.rows.find((r: { printId: string }) => r.printId === gone.id)).toMatchObject({ outcome: 'refused', note: expect.stringMatching(/Deaccessioned/) });
      const res = await post('registrar', `/api/prints-bulk/${action}`, { selection: ids(kept, gone), ...extra, fingerprint: p.fingerprint });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body.data).toMatchObject({ changed: 1, refused: 1 });
    }
    const after = (await Print.findByPk(gone.id))!;
    expect([after.version, after.locationId, after.enclosureId, after.status]).toEqual([before.version, before.locationId, before.enclosureId, 'deaccessioned']);
    expect(await AuditEventModel.count({ where: { entityType: 'print', entityId: gone.id } })).toBe(1); // print.created only
  });
});

describe('status, rounds and exports', () => {
  it('a registrar changes the status of many; on loan and deaccessioned cannot be set here (400)', async () => {
    const a = await newPrint('Status a');
    const b = await newPrint('Status b');
    const bad = await post('registrar', '/api/prints-bulk/status/preview', { selection: ids(a, b), status: 'on_loan' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('status');
    const p = await preview('registrar', 'status', { selection: ids(a, b), status: 'in_treatment' });
    expect((await post('registrar', '/api/prints-bulk/status', { selection: ids(a, b), status: 'in_treatment', fingerprint: p.fingerprint })).status).toBe(200);
    expect((await Print.findByPk(a.id))!.status).toBe('in_treatment');
    const history = await supertest(t.app).get(`/api/prints/${a.id}/history`).set('Cookie', c.registrar);
    expect(history.body.data[0].summary).toBe('Edited status');
  });

  it('a conservator adds prints to a planned round; those already in it are unchanged', async () => {
    const a = await newPrint('Round a');
    const b = await newPrint('Round b');
    const conservator = DEMO_ACCOUNTS.find((d) => d.role === 'conservator')!;
    const [{ id: assigneeId }] = await db().query<{ id: string }>('SELECT id FROM users WHERE email = $1', { bind: [conservator.email], type: QueryTypes.SELECT });
    const round = await post('conservator', '/api/inspection-rounds', { title: `Round ${word}`, plannedOn: '2030-01-15', assigneeId, printIds: [a.id] });
    expect(round.status, JSON.stringify(round.body)).toBe(201);
    const p = await preview('conservator', 'round', { selection: ids(a, b), roundId: round.body.data.id });
    expect(p).toMatchObject({ changing: 1, unchanged: 1 });
    const res = await post('conservator', '/api/prints-bulk/round', { selection: ids(a, b), roundId: round.body.data.id, fingerprint: p.fingerprint });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const detail = await supertest(t.app).get(`/api/inspection-rounds/${round.body.data.id}`).set('Cookie', c.conservator);
    expect(detail.body.data.items.map((i: { printId: string }) => i.printId).sort()).toEqual([a.id, b.id].sort());
    expect(await auditsOf([b.id], 'print.added_to_round')).toBe(1);
    expect(await auditsOf([a.id], 'print.added_to_round')).toBe(0);
  });

  it('exports the selection as CSV (the catalogue export columns) and as JSON', async () => {
    const a = await newPrint('Export a');
    const b = await newPrint('Export b');
    const csv = await post('viewer', '/api/prints-bulk/export.csv', { selection: ids(a, b) });
    expect(csv.status).toBe(200);
    const lines = csv.text.trim().split(/\r?\n/);
    expect(lines).toHaveLength(3);
    expect(lines[0]).toMatch(/^accession_number,/);
    expect(lines[0]).not.toMatch(/location|valuation/); // a viewer's export, as the list export gives it
    const json = await post('registrar', '/api/prints-bulk/export.json', { selection: { kind: 'query', query: { q: `Export ${word}` } } });
    expect(json.status).toBe(200);
    const doc = JSON.parse(json.text);
    expect(doc.prints.map((d: { print: { id: string } }) => d.print.id).sort()).toEqual([a.id, b.id].sort());
  });
});

describe('bad input', () => {
  it('400 with the field path, never a 5xx', async () => {
    const a = await newPrint('Bad input');
    const unknown = '00000000-0000-4000-8000-000000000000';
    const missing = await post('registrar', '/api/prints-bulk/move/preview', { selection: { kind: 'ids', ids: [a.id, unknown] }, toLocationId: store.id, reason: 'x' });
    expect(missing.status).toBe(400);
    expect(missing.body.error.details[0].path).toBe('selection.ids.1');
    const nowhere = await post('registrar', '/api/prints-bulk/move/preview', { selection: ids(a), toLocationId: unknown, reason: 'x' });
    expect(nowhere.body.error.details[0].path).toBe('toLocationId');
    const tooMany = await post('registrar', '/api/prints-bulk/move/preview', { selection: { kind: 'ids', ids: Array.from({ length: 1001 }, () => a.id) }, toLocationId: store.id, reason: 'x' });
    expect(tooMany.status).toBe(400);
    const nul = await post('registrar', '/api/prints-bulk/move/preview', { selection: ids(a), toLocationId: store.id, reason: 'a\u0000b' });
    expect(nul.status).toBe(400);
    const future = await preview('registrar', 'move', { selection: ids(a), toLocationId: annexe.id, reason: 'x', movedAt: '2999-01-01T00:00:00Z' });
    const applied = await post('registrar', '/api/prints-bulk/move', { selection: ids(a), toLocationId: annexe.id, reason: 'x', movedAt: '2999-01-01T00:00:00Z', fingerprint: future.fingerprint });
    expect(applied.status).toBe(400);
    expect(applied.body.error.details[0].path).toBe('movedAt');
    const noPrint = await post('registrar', '/api/prints-bulk/move', { selection: ids(a), toLocationId: annexe.id, reason: 'x', fingerprint: 'nope' });
    expect(noPrint.status).toBe(400);
    const hugeDate = await post('registrar', '/api/prints-bulk/move/preview', { selection: { kind: 'query', query: { madeFrom: 99999999 } }, toLocationId: store.id, reason: 'x' });
    expect(hugeDate.status).toBe(400);
  });
});

describe('saved searches', () => {
  it('are private to their owner until shared; only the owner changes or deletes one', async () => {
    const created = await post('registrar', '/api/saved-searches', { name: `Iron blue in drawers ${word}`, query: { tonerClass: 'iron_blue', sort: 'title' } });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const s = created.body.data;
    expect(s).toMatchObject({ shared: false, mine: true, query: { tonerClass: 'iron_blue', sort: 'title' } });
    const names = async (role: Role) => (await supertest(t.app).get('/api/saved-searches').set('Cookie', c[role])).body.data.map((x: { name: string }) => x.name);
    expect(await names('conservator')).not.toContain(s.name);
    const shared = await supertest(t.app).patch(`/api/saved-searches/${s.id}`).set('Origin', t.origin).set('Cookie', c.registrar).send({ version: s.version, shared: true });
    expect(shared.status).toBe(200);
    expect(await names('conservator')).toContain(s.name);
    const theirs = await supertest(t.app).patch(`/api/saved-searches/${s.id}`).set('Origin', t.origin).set('Cookie', c.conservator).send({ version: shared.body.data.version, name: 'Mine now' });
    expect(theirs.status).toBe(403);
    const rename = await supertest(t.app).patch(`/api/saved-searches/${s.id}`).set('Origin', t.origin).set('Cookie', c.registrar).send({ version: shared.body.data.version, name: `Renamed ${word}` });
    expect(rename.body.data.shared).toBe(true);
    const stale = await supertest(t.app).delete(`/api/saved-searches/${s.id}?version=1`).set('Origin', t.origin).set('Cookie', c.registrar);
    expect(stale.status).toBe(409);
    const del = await supertest(t.app).delete(`/api/saved-searches/${s.id}?version=${rename.body.data.version}`).set('Origin', t.origin).set('Cookie', c.registrar);
    expect(del.status).toBe(200);
    const bad = await post('registrar', '/api/saved-searches', { name: '', query: { status: 'lost' } });
    expect(bad.status).toBe(400);
  });
});

describe('list extras', () => {
  it('location counts add up from drawers to rooms and buildings', async () => {
    const building = await createLocation(`Count building ${word}`);
    const room = await createLocation('Room 1', building);
    const drawer = await createLocation('Drawer 1', room);
    const other = await createLocation('Drawer 2', room);
    for (const loc of [drawer, drawer, other, room]) {
      const res = await post('registrar', '/api/prints', { accessionNumber: accession(), title: `Counted ${word}`, process: 'cyanotype', locationId: loc.id });
      expect(res.status).toBe(201);
    }
    const list = await supertest(t.app).get(`/api/locations?q=${encodeURIComponent(`Count building ${word}`)}&pageSize=50`).set('Cookie', c.registrar);
    const count = (id: string) => list.body.data.find((l: { id: string }) => l.id === id).printCount;
    // Own prints: drawer 2, other 1, room 1, building 0; each place adds everything inside it.
    expect([count(drawer.id), count(other.id), count(room.id), count(building.id)]).toEqual([2, 1, 4, 4]);
  });

  it('each list row carries its latest recto with a thumbnail (not a withdrawn one, not a verso)', async () => {
    const p = await newPrint('Thumbnail');
    const old = await createImageRecord(p.id);
    const newer = await createImageRecord(p.id);
    const verso = await createImageRecord(p.id, { viewType: 'verso' });
    const gone = await createImageRecord(p.id, { withdrawnAt: new Date() });
    await Image.update({ thumbKey: 'thumbs/x', capturedOn: '1990-01-01' }, { where: { id: old.id } });
    await Image.update({ thumbKey: 'thumbs/y', capturedOn: '2001-05-01' }, { where: { id: newer.id } });
    await Image.update({ thumbKey: 'thumbs/z', capturedOn: '2020-01-01' }, { where: { id: [verso.id, gone.id] } });
    const list = await supertest(t.app).get(`/api/prints?q=${encodeURIComponent(`Thumbnail ${word}`)}`).set('Cookie', c.viewer);
    expect(list.body.data.map((r: { thumbImageId: string | null }) => r.thumbImageId)).toEqual([newer.id]);
  });
});
