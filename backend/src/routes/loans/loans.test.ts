import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { ROLES, type Role } from '@toneledger/common/domain/roles';
import { testApp, sessionFor } from '../../../test/app';
import { accession, createLocation } from '../../../test/factories';
import { db } from '../../db';
import { LoanStatusChange } from '../../models';

const t = testApp();
const c = {} as Record<Role, string>;

beforeAll(async () => {
  for (const r of ROLES) c[r] = await sessionFor(t.app, r);
});
afterAll(() => t.close());

const api = (who: Role | null) => {
  const withCookie = <R extends supertest.Test>(r: R) => (who ? r.set('Cookie', c[who]) : r);
  return {
    get: (url: string) => withCookie(supertest(t.app).get(url)),
    post: (url: string, body: object = {}, key?: string) => {
      const r = withCookie(supertest(t.app).post(url).set('Origin', t.origin));
      return (key ? r.set('Idempotency-Key', key) : r).send(body);
    },
    patch: (url: string, body: object) => withCookie(supertest(t.app).patch(url).set('Origin', t.origin)).send(body),
    put: (url: string, body: object) => withCookie(supertest(t.app).put(url).set('Origin', t.origin)).send(body),
    del: (url: string) => withCookie(supertest(t.app).delete(url).set('Origin', t.origin)),
  };
};

const UNKNOWN = '00000000-0000-4000-8000-00000000000f';
const paths = (res: { body: { error: { details: { path: string }[] } } }) => res.body.error.details.map((d) => d.path);
let refSeq = 0;
const ref = (prefix = 'LO') => `${prefix}-${Date.now().toString(36)}-${++refSeq}`;
const today = () => new Date().toISOString().slice(0, 10);

interface Detail {
  id: string; version: number; status: string; direction: string; reference: string;
  objects: { printId: string; insuranceValue?: number | null; currency?: string | null; outgoingReport: { id: string } | null; returningReport: { id: string } | null }[];
  blockers: { to: string; message: string; printIds: string[] }[];
  statusHistory: { from: string | null; to: string; on: string; note: string | null; by: { name: string } | null }[];
}

async function newPrint(locationId?: string) {
  const res = await api('registrar').post('/api/prints', {
    accessionNumber: accession(), title: 'Tide pools at dusk', process: 'gelatin_silver_developing_out', ...(locationId ? { locationId } : {}),
  });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.data as { id: string; accessionNumber: string; version: number; locationId?: string | null };
}

async function newLoan(body: Record<string, unknown> = {}) {
  const res = await api('registrar').post('/api/loans', {
    direction: 'out', reference: ref(), otherInstitution: 'Harrowgate Gallery of Light', purpose: 'exhibition', venue: 'Harrowgate, east wing',
    dispatchOn: '2031-03-01', opensOn: '2031-03-10', closesOn: '2031-06-10', returnOn: '2031-06-20', ...body,
  });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.data as Detail;
}

async function addObjects(loan: Detail, objects: Record<string, unknown>[]) {
  const res = await api('registrar').put(`/api/loans/${loan.id}/objects`, { objects, version: loan.version });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body.data as Detail;
}

async function step(loan: Detail, to: string, extra: Record<string, unknown> = {}) {
  return api('registrar').post(`/api/loans/${loan.id}/status`, { to, version: loan.version, ...extra });
}

async function stepOk(loan: Detail, to: string, extra: Record<string, unknown> = {}) {
  const res = await step(loan, to, extra);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body.data as Detail;
}

/** A condition report by the conservator, for the loan when given; signed unless asked for a draft. */
async function report(printId: string, context: string, loanId: string | null, sign = true) {
  const draft = await api('conservator').post(`/api/prints/${printId}/condition-reports`, {
    examinedOn: today(), context, grade: 'good', ...(loanId ? { loanId } : {}),
  });
  expect(draft.status, JSON.stringify(draft.body)).toBe(201);
  if (!sign) return draft.body.data;
  const signed = await api('conservator').post(`/api/condition-reports/${draft.body.data.id}/sign`, { version: draft.body.data.version });
  expect(signed.status, JSON.stringify(signed.body)).toBe(200);
  return signed.body.data;
}

