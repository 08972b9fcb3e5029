import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { parse } from 'csv-parse/sync';
import { testApp, sessionFor } from '../../../test/app';
import { accession } from '../../../test/factories';
import { DEMO_ACCOUNTS } from '../../seed/demo-accounts';
import { AuditEventModel } from '../../models';

const t = testApp();
let admin: string;
let registrar: string;
const registrarName = DEMO_ACCOUNTS.find((a) => a.role === 'registrar')!.name;
beforeAll(async () => {
  admin = await sessionFor(t.app, 'admin');
  registrar = await sessionFor(t.app, 'registrar');
});
afterAll(() => t.close());

const text = (req: supertest.Test) =>
  req.buffer(true).parse((res, done) => {
    const chunks: Buffer[] = [];
    res.on('data', (b: Buffer) => chunks.push(b));
    res.on('end', () => done(null, Buffer.concat(chunks).toString('utf8')));
  });

describe('the audit trail in people\'s words', () => {
  let printId: string;
  let number: string;
  beforeAll(async () => {
    number = accession();
    const made = await supertest(t.app).post('/api/prints').set('Cookie', registrar).set('Origin', t.origin).send({ accessionNumber: number, title: 'Quay at dusk', process: 'gelatin_silver_developing_out' });
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    printId = made.body.data.id;
    const steps = await supertest(t.app).put(`/api/prints/${printId}/steps`).set('Cookie', registrar).set('Origin', t.origin)
      .send({ version: made.body.data.version, steps: [{ type: 'toning', tonerClass: 'selenium', timeSeconds: 150 }] });
    expect(steps.status, JSON.stringify(steps.body)).toBe(200);
    const edit = await supertest(t.app).patch(`/api/prints/${printId}`).set('Cookie', registrar).set('Origin', t.origin).send({ version: steps.body.data.version, status: 'in_treatment' });
    expect(edit.status, JSON.stringify(edit.body)).toBe(200);
  });

  it('gives each event as a sentence and each change with its label and readable values', async () => {
    const res = await supertest(t.app).get(`/api/audit?entityType=print&entityId=${printId}`).set('Cookie', admin);
    expect(res.status).toBe(200);
    const byAction = Object.fromEntries(res.body.data.map((e: { action: string }) => [e.action, e]));
    expect(byAction['print.steps_replaced'].sentence).toBe(`${registrarName} replaced the process history of print ${number}.`);
    expect(byAction['print.steps_replaced'].actionLabel).toBe('Process history replaced');
    const stepChange = byAction['print.steps_replaced'].changes.find((c: { label: string }) => c.label === 'Process history');
    expect(stepChange.after).toMatch(/^1\. Toning, Selenium, 2:30/);
    const status = byAction['print.updated'].changes.find((c: { field: string }) => c.field === 'status');
    expect(status).toEqual({ field: 'status', label: 'Status', before: 'In store', after: 'In treatment' });
    expect(byAction['print.updated'].sentence).toBe(`${registrarName} edited print ${number}.`);
  });

  it('filters by day range (UTC days, both ends included) and refuses an impossible or reversed range', async () => {
    // The trail is append-only, so the old event is written with its time rather than moved back.
    await AuditEventModel.create({ actorId: null, actorName: 'Archive import', action: 'settings.updated', entityType: 'settings', entityId: `range-${number}`, at: new Date('2001-06-30T23:59:59Z'), before: null, after: null, requestId: null, ip: null });
    const inRange = await supertest(t.app).get(`/api/audit?entityId=range-${number}&from=2001-06-30&to=2001-06-30`).set('Cookie', admin);
    expect(inRange.body.data).toHaveLength(1);
    const after = await supertest(t.app).get(`/api/audit?entityId=range-${number}&from=2001-07-01`).set('Cookie', admin);
    expect(after.body.data).toHaveLength(0);
    const before = await supertest(t.app).get(`/api/audit?entityId=range-${number}&to=2001-06-29`).set('Cookie', admin);
    expect(before.body.data).toHaveLength(0);
    const reversed = await supertest(t.app).get('/api/audit?from=2024-02-01&to=2024-01-01').set('Cookie', admin);
    expect(reversed.status).toBe(400);
    expect(reversed.body.error.details[0].path).toBe('query.to');
    const impossible = await supertest(t.app).get('/api/audit?from=2024-02-30').set('Cookie', admin);
    expect(impossible.status).toBe(400);
    expect(impossible.body.error.details[0].path).toBe('query.from');
  });

  it('offers the people and the actions recorded as choices, actions by their labels', async () => {
    expect((await supertest(t.app).get('/api/audit/choices').set('Cookie', registrar)).status).toBe(403);
    const res = await supertest(t.app).get('/api/audit/choices').set('Cookie', admin);
    expect(res.status).toBe(200);
    expect(res.body.data.people.map((p: { name: string }) => p.name)).toContain(registrarName);
    expect(res.body.data.actions).toContainEqual({ code: 'print.steps_replaced', label: 'Process history replaced' });
    const codes = res.body.data.actions.map((a: { code: string }) => a.code);
    expect(new Set(codes).size).toBe(codes.length);
  });

  it('exports the filtered trail as CSV: BOM, one row per change, sentences, no internal codes; admins only', async () => {
    expect((await supertest(t.app).get('/api/audit/export.csv').set('Cookie', registrar)).status).toBe(403);
    const res = await text(supertest(t.app).get(`/api/audit/export.csv?entityType=print&entityId=${printId}&action=print.updated`).set('Cookie', admin));
    expect(res.status).toBe(200);
    const body = res.body as string;
    expect(body.startsWith('\uFEFF')).toBe(true);
    const rows = parse(body.slice(1), { columns: true }) as Record<string, string>[];
    expect(rows.length).toBeGreaterThan(0);
    expect(new Set(rows.map((r) => r.action))).toEqual(new Set(['Print edited']));
    expect(rows.find((r) => r.field === 'Status')).toMatchObject({ before: 'In store', after: 'In treatment', sentence: `${registrarName} edited print ${number}.` });
    expect(rows[0].at).toMatch(/^\d{4}-\d{2}-\d{2}T.*Z$/);
    // The record by its kind and name, and its id kept for matching (the screen shows only the first two).
    expect(rows.every((r) => r.record_type === 'Print' && r.record === number && r.record_id === printId)).toBe(true);
    expect(body).not.toMatch(/in_store|in_treatment/);
    const bad = await supertest(t.app).get('/api/audit/export.csv?from=2024-02-01&to=2024-01-01').set('Cookie', admin);
    expect(bad.status).toBe(400);
  });
});
