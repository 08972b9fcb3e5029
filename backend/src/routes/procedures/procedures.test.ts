import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES } from '@toneledger/common/domain/roles';
import { testApp } from '../../../test/app';
import { daysFromToday, exhibitionClient } from '../../../test/exhibition-helpers';
import { createImageRecord } from '../../../test/factories';
import { db } from '../../db';

const t = testApp();
let h: Awaited<ReturnType<typeof exhibitionClient>>;
beforeAll(async () => {
  h = await exhibitionClient(t);
});
afterAll(() => t.close());

const ok = (res: { status: number; body: unknown }, status = 200) => expect(res.status, JSON.stringify(res.body)).toBe(status);
const proposal = { proposedOn: daysFromToday(-10), conditionFound: 'Silver mirroring along the upper margin', aims: 'Reduce the mirroring', chosenMethod: 'Local treatment with a dilute solution, cleared and washed' };

describe('treatments', () => {
  it('only conservators write; the condition readers read; viewers do not', async () => {
    const p = await h.newPrint();
    for (const who of ['admin', 'registrar', 'researcher', 'viewer'] as const) {
      expect((await h.as(who).post(`/api/prints/${p.id}/treatments`, proposal)).status, who).toBe(403);
    }
    const created = await h.as('conservator').post(`/api/prints/${p.id}/treatments`, proposal);
    ok(created, 201);
    for (const who of ROLES) {
      expect((await h.as(who).get(`/api/treatments/${created.body.data.id}`)).status, who).toBe(who === 'viewer' ? 403 : 200);
    }
  });

  it('moves proposed → approved → done → signed in order, then is locked; corrections are addenda', async () => {
    const p = await h.newPrint();
    const image = await createImageRecord(p.id);
    const c = h.as('conservator');
    let tr = (await c.post(`/api/prints/${p.id}/treatments`, proposal)).body.data;
    expect(tr.status).toBe('proposed');
    // Out of order: nothing recorded before approval, nothing signed or done before its time.
    expect((await c.patch(`/api/treatments/${tr.id}`, { hoursSpent: 2, version: tr.version })).status).toBe(409);
    expect((await c.post(`/api/treatments/${tr.id}/complete`, { version: tr.version })).status).toBe(409);
    expect((await c.post(`/api/treatments/${tr.id}/sign`, { version: tr.version })).status).toBe(409);
    const early = await c.post(`/api/treatments/${tr.id}/approve`, { approvedByName: 'Ilse Marrow, Head of Collections', approvedOn: daysFromToday(-11), version: tr.version });
    expect(early.status).toBe(400);
    const approved = await c.post(`/api/treatments/${tr.id}/approve`, { approvedByName: 'Ilse Marrow, Head of Collections', approvedOn: daysFromToday(-8), version: tr.version });
    ok(approved);
    tr = approved.body.data;
    expect(tr).toMatchObject({ status: 'approved', approvedByName: 'Ilse Marrow, Head of Collections', approvedOn: daysFromToday(-8) });
    expect((await h.as('registrar').get(`/api/prints/${p.id}`)).body.data.status).toBe('in_treatment');
    // The proposal is frozen once approved.
    expect((await c.patch(`/api/treatments/${tr.id}`, { aims: 'Something else', version: tr.version })).status).toBe(409);
    // Done needs its dates and a step.
    const incomplete = await c.post(`/api/treatments/${tr.id}/complete`, { version: tr.version });
    expect(incomplete.status).toBe(400);
    expect(incomplete.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['completedOn', 'startedOn', 'steps']);
    const report = (await c.post(`/api/prints/${p.id}/condition-reports`, { examinedOn: daysFromToday(-2), context: 'after_treatment', grade: 'good', observations: [] })).body.data;
    const recorded = await c.patch(`/api/treatments/${tr.id}`, {
      startedOn: daysFromToday(-6), completedOn: daysFromToday(-3), hoursSpent: 6.5, summary: 'Mirroring reduced; margin cleared.',
      steps: [{ on: daysFromToday(-6), description: 'Examined under raking light; tested solution in the margin', minutes: 45 }, { on: daysFromToday(-4), description: 'Treated the upper margin', minutes: 120 }],
      materials: [{ kind: 'solvent', name: 'Ethanol, 50 % in water', batchOrProduct: 'Lot 22-114' }, { kind: 'material', name: 'Blotter', batchOrProduct: 'Archival blotter, 0.6 mm' }],
      images: [{ imageId: image.id, stage: 'before' }], afterReportId: report.id, version: tr.version,
    });
    ok(recorded);
    tr = recorded.body.data;
    expect(tr.images).toEqual([expect.objectContaining({ imageId: image.id, stage: 'before' })]);
    expect(tr.afterReportExaminedOn).toBe(daysFromToday(-2));
    const done = await c.post(`/api/treatments/${tr.id}/complete`, { version: tr.version });
    ok(done);
    tr = done.body.data;
    expect(tr.status).toBe('done');
    expect((await h.as('registrar').get(`/api/prints/${p.id}`)).body.data.status).toBe('in_store');
    expect((await c.post(`/api/treatments/${tr.id}/addenda`, { text: 'Too early' })).status).toBe(409);
    const signed = await c.post(`/api/treatments/${tr.id}/sign`, { version: tr.version });
    ok(signed);
    tr = signed.body.data;
    expect(tr.status).toBe('signed');
    expect(tr.signedAt).not.toBeNull();
    // Locked: the service and the database refuse changes.
    const locked = await c.patch(`/api/treatments/${tr.id}`, { hoursSpent: 7, version: tr.version });
    expect(locked.status).toBe(409);
    expect(locked.body.error.message).toMatch(/signed and locked/);
    await expect(db().query('UPDATE treatments SET hours_spent = 1 WHERE id = $1', { bind: [tr.id] })).rejects.toThrow(/signed and locked/);
    await expect(db().query('DELETE FROM treatment_images WHERE treatment_id = $1', { bind: [tr.id] })).rejects.toThrow(/signed treatment are locked/);
    const added = await c.post(`/api/treatments/${tr.id}/addenda`, { text: 'The lot number of the ethanol was 22-141.' });
    ok(added, 201);
    expect(added.body.data.addenda).toEqual([expect.objectContaining({ text: 'The lot number of the ethanol was 22-141.' })]);
    await expect(db().query('DELETE FROM addenda WHERE treatment_id = $1', { bind: [tr.id] })).rejects.toThrow(/append-only/);
    // Each move is in the audit trail.
    const actions = (await db().query<{ action: string }>(`SELECT action FROM audit_events WHERE entity_type = 'treatment' AND entity_id = $1 ORDER BY id`, { bind: [tr.id], type: 'SELECT' as never }))
      .map((r) => r.action);
    expect(actions).toEqual(['treatment.proposed', 'treatment.approved', 'treatment.updated', 'treatment.done', 'treatment.signed', 'treatment.addendum_added']);
  });

  it('refuses images and reports of another print, and steps before the approval', async () => {
    const p = await h.newPrint();
    const q = await h.newPrint();
    const foreign = await createImageRecord(q.id);
    const c = h.as('conservator');
    let tr = (await c.post(`/api/prints/${p.id}/treatments`, proposal)).body.data;
    tr = (await c.post(`/api/treatments/${tr.id}/approve`, { approvedByName: 'Ilse Marrow', approvedOn: daysFromToday(-5), version: tr.version })).body.data;
    const res = await c.patch(`/api/treatments/${tr.id}`, { images: [{ imageId: foreign.id, stage: 'after' }], steps: [{ on: daysFromToday(-9), description: 'x' }], version: tr.version });
    expect(res.status).toBe(400);
    expect(res.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['images.0.imageId', 'steps.0.on']);
  });
});

