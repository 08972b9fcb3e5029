import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testApp } from '../../../test/app';
import { daysFromToday, exhibitionClient } from '../../../test/exhibition-helpers';
import { createImageRecord, createLocation } from '../../../test/factories';
import { QueryTypes } from 'sequelize';
import { db } from '../../db';
import { settleSchedules } from '../../services/schedule-jobs';

/**
 * A completed deaccession makes the print read-only: every write path that changes the print or a
 * record of it answers 409 in the error envelope naming the day, and nothing is written. The print
 * stays findable (list, search) and readable (its page, its reports, its history).
 */
const t = testApp();
let h: Awaited<ReturnType<typeof exhibitionClient>>;
beforeAll(async () => {
  h = await exhibitionClient(t);
});
afterAll(() => t.close());

const ok = (res: { status: number; body: unknown }, status = 200) => expect(res.status, JSON.stringify(res.body)).toBe(status);

async function deaccession(printId: string, completedOn: string) {
  const r = h.as('registrar');
  const proposed = await r.post(`/api/prints/${printId}/deaccessions`, { proposedOn: daysFromToday(-30), reason: 'Water damage beyond use in the 2024 flood', method: 'destruction' });
  ok(proposed, 201);
  const approved = await r.post(`/api/deaccessions/${proposed.body.data.id}/approve`, { authority: 'Board of Trustees, minute 2025/41', approvedOn: daysFromToday(-20), version: proposed.body.data.version });
  ok(approved);
  const done = await r.post(`/api/deaccessions/${proposed.body.data.id}/complete`, { completedOn, finalNote: 'Destroyed in the presence of two witnesses; certificate filed', version: approved.body.data.version });
  ok(done);
  return done.body.data;
}