/** A loan out with two prints, agreed. */
async function agreedLoan(prints: { id: string }[]) {
  let loan = await newLoan();
  loan = await addObjects(loan, prints.map((p, i) => ({ printId: p.id, insuranceValue: 1000 * (i + 1), currency: 'GBP' })));
  loan = await stepOk(loan, 'approved');
  return stepOk(loan, 'agreed');
}

describe('loans: access', () => {
  it('401 without a session; viewer, researcher and conservator cannot write (403); every role reads', async () => {
    expect((await api(null).get('/api/loans')).status).toBe(401);
    for (const r of ['viewer', 'researcher', 'conservator'] as const) {
      expect((await api(r).post('/api/loans', { direction: 'out', reference: ref(), otherInstitution: 'X', purpose: 'research' })).status).toBe(403);
      expect((await api(r).get('/api/loans')).status).toBe(200);
    }
    const loan = await newLoan();
    for (const r of ['viewer', 'researcher', 'conservator'] as const) {
      expect((await api(r).patch(`/api/loans/${loan.id}`, { notes: 'x', version: loan.version })).status).toBe(403);
      expect((await api(r).post(`/api/loans/${loan.id}/status`, { to: 'approved', version: loan.version })).status).toBe(403);
    }
    expect((await api('viewer').get(`/api/loans/${UNKNOWN}`)).status).toBe(404);
  });

  it('values: registrar and admin read them; conservator, researcher and viewer get no value keys, in JSON and CSV', async () => {
    const p = await newPrint();
    let loan = await newLoan();
    loan = await addObjects(loan, [{ printId: p.id, insuranceValue: 25000, currency: 'gbp' }]);
    for (const r of ['registrar', 'admin'] as const) {
      const res = await api(r).get(`/api/loans/${loan.id}`);
      expect(res.body.data.objects[0]).toMatchObject({ insuranceValue: 25000, currency: 'GBP' });
      const csv = await api(r).get(`/api/loans/${loan.id}/checklist.csv`);
      expect(csv.status).toBe(200);
      expect(csv.headers['content-type']).toMatch(/text\/csv/);
      const [header, row] = csv.text.trim().split('\n');
      expect(header.split(',')).toEqual(expect.arrayContaining(['insurance_value', 'currency']));
      expect(row).toContain('25000');
    }
    for (const r of ['conservator', 'researcher', 'viewer'] as const) {
      const res = await api(r).get(`/api/loans/${loan.id}`);
      expect(res.status).toBe(200);
      expect(res.body.data.objects[0]).not.toHaveProperty('insuranceValue');
      expect(res.body.data.objects[0]).not.toHaveProperty('currency');
      const csv = await api(r).get(`/api/loans/${loan.id}/checklist.csv`);
      expect(csv.status).toBe(200);
      expect(csv.text).not.toMatch(/insurance_value|currency|25000|GBP/);
      expect(csv.text).toContain(p.accessionNumber);
    }
  });

  it('the checklist neutralises a cell a spreadsheet would run as a formula (DEVELOPERS.md, CSV import and export)', async () => {
    const p = await newPrint();
    let loan = await newLoan({ otherInstitution: '=HYPERLINK("http://example.invalid","x")' });
    loan = await addObjects(loan, [{ printId: p.id, insuranceValue: 10, currency: 'EUR' }]);
    const csv = await api('registrar').get(`/api/loans/${loan.id}/checklist.csv`);
    const row = csv.text.trim().split('\n')[1];
    expect(row).toContain(`"'=HYPERLINK(""http://example.invalid"",""x"")"`);
    expect(row).not.toMatch(/,=HYPERLINK/);
  });
});