describe('object entries and acquisitions', () => {
  it('numbers entries E<year>.<n>, links an acquisition to its entry and the prints it accessioned; registrars only', async () => {
    const body = { enteredOn: '2025-05-06', depositor: 'Orla Fenwick', reason: 'possible_acquisition', objectCount: 2, objectsDescription: 'Two toned gelatin silver prints' };
    expect((await h.as('conservator').post('/api/object-entries', body)).status).toBe(403);
    expect((await h.as('viewer').get('/api/object-entries')).status).toBe(403);
    const a = await h.as('registrar').post('/api/object-entries', body);
    const b = await h.as('registrar').post('/api/object-entries', { ...body, depositor: 'Tamsin Reeve' });
    ok(a, 201);
    ok(b, 201);
    const na = Number(a.body.data.entryNumber.split('.')[1]);
    expect(a.body.data.entryNumber).toMatch(/^E2025\.\d{3,}$/);
    expect(b.body.data.entryNumber).toBe(`E2025.${String(na + 1).padStart(3, '0')}`);
    const bad = await h.as('registrar').post('/api/object-entries', { ...body, enteredOn: '2025-02-30', objectCount: 0 });
    expect(bad.status).toBe(400);
    const p = await h.newPrint();
    const acq = await h.as('registrar').post('/api/acquisitions', { entryId: a.body.data.id, source: 'Orla Fenwick', method: 'gift', approvedOn: '2025-06-02', acquiredOn: '2025-06-20', titleDocument: 'Deed of gift CR/DG/2025/04' });
    ok(acq, 201);
    const before = await h.as('registrar').post('/api/acquisitions', { entryId: a.body.data.id, source: 'x', method: 'gift', acquiredOn: '2025-05-01' });
    expect(before.status).toBe(400);
    const linked = await h.as('registrar').post(`/api/acquisitions/${acq.body.data.id}/prints`, { add: [p.id], version: acq.body.data.version });
    ok(linked);
    expect(linked.body.data.prints.map((x: { id: string }) => x.id)).toEqual([p.id]);
    const other = (await h.as('registrar').post('/api/acquisitions', { source: 'Harlow estate', method: 'bequest', acquiredOn: '2025-07-01' })).body.data;
    const twice = await h.as('registrar').post(`/api/acquisitions/${other.id}/prints`, { add: [p.id], version: other.version });
    expect(twice.status).toBe(400);
    expect((await h.as('researcher').get(`/api/prints/${p.id}/acquisition`)).body.data.id).toBe(acq.body.data.id);
    expect((await h.as('registrar').get(`/api/object-entries/${a.body.data.id}`)).body.data.acquisitions).toEqual([
      { id: acq.body.data.id, acquiredOn: '2025-06-20', method: 'gift', prints: 1 },
    ]);
  });
});