describe('a deaccessioned print is read-only', () => {
  it('refuses every write path with 409 naming the day, and stays findable and readable', async () => {
    const conservator = (await h.as('conservator').get('/api/me')).body.data;
    const p = await h.newPrint('gelatin_silver_developing_out', 'Slipway at dusk');
    const box = await createLocation();
    const image = await createImageRecord(p.id);
    await image.update({ capturedOn: '2024-01-05' });
    const c = h.as('conservator');
    const spot = (await c.post(`/api/prints/${p.id}/measurement-spots`, { name: 'Dmax', purpose: 'dmax' })).body.data;
    const session = (await c.post(`/api/prints/${p.id}/measurement-sessions`, {
      measuredOn: daysFromToday(-60), instrument: 'Spectrodensitometer', illuminant: 'D50', observer: '2', geometry: '45/0', condition: 'M1',
      readings: [{ spotId: spot.id, readings: [{ L: 20, a: 0.5, b: 1 }] }],
    })).body.data;
    const draft = (await c.post(`/api/prints/${p.id}/condition-reports`, { examinedOn: daysFromToday(-50), context: 'routine', grade: 'poor', observations: [] })).body.data;
    const signedDraft = (await c.post(`/api/prints/${p.id}/condition-reports`, { examinedOn: daysFromToday(-55), context: 'routine', grade: 'poor', observations: [] })).body.data;
    const signed = (await c.post(`/api/condition-reports/${signedDraft.id}/sign`, { version: signedDraft.version })).body.data;
    const exhibition = await h.newExhibition([{ name: 'Long gallery', opensOn: daysFromToday(-200), closesOn: daysFromToday(-100) }]);
    await h.addObjects(exhibition, [p.id]);
    const shown = await h.display(exhibition.id, { printId: p.id, startsOn: daysFromToday(-200), endsOn: daysFromToday(-150), lux: 50, hoursPerDay: 8 });
    const loan = (await h.as('registrar').post('/api/loans', { direction: 'out', reference: `L-${Date.now()}`, otherInstitution: 'Harrowgate Gallery of Light', purpose: 'research' })).body.data;
    ok(await h.as('registrar').put(`/api/loans/${loan.id}/objects`, { objects: [{ printId: p.id }], version: loan.version }));
    const treatment = (await c.post(`/api/prints/${p.id}/treatments`, { proposedOn: daysFromToday(-40), conditionFound: 'Tear at the lower edge', aims: 'Stabilise the tear', chosenMethod: 'Tissue repair' })).body.data;
    const acquisition = (await h.as('registrar').post('/api/acquisitions', { source: 'Orla Fenwick', method: 'gift', acquiredOn: daysFromToday(-400) })).body.data;
    const other = await h.newPrint();

    const done = await deaccession(p.id, daysFromToday(-1));
    expect(done.status).toBe('completed');
    const day = daysFromToday(-1);

    const print = (await h.as('registrar').get(`/api/prints/${p.id}`)).body.data;
    expect(print.status).toBe('deaccessioned');
    const r = h.as('registrar');
    const writes: [string, () => Promise<{ status: number; body: { error?: { message: string; code: string } } }>][] = [
      ['print edit', () => r.patch(`/api/prints/${p.id}`, { title: 'Renamed', version: print.version })],
      ['print delete', () => r.delete(`/api/prints/${p.id}?version=${print.version}`)],
      ['process steps', () => r.put(`/api/prints/${p.id}/steps`, { steps: [], version: print.version })],
      ['movement', () => r.post(`/api/prints/${p.id}/movements`, { toLocationId: box.id, reason: 'Rehoused', version: print.version })],
      ['image edit', () => r.patch(`/api/images/${image.id}`, { notes: 'x', version: image.version })],
      ['image withdraw', () => r.post(`/api/images/${image.id}/withdraw`, { reason: 'Duplicate', version: image.version })],
      ['capture date void', () => c.post(`/api/images/${image.id}/void-capture-date`, { reason: 'Date of the scan, not the capture', version: image.version })],
      ['report create', () => c.post(`/api/prints/${p.id}/condition-reports`, { examinedOn: daysFromToday(0), context: 'routine', observations: [] })],
      ['report edit', () => c.patch(`/api/condition-reports/${draft.id}`, { summary: 'x', version: draft.version })],
      ['report sign', () => c.post(`/api/condition-reports/${draft.id}/sign`, { version: draft.version })],
      ['report discard', () => c.delete(`/api/condition-reports/${draft.id}?version=${draft.version}`)],
      ['addendum', () => c.post(`/api/condition-reports/${signed.id}/addenda`, { text: 'Later note' })],
      ['spot create', () => c.post(`/api/prints/${p.id}/measurement-spots`, { name: 'Margin', purpose: 'paper_base' })],
      ['spot edit', () => c.patch(`/api/measurement-spots/${spot.id}`, { notes: 'x', version: spot.version })],
      ['baseline', () => c.put(`/api/measurement-spots/${spot.id}/baseline`, { sessionId: session.id, reason: 'After treatment', version: spot.version })],
      ['session', () => c.post(`/api/prints/${p.id}/measurement-sessions`, {
        measuredOn: daysFromToday(0), instrument: 'Spectrodensitometer', illuminant: 'D50', observer: '2', geometry: '45/0', condition: 'M1',
        readings: [{ spotId: spot.id, readings: [{ L: 21, a: 0.5, b: 1 }] }],
      })],
      ['session void', () => c.post(`/api/measurement-sessions/${session.id}/void`, { reason: 'Wrong aperture' })],
      ['light category', () => c.put(`/api/prints/${p.id}/light-responsivity`, { category: 'high', reason: 'Iron toned', version: print.version })],
      ['schedule override', () => c.put(`/api/prints/${p.id}/inspection-override`, { dueOn: daysFromToday(30), reason: 'Watch the tear', version: 1 })],
      ['round', () => c.post('/api/inspection-rounds', { title: 'Store check', plannedOn: daysFromToday(7), assigneeId: conservator.id, printIds: [p.id, other.id] })],
      ['loan membership', () => r.put(`/api/loans/${loan.id}/objects`, { objects: [{ printId: p.id, insuranceValue: 100, currency: 'GBP' }], version: loan.version + 1 })],
      ['loan removal', () => r.delete(`/api/loans/${loan.id}/objects/${p.id}?version=${loan.version + 1}`)],
      ['exhibition membership', () => r.delete(`/api/exhibitions/${exhibition.id}/objects/${p.id}?version=${exhibition.version + 1}`)],
      ['display edit', () => r.patch(`/api/displays/${shown.id}`, { lux: 40, version: shown.version })],
      ['display create', () => r.post(`/api/exhibitions/${exhibition.id}/displays`, { printId: p.id, startsOn: daysFromToday(-140), endsOn: daysFromToday(-130), lux: 50, hoursPerDay: 8 })],
      ['treatment propose', () => c.post(`/api/prints/${p.id}/treatments`, { proposedOn: daysFromToday(0), conditionFound: 'x', aims: 'y', chosenMethod: 'z' })],
      ['treatment approve', () => c.post(`/api/treatments/${treatment.id}/approve`, { approvedByName: 'Ilse Marrow', approvedOn: daysFromToday(0), version: treatment.version })],
      ['deaccession propose', () => r.post(`/api/prints/${p.id}/deaccessions`, { proposedOn: daysFromToday(0), reason: 'Again', method: 'destruction' })],
      ['accessioning', () => r.post(`/api/acquisitions/${acquisition.id}/prints`, { add: [p.id], version: acquisition.version })],
    ];
    for (const [what, call] of writes) {
      const res = await call();
      expect(res.status, `${what}: ${JSON.stringify(res.body)}`).toBe(409);
      expect(res.body.error?.code, what).toBe('conflict');
      expect(res.body.error?.message, what).toBe(`This print was deaccessioned on ${day}; its record is read-only.`);
    }
    // Nothing was written: the print, its report draft and its images are as they were.
    const after = (await r.get(`/api/prints/${p.id}`)).body.data;
    expect(after.version).toBe(print.version);
    expect(after.title).toBe('Slipway at dusk');
    expect((await c.get(`/api/condition-reports/${draft.id}`)).body.data.version).toBe(draft.version);
    expect((await c.get(`/api/prints/${p.id}/measurements`)).body.data.sessions).toHaveLength(1);
    // Findable and readable.
    const found = await h.as('viewer').get(`/api/prints?q=${encodeURIComponent(print.accessionNumber)}&holding=all`);
    ok(found);
    expect(found.body.data.map((x: { id: string }) => x.id)).toContain(p.id);
    ok(await h.as('researcher').get(`/api/prints/${p.id}/condition-reports`));
    ok(await h.as('researcher').get(`/api/prints/${p.id}/treatments`));
    const history = await h.as('registrar').get(`/api/prints/${p.id}/deaccessions`);
    expect(history.body.data[0]).toMatchObject({ status: 'completed', completedOn: day, authority: 'Board of Trustees, minute 2025/41' });
    // The final record itself is kept as completed.
    const again = await r.post(`/api/deaccessions/${done.id}/withdraw`, { why: 'Changed our minds', version: done.version });
    expect(again.status).toBe(409);
  });

  it('a deaccessioned print is no longer inspected: its date leaves the work list and its inspection answers 409 naming the day', async () => {
    const room = await createLocation();
    const created = await h.as('registrar').post('/api/prints', { accessionNumber: `2026.${Date.now() % 100000}.7`, title: 'Net loft, Calder Reach', process: 'gelatin_silver_developing_out', locationId: room.id });
    ok(created, 201);
    const p = created.body.data as { id: string };
    ok(await h.as('conservator').get(`/api/prints/${p.id}/inspection`));
    const listed = async () => {
      const res = await h.as('conservator').get(`/api/inspections?window=all&locationId=${room.id}`);
      ok(res);
      return res.body.data.map((r: { printId: string }) => r.printId);
    };
    expect(await listed()).toEqual([p.id]);
    await deaccession(p.id, daysFromToday(-2));
    await settleSchedules();
    expect(await listed()).toEqual([]);
    const after = await h.as('conservator').get(`/api/prints/${p.id}/inspection`);
    expect(after.status).toBe(409);
    expect(after.body.error.details).toMatchObject({ printId: p.id, deaccessioned: daysFromToday(-2) });
    const [{ n }] = await db().query<{ n: number }>('SELECT count(*)::int AS n FROM print_schedules WHERE print_id = $1', { bind: [p.id], type: QueryTypes.SELECT });
    expect(n).toBe(0);
  });

  it('the status deaccessioned is set by the procedure only, not by a print edit', async () => {
    const p = await h.newPrint();
    const res = await h.as('registrar').patch(`/api/prints/${p.id}`, { status: 'deaccessioned', version: p.version });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0]).toMatchObject({ path: 'status', code: 'set_by_deaccession' });
  });
});