describe('loans: the list', () => {
  it('filters by words, direction, status and open; latest first', async () => {
    const word = `Quillmere${Date.now()}`;
    const a = await newLoan({ otherInstitution: `${word} Hall` });
    const b = await newLoan({ direction: 'in', otherInstitution: `${word} Hall`, purpose: 'research' });
    await stepOk(b, 'cancelled');
    const ids = async (qs: string) => ((await api('viewer').get(`/api/loans?q=${word}${qs}`)).body.data as { id: string }[]).map((l) => l.id);
    expect(await ids('')).toEqual([b.id, a.id]);
    expect(await ids('&direction=out')).toEqual([a.id]);
    expect(await ids('&status=cancelled')).toEqual([b.id]);
    expect(await ids('&open=true')).toEqual([a.id]);
    expect(await ids('&open=false')).toEqual([b.id]);
    const res = await api('viewer').get(`/api/loans?q=${word}&direction=sideways`);
    expect(res.status).toBe(400);
    expect(paths(res)).toContain('query.direction');
  });
});

describe('loans: input', () => {
  it('bad input is refused with the field named', async () => {
    const base = { direction: 'out', reference: ref(), otherInstitution: 'Harrowgate Gallery of Light', purpose: 'exhibition' };
    let res = await api('registrar').post('/api/loans', { ...base, opensOn: '2031-05-10', closesOn: '2031-05-01' });
    expect(res.status).toBe(400);
    expect(paths(res)).toContain('closesOn');
    res = await api('registrar').post('/api/loans', { ...base, reference: '' });
    expect(paths(res)).toContain('reference');
    res = await api('registrar').post('/api/loans', { ...base, conditions: { temperatureMinC: 20, temperatureMaxC: 16 } });
    expect(paths(res)).toContain('conditions.temperatureMaxC');
    res = await api('registrar').post('/api/loans', { ...base, otherInstitution: 'Gallery\u0000' });
    expect(res.status).toBe(400);
    expect(paths(res)).toContain('otherInstitution');

    const loan = await newLoan();
    const p = await newPrint();
    res = await api('registrar').put(`/api/loans/${loan.id}/objects`, { objects: [{ printId: p.id, insuranceValue: -5, currency: 'GBP' }], version: loan.version });
    expect(res.status).toBe(400);
    expect(paths(res)).toContain('objects.0.insuranceValue');
    res = await api('registrar').put(`/api/loans/${loan.id}/objects`, { objects: [{ printId: p.id, insuranceValue: 500, currency: 'POU' }], version: loan.version });
    expect(res.status).toBe(400);
    expect(paths(res)).toContain('objects.0.currency');
    res = await api('registrar').put(`/api/loans/${loan.id}/objects`, { objects: [{ printId: UNKNOWN }], version: loan.version });
    expect(res.status).toBe(400);
    expect(paths(res)).toContain('objects.0.printId');
    // An edit that puts the closing before the stored opening is refused on the whole record, not only the keys sent.
    res = await api('registrar').patch(`/api/loans/${loan.id}`, { closesOn: '2031-03-05', version: loan.version });
    expect(res.status).toBe(400);
    expect(paths(res)).toContain('closesOn');
  });

  it('the reference is unique in any case; the same Idempotency-Key gives the same loan', async () => {
    const reference = ref('DUP');
    const body = { direction: 'in', reference, otherInstitution: 'Museum of the Saltmarsh', purpose: 'research' };
    const first = await api('registrar').post('/api/loans', body, `key-${reference}`);
    expect(first.status).toBe(201);
    const again = await api('registrar').post('/api/loans', body, `key-${reference}`);
    expect(again.status).toBe(201);
    expect(again.headers['idempotent-replayed']).toBe('true');
    expect(again.body.data.id).toBe(first.body.data.id);
    const other = await api('registrar').post('/api/loans', { ...body, reference: reference.toLowerCase() });
    expect(other.status).toBe(409);
    expect(paths(other)).toContain('reference');
  });

  it('a stale edit is 409 with the loan as it is now', async () => {
    const loan = await newLoan();
    const ok = await api('registrar').patch(`/api/loans/${loan.id}`, { courier: 'Imogen Vask', version: loan.version });
    expect(ok.status).toBe(200);
    const stale = await api('registrar').patch(`/api/loans/${loan.id}`, { courier: 'Someone else', version: loan.version });
    expect(stale.status).toBe(409);
    expect(stale.body.error.details.current.courier).toBe('Imogen Vask');
  });
});