describe('voiding a measurement session', () => {
  const session = (spotId: string, measuredOn: string, L: number) => ({
    measuredOn, instrument: 'Spectrodensitometer', illuminant: 'D50', observer: '2', geometry: '45/0', condition: 'M1', readings: [{ spotId, readings: [{ L, a: 0.5, b: 2 }] }],
  });

  it('keeps the session, shows it voided, and leaves it out of the rate: the analysis equals that of a print never measured so', async () => {
    const c = h.as('conservator');
    const measured = async (withOutlier: boolean) => {
      const p = await h.newPrint();
      const spot = (await c.post(`/api/prints/${p.id}/measurement-spots`, { name: 'Dmax', purpose: 'dmax' })).body.data;
      for (const [on, L] of [['2019-01-10', 22], ['2021-01-10', 22.6], ['2023-01-10', 23.1]] as const) ok(await c.post(`/api/prints/${p.id}/measurement-sessions`, session(spot.id, on, L)), 201);
      const outlier = withOutlier ? (await c.post(`/api/prints/${p.id}/measurement-sessions`, session(spot.id, '2024-01-10', 35))).body.data : null;
      return { p, outlier };
    };
    const control = await measured(false);
    const voided = await measured(true);
    const rate = async (printId: string) => (await c.get(`/api/prints/${printId}/measurements`)).body.data;
    const withOutlier = await rate(voided.p.id);
    expect(withOutlier.spots[0].rate.slopePerYear).toBeGreaterThan((await rate(control.p.id)).spots[0].rate.slopePerYear * 2);
    expect((await h.as('registrar').post(`/api/measurement-sessions/${voided.outlier.id}/void`, { reason: 'Wrong aperture' })).status).toBe(403);
    expect((await c.post(`/api/measurement-sessions/${voided.outlier.id}/void`, { reason: 'x' })).status).toBe(400);
    const res = await c.post(`/api/measurement-sessions/${voided.outlier.id}/void`, { reason: 'Measured with the 8 mm aperture by mistake' });
    ok(res);
    expect(res.body.data.voided).toMatchObject({ reason: 'Measured with the 8 mm aperture by mistake' });
    expect((await c.post(`/api/measurement-sessions/${voided.outlier.id}/void`, { reason: 'Again and again' })).status).toBe(409);
    const after = await rate(voided.p.id);
    const ctl = await rate(control.p.id);
    expect(after.sessions).toHaveLength(4);
    expect(after.sessions.find((s: { id: string }) => s.id === voided.outlier.id).voided.reason).toBe('Measured with the 8 mm aperture by mistake');
    expect(after.spots[0].rate).toEqual(ctl.spots[0].rate);
    expect(after.spots[0].projection).toEqual(ctl.spots[0].projection);
    // Marked for rescheduling (and research outcomes), which the schedule job works off.
    const [{ n }] = await db().query<{ n: number }>('SELECT count(*)::int AS n FROM audit_events WHERE action = $1 AND entity_id = $2', { bind: ['measurement_session.voided', voided.outlier.id], type: 'SELECT' as never });
    expect(n).toBe(1);
  });

  it('voids a mistaken capture date, keeping it on record', async () => {
    const p = await h.newPrint();
    const image = await createImageRecord(p.id);
    await image.update({ capturedOn: '1993-04-02' });
    const res = await h.as('conservator').post(`/api/images/${image.id}/void-capture-date`, { reason: 'EXIF of the scanning back, not the capture', version: image.version });
    ok(res);
    expect(res.body.data.capturedOn).toBeNull();
    expect(res.body.data.voidedCaptureDates).toEqual([expect.objectContaining({ capturedOn: '1993-04-02', reason: 'EXIF of the scanning back, not the capture' })]);
    const list = (await h.as('researcher').get(`/api/prints/${p.id}/images`)).body.data;
    expect(list[0].voidedCaptureDates[0].capturedOn).toBe('1993-04-02');
    expect((await h.as('conservator').post(`/api/images/${image.id}/void-capture-date`, { reason: 'Nothing left to void', version: res.body.data.version })).status).toBe(409);
  });
});