describe('loans: status order', () => {
  it('moves only to a next state (409 naming them); declined and cancelled end the loan; no agreement without prints', async () => {
    let loan = await newLoan();
    let res = await step(loan, 'agreed');
    expect(res.status).toBe(409);
    expect(res.body.error.details.allowed).toEqual(['approved', 'declined', 'cancelled']);
    expect(res.body.error.message).toMatch(/approved/);
    loan = await stepOk(loan, 'approved', { note: 'Board of 4 March' });
    res = await step(loan, 'agreed');
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/no prints/);
    loan = await stepOk(loan, 'declined');
    res = await step(loan, 'approved');
    expect(res.status).toBe(409);
    expect(res.body.error.details.allowed).toEqual([]);
    expect(loan.statusHistory.map((h) => h.to)).toEqual(['proposed', 'approved', 'declined']);
    expect(loan.statusHistory[1]).toMatchObject({ from: 'proposed', note: 'Board of 4 March', on: today() });

    const p = await newPrint();
    const cancelled = await stepOk(await agreedLoan([p]), 'cancelled');
    expect((await step(cancelled, 'in_transit')).status).toBe(409);
  });

  it('a step that has happened cannot be dated in the future; the changes are append-only at the database', async () => {
    const p = await newPrint();
    const loan = await agreedLoan([p]);
    await report(p.id, 'outgoing_loan', loan.id);
    const res = await step(loan, 'in_transit', { on: '2999-01-01' });
    expect(res.status).toBe(400);
    expect(paths(res)).toContain('on');
    await expect(LoanStatusChange.update({ note: 'changed' }, { where: { loanId: loan.id } })).rejects.toThrow(/append-only/);
    await expect(db().query(`DELETE FROM loan_status_changes WHERE loan_id = '${loan.id}'`)).rejects.toThrow(/append-only/);
  });
});

describe('loans: condition reports', () => {
  it('no dispatch without a signed outgoing report for this loan: a draft or a report for another loan does not count', async () => {
    const [a, b] = [await newPrint(), await newPrint()];
    let loan = await agreedLoan([a, b]);
    // The detail names what blocks the next step, before anyone tries it.
    expect(loan.blockers).toEqual([{ to: 'in_transit', message: '2 prints have no signed outgoing condition report for this loan.', printIds: [a.id, b.id] }]);
    const other = await newLoan({ dispatchOn: '2041-01-01', opensOn: null, closesOn: null, returnOn: '2041-02-01' });
    await addObjects(other, [{ printId: a.id }]);
    await report(a.id, 'outgoing_loan', other.id); // for another loan
    await report(b.id, 'outgoing_loan', loan.id, false); // a draft
    await report(b.id, 'outgoing_loan', null); // for no loan
    let res = await step(loan, 'in_transit');
    expect(res.status).toBe(409);
    expect(res.body.error.message).toBe('2 prints have no signed outgoing condition report for this loan.');
    expect(res.body.error.details.printIds.sort()).toEqual([a.id, b.id].sort());

    await report(a.id, 'outgoing_loan', loan.id);
    res = await step(loan, 'in_transit');
    expect(res.status).toBe(409);
    expect(res.body.error.message).toBe('1 print has no signed outgoing condition report for this loan.');
    expect(res.body.error.details.printIds).toEqual([b.id]);
    await report(b.id, 'outgoing_loan', loan.id);
    loan = await stepOk(loan, 'in_transit');
    expect(loan.objects.every((o) => o.outgoingReport !== null)).toBe(true);
    loan = await stepOk(loan, 'on_loan');
    res = await step(loan, 'returned');
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/no signed returning condition report/);
    await report(a.id, 'returning_loan', loan.id);
    await report(b.id, 'returning_loan', loan.id);
    loan = await stepOk(loan, 'returned');
    expect(loan.status).toBe('returned');
  });

  it("a report's loan must hold its print; the report names lender, borrower, venue, dates and conditions", async () => {
    const [a, b] = [await newPrint(), await newPrint()];
    let loan = await newLoan({ conditions: { maxLux: 50, rhMinPercent: 40, rhMaxPercent: 50, noAlkalineBufferedMounts: true } });
    loan = await addObjects(loan, [{ printId: a.id }]);
    const refused = await api('conservator').post(`/api/prints/${b.id}/condition-reports`, { examinedOn: today(), context: 'outgoing_loan', loanId: loan.id });
    expect(refused.status).toBe(400);
    expect(paths(refused)).toContain('loanId');
    const r = await report(a.id, 'outgoing_loan', loan.id, false);
    const settings = (await api('admin').get('/api/settings/catalogue')).body.data;
    expect(r.loan).toMatchObject({
      id: loan.id, direction: 'out', lender: settings.institutionName, borrower: 'Harrowgate Gallery of Light', venue: 'Harrowgate, east wing',
      dispatchOn: '2031-03-01', opensOn: '2031-03-10', closesOn: '2031-06-10', returnOn: '2031-06-20',
      conditions: { maxLux: 50, rhMinPercent: 40, rhMaxPercent: 50, noAlkalineBufferedMounts: true },
    });
    const plain = await report(a.id, 'routine', null, false);
    expect(plain.loan).toBeNull();
  });
});

describe('loans: no print in two loans at once', () => {
  it('refuses adding a print that is on an overlapping loan, naming the field and the print; a cancelled loan does not count', async () => {
    const p = await newPrint();
    const first = await newLoan({ dispatchOn: '2035-01-01', opensOn: null, closesOn: null, returnOn: '2035-03-01' });
    await addObjects(first, [{ printId: p.id }]);
    const second = await newLoan({ dispatchOn: '2035-02-15', opensOn: null, closesOn: null, returnOn: '2035-05-01' });
    const res = await api('registrar').put(`/api/loans/${second.id}/objects`, { objects: [{ printId: p.id }], version: second.version });
    expect(res.status).toBe(409);
    expect(res.body.error.details).toEqual([expect.objectContaining({ path: 'objects.0.printId', printId: p.id, code: 'overlap' })]);
    // Next to it (the day after the first comes back) is fine.
    const third = await newLoan({ dispatchOn: '2035-03-02', opensOn: null, closesOn: null, returnOn: '2035-04-01' });
    let after = await addObjects(third, [{ printId: p.id }]);
    // Moving its dispatch back onto the first loan is refused, naming the date.
    const moved = await api('registrar').patch(`/api/loans/${third.id}`, { dispatchOn: '2035-02-20', version: after.version });
    expect(moved.status).toBe(409);
    expect(paths(moved)).toEqual(['dispatchOn']);
    expect(moved.body.error.details[0].printId).toBe(p.id);
    // A loan with no return date is open-ended.
    const open = await newLoan({ dispatchOn: '2036-01-01', opensOn: null, closesOn: null, returnOn: null });
    await addObjects(open, [{ printId: p.id }]);
    const later = await newLoan({ dispatchOn: '2040-01-01', opensOn: null, closesOn: null, returnOn: '2040-02-01' });
    expect((await api('registrar').put(`/api/loans/${later.id}/objects`, { objects: [{ printId: p.id }], version: later.version })).status).toBe(409);
    // Once the open loan is cancelled it no longer counts.
    const openDetail = (await api('registrar').get(`/api/loans/${open.id}`)).body.data as Detail;
    await stepOk(openDetail, 'cancelled');
    after = await addObjects(later, [{ printId: p.id }]);
    expect(after.objects.map((o) => o.printId)).toEqual([p.id]);
  });
});

describe('loans: the print follows the loan', () => {
  it('dispatch puts each print on loan at the borrower; return brings it home and in store; movements and history show it', async () => {
    const home = await createLocation();
    const p = await newPrint(home.id);
    let loan = await agreedLoan([p]);
    await report(p.id, 'outgoing_loan', loan.id);
    loan = await stepOk(loan, 'in_transit', { on: today() });

    let print = (await api('registrar').get(`/api/prints/${p.id}`)).body.data;
    expect(print.status).toBe('on_loan');
    expect(print.location.pathLabel).toBe('Away on loan › Harrowgate Gallery of Light');
    let moves = (await api('registrar').get(`/api/prints/${p.id}/movements`)).body.data;
    expect(moves[0]).toMatchObject({ from: expect.objectContaining({ id: home.id }) });
    const history = (await api('registrar').get(`/api/prints/${p.id}/history`)).body.data as { action: string; summary: string }[];
    expect(history[0]).toMatchObject({ action: 'print.moved', summary: 'Moved to Away on loan › Harrowgate Gallery of Light' });

    // The status is the loan's: not set or cleared by hand while the print is away.
    let res = await api('registrar').patch(`/api/prints/${p.id}`, { status: 'in_store', version: print.version });
    expect(res.status).toBe(400);
    expect(paths(res)).toEqual(['status']);
    // Dates, conditions and prints are fixed once the loan has left.
    expect((await api('registrar').patch(`/api/loans/${loan.id}`, { returnOn: '2031-07-01', version: loan.version })).status).toBe(409);
    expect((await api('registrar').patch(`/api/loans/${loan.id}`, { conditions: { maxLux: 30 }, version: loan.version })).status).toBe(409);
    expect((await api('registrar').del(`/api/loans/${loan.id}/objects/${p.id}?version=${loan.version}`)).status).toBe(409);
    res = await api('registrar').patch(`/api/loans/${loan.id}`, { courier: 'Imogen Vask', version: loan.version });
    expect(res.status).toBe(200);
    loan = res.body.data;

    loan = await stepOk(loan, 'on_loan');
    await report(p.id, 'returning_loan', loan.id);
    loan = await stepOk(loan, 'returned');
    print = (await api('registrar').get(`/api/prints/${p.id}`)).body.data;
    expect(print.status).toBe('in_store');
    expect(print.location.id).toBe(home.id);
    moves = (await api('registrar').get(`/api/prints/${p.id}/movements`)).body.data;
    expect(moves).toHaveLength(3);
    expect(moves[0].to.id).toBe(home.id);
    expect(loan.statusHistory.map((h) => h.to)).toEqual(['proposed', 'approved', 'agreed', 'in_transit', 'on_loan', 'returned']);
  });

  it('a loan recorded after the fact keeps its proposal day and moves its prints on the day each step happened', async () => {
    const future = new Date(Date.now() + 3 * 86_400_000).toISOString().slice(0, 10);
    const refused = await api('registrar').post('/api/loans', {
      direction: 'out', reference: ref(), otherInstitution: 'Harrowgate Gallery of Light', purpose: 'research', proposedOn: future,
    });
    expect(refused.status).toBe(400);
    expect(paths(refused)).toEqual(['proposedOn']);

    const p = await newPrint((await createLocation()).id);
    let loan = await newLoan({ proposedOn: '2024-01-15', dispatchOn: null, opensOn: null, closesOn: null, returnOn: null });
    expect(loan.statusHistory[0]).toMatchObject({ to: 'proposed', on: '2024-01-15' });
    loan = await addObjects(loan, [{ printId: p.id }]);
    loan = await stepOk(loan, 'approved', { on: '2024-02-01' });
    loan = await stepOk(loan, 'agreed', { on: '2024-02-20' });
    await report(p.id, 'outgoing_loan', loan.id);
    loan = await stepOk(loan, 'in_transit', { on: '2024-03-04' });
    loan = await stepOk(loan, 'on_loan', { on: '2024-03-05' });
    await report(p.id, 'returning_loan', loan.id);
    loan = await stepOk(loan, 'returned', { on: '2024-06-28' });
    const moves = (await api('registrar').get(`/api/prints/${p.id}/movements`)).body.data as { movedAt: string; reason: string }[];
    // Newest first: back on the return day, out on the dispatch day, each at noon UTC of its day.
    expect(moves.filter((m) => m.reason.includes(loan.reference)).map((m) => m.movedAt)).toEqual(['2024-06-28T12:00:00.000Z', '2024-03-04T12:00:00.000Z']);
  });

  it('on loan cannot be set by hand on a print', async () => {
    const p = await newPrint();
    const res = await api('registrar').patch(`/api/prints/${p.id}`, { status: 'on_loan', version: p.version });
    expect(res.status).toBe(400);
    expect(paths(res)).toEqual(['status']);
  });

  it('a print may be taken off a loan before it leaves; a print on a loan cannot be deleted', async () => {
    const p = await newPrint();
    let loan = await newLoan();
    loan = await addObjects(loan, [{ printId: p.id }]);
    const del = await api('registrar').del(`/api/prints/${p.id}?version=${p.version}`);
    expect(del.status).toBe(409);
    expect(del.body.error.message).toMatch(/on a loan/);
    const res = await api('registrar').del(`/api/loans/${loan.id}/objects/${p.id}?version=${loan.version}`);
    expect(res.status).toBe(200);
    expect(res.body.data.objects).toEqual([]);
  });
});

describe('loans in: borrowed prints', () => {
  it("records a borrowed print with the lender's number (not the house pattern), hidden from the list unless asked", async () => {
    let loan = await newLoan({ direction: 'in', otherInstitution: 'Museum of the Saltmarsh', purpose: 'exhibition' });
    const number = `MSM/${Date.now()}-b`; // not in the default pattern YYYY.N.N
    const res = await api('registrar').post(`/api/loans/${loan.id}/borrowed-prints`, {
      print: { accessionNumber: number, title: 'Reed beds, borrowed', process: 'cyanotype' }, version: loan.version,
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.data).toMatchObject({ accessionNumber: number, borrowed: true });
    const printId = res.body.data.id;
    loan = (await api('registrar').get(`/api/loans/${loan.id}`)).body.data;
    expect(loan.objects).toEqual([expect.objectContaining({ printId, borrowed: true })]);
    // The same number through the ordinary create is checked against the pattern.
    expect((await api('registrar').post('/api/prints', { accessionNumber: `${number}x`, title: 'x', process: 'cyanotype' })).status).toBe(400);

    const q = encodeURIComponent(number);
    const collection = (await api('registrar').get(`/api/prints?q=${q}`)).body;
    expect(collection.data).toEqual([]);
    const borrowed = (await api('registrar').get(`/api/prints?q=${q}&holding=borrowed`)).body;
    expect(borrowed.data.map((r: { id: string }) => r.id)).toEqual([printId]);
    const all = (await api('registrar').get(`/api/prints?q=${q}&holding=all`)).body;
    expect(all.data.map((r: { id: string }) => r.id)).toEqual([printId]);

    // Arrival needs a signed incoming report for this loan; sending back a signed outgoing one.
    loan = await stepOk(await stepOk(await stepOk(loan, 'approved'), 'agreed'), 'in_transit');
    let st = await step(loan, 'on_loan');
    expect(st.status).toBe(409);
    expect(st.body.error.message).toMatch(/no signed incoming condition report/);
    await report(printId, 'incoming', loan.id);
    loan = await stepOk(loan, 'on_loan');
    st = await step(loan, 'returned');
    expect(st.body.error.message).toMatch(/no signed outgoing condition report/);
    await report(printId, 'outgoing_loan', loan.id);
    const r = (await api('conservator').get(`/api/prints/${printId}/condition-reports`)).body.data[0];
    expect(r.loan).toMatchObject({ lender: 'Museum of the Saltmarsh', borrower: expect.any(String) });
    expect(r.loan.borrower).not.toBe('Museum of the Saltmarsh');
    await stepOk(loan, 'returned');
  });

  it('a loan out holds no borrowed prints', async () => {
    const loan = await newLoan();
    const res = await api('registrar').post(`/api/loans/${loan.id}/borrowed-prints`, {
      print: { accessionNumber: 'X-1', title: 'x', process: 'cyanotype' }, version: loan.version,
    });
    expect(res.status).toBe(409);
  });
});
