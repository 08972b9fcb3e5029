import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { parse } from 'csv-parse/sync';
import { ROLES, type Role } from '@toneledger/common/domain/roles';
import { testApp, sessionFor } from '../../../test/app';
import { accession, createMaker } from '../../../test/factories';
import { settleImports } from '../../services/import.service';
import { Print } from '../../models';

const t = testApp();
const c = {} as Record<Role, string>;
beforeAll(async () => {
  for (const r of ROLES) c[r] = await sessionFor(t.app, r);
});
afterAll(async () => {
  await settleImports();
  await t.close();
});

const get = (role: Role, url: string) => supertest(t.app).get(url).set('Cookie', c[role]);
const post = (role: Role, url: string, body: object) => supertest(t.app).post(url).set('Cookie', c[role]).set('Origin', t.origin).send(body);
const patch = (role: Role, url: string, body: object) => supertest(t.app).patch(url).set('Cookie', c[role]).set('Origin', t.origin).send(body);

/** Who may read a valuation, and who may not (but may read staff notes, or not even those). */
const READERS = ['admin', 'registrar'] as const;
const STAFF_WITHOUT = ['conservator', 'researcher'] as const;
const OTHERS = [...STAFF_WITHOUT, 'viewer'] as const;

/** An amount no other field of the print holds, to look for in every output. */
const AMOUNT = 73519;
const LATER = 81247;

async function valuedPrint(maker?: string) {
  const res = await post('registrar', '/api/prints', {
    accessionNumber: accession(), title: 'Breakwater in fog', process: 'gelatin_silver_developing_out',
    staffNotes: 'Insured separately', valuationAmount: AMOUNT, valuationCurrency: 'GBP', ...(maker ? { makerId: maker } : {}),
  });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.data as { id: string; accessionNumber: string; version: number };
}

describe('valuations are read by registrars and administrators only', () => {
  it('GET /api/prints/:id: the valuation for admin and registrar; not for conservator, researcher or viewer', async () => {
    const p = await valuedPrint();
    for (const role of READERS) {
      const res = await get(role, `/api/prints/${p.id}`);
      expect(res.status).toBe(200);
      expect(res.body.data, role).toMatchObject({ valuationAmount: AMOUNT, valuationCurrency: 'GBP', staffNotes: 'Insured separately' });
    }
    for (const role of OTHERS) {
      const res = await get(role, `/api/prints/${p.id}`);
      expect(res.status).toBe(200);
      for (const k of ['valuationAmount', 'valuationCurrency']) expect(res.body.data, `${role} ${k}`).not.toHaveProperty(k);
      expect(res.text, role).not.toContain(String(AMOUNT));
    }
    // Conservators and researchers still read staff notes.
    for (const role of STAFF_WITHOUT) expect((await get(role, `/api/prints/${p.id}`)).body.data.staffNotes, role).toBe('Insured separately');
  });

  it('the JSON export of a print: the valuation and its history for admin and registrar only', async () => {
    const p = await valuedPrint();
    expect((await patch('registrar', `/api/prints/${p.id}`, { version: p.version, valuationAmount: LATER, title: 'Breakwater in thick fog' })).status).toBe(200);
    for (const role of READERS) {
      const res = await get(role, `/api/prints/${p.id}/export.json`);
      expect(res.status).toBe(200);
      expect(res.body.print, role).toMatchObject({ valuationAmount: LATER, valuationCurrency: 'GBP' });
      expect(res.body.history[0].changes, role).toEqual(expect.arrayContaining([{ field: 'valuationAmount', before: AMOUNT, after: LATER }]));
    }
    for (const role of OTHERS) {
      const res = await get(role, `/api/prints/${p.id}/export.json`);
      expect(res.status).toBe(200);
      expect(res.body.print, role).not.toHaveProperty('valuationAmount');
      expect(res.body.print, role).not.toHaveProperty('valuationCurrency');
      expect(res.text, role).not.toContain(String(AMOUNT));
      expect(res.text, role).not.toContain(String(LATER));
      expect(res.text, role).not.toContain('valuation');
    }
    for (const role of STAFF_WITHOUT) {
      const res = await get(role, `/api/prints/${p.id}/export.json`);
      expect(res.body.history[0], role).toMatchObject({ action: 'print.updated', summary: 'Edited title', changes: [{ field: 'title' }] });
    }
  });

  it('the CSV export: valuation columns (header and cells) for admin and registrar only', async () => {
    const maker = await createMaker();
    await valuedPrint(maker.id);
    for (const role of READERS) {
      const res = await get(role, `/api/prints/export.csv?makerId=${maker.id}`);
      expect(res.status).toBe(200);
      const [header, row] = parse(res.text) as string[][];
      expect(header, role).toEqual(expect.arrayContaining(['valuation_amount', 'valuation_currency', 'staff_notes']));
      expect(row[header.indexOf('valuation_amount')], role).toBe(String(AMOUNT));
      expect(row[header.indexOf('valuation_currency')], role).toBe('GBP');
    }
    for (const role of OTHERS) {
      const res = await get(role, `/api/prints/export.csv?makerId=${maker.id}`);
      expect(res.status).toBe(200);
      const [header, row] = parse(res.text) as string[][];
      expect(header, role).not.toContain('valuation_amount');
      expect(header, role).not.toContain('valuation_currency');
      expect(row, role).toHaveLength(header.length);
      expect(res.text, role).not.toContain(String(AMOUNT));
    }
    for (const role of STAFF_WITHOUT) expect((parse((await get(role, `/api/prints/export.csv?makerId=${maker.id}`)).text) as string[][])[0], role).toContain('staff_notes');
  });

  it('the history and the timeline: a valuation change, before and after, for admin and registrar only', async () => {
    const p = await valuedPrint();
    expect((await patch('registrar', `/api/prints/${p.id}`, { version: p.version, valuationAmount: LATER })).status).toBe(200);
    expect((await patch('registrar', `/api/prints/${p.id}`, { version: p.version + 1, status: 'on_display', valuationCurrency: 'EUR' })).status).toBe(200);
    for (const role of READERS) {
      const h = await get(role, `/api/prints/${p.id}/history`);
      expect(h.status).toBe(200);
      expect(h.body.data[0].changes, role).toEqual(expect.arrayContaining([{ field: 'valuationCurrency', before: 'GBP', after: 'EUR' }]));
      expect(h.body.data[1], role).toMatchObject({ summary: 'Edited valuationAmount', changes: [{ field: 'valuationAmount', before: AMOUNT, after: LATER }] });
    }
    for (const role of STAFF_WITHOUT) {
      const h = await get(role, `/api/prints/${p.id}/history`);
      expect(h.status).toBe(200);
      expect(h.body.data[0], role).toMatchObject({ action: 'print.updated', summary: 'Edited status', changes: [{ field: 'status', before: 'in_store', after: 'on_display' }] });
      expect(h.body.data[0].changes, role).toHaveLength(1);
      expect(h.body.data[1], role).toMatchObject({ action: 'print.updated', summary: 'Record edited', changes: [] });
      expect(h.text, role).not.toMatch(/valuation|GBP|EUR/);
      expect(h.text, role).not.toContain(String(AMOUNT));
      const timeline = await get(role, `/api/prints/${p.id}/timeline`);
      expect(timeline.status).toBe(200);
      expect(timeline.text, role).not.toMatch(/valuation/i);
      expect(timeline.body.data.map((e: { title: string }) => e.title), role).toContain('Edited status');
    }
    const timeline = await get('registrar', `/api/prints/${p.id}/timeline`);
    expect(timeline.body.data.map((e: { title: string }) => e.title)).toContain('Edited valuationAmount');
    expect((await get('viewer', `/api/prints/${p.id}/history`)).status).toBe(403);
  });

  it('an edit that does not send the valuation leaves it as it was', async () => {
    const p = await valuedPrint();
    const res = await patch('registrar', `/api/prints/${p.id}`, { version: p.version, title: 'Breakwater, evening' });
    expect(res.status).toBe(200);
    const row = await Print.findByPk(p.id);
    expect(row!.title).toBe('Breakwater, evening');
    expect(row!.valuationAmount).toBe(AMOUNT);
    expect(row!.valuationCurrency).toBe('GBP');
  });

  it('the import template and the field notes say who may read a valuation', async () => {
    const res = await get('registrar', '/api/imports/template.csv');
    const notes = (parse(res.text, { relax_column_count: true }) as string[][]).map((r) => r[0]).filter((n) => n.startsWith('#'));
    for (const column of ['valuation_amount', 'valuation_currency']) {
      expect(notes.find((n) => n.startsWith(`# ${column}:`)), column).toMatch(/Read only by: Administrator \| Registrar\./);
    }
  });
});

describe('a valuation currency is an ISO 4217 code', () => {
  const create = (valuationCurrency: string) =>
    post('registrar', '/api/prints', { accessionNumber: accession(), title: 'Slipway', process: 'gelatin_silver_developing_out', valuationAmount: 500, valuationCurrency });

  it('refuses POU ("pounds") and XXX ("no currency") with the field named; takes EUR; takes gbp as GBP', async () => {
    for (const bad of ['POU', 'XXX', 'pounds']) {
      const res = await create(bad);
      expect(res.status, bad).toBe(400);
      expect(res.body.error.details, bad).toEqual([expect.objectContaining({ path: 'valuationCurrency', message: `"${bad.toUpperCase()}" is not an ISO 4217 currency code (such as GBP, EUR or USD)` })]);
    }
    const eur = await create('EUR');
    expect(eur.status).toBe(201);
    expect(eur.body.data.valuationCurrency).toBe('EUR');
    const gbp = await create('gbp');
    expect(gbp.status).toBe(201);
    expect(gbp.body.data.valuationCurrency).toBe('GBP');
    expect((await Print.findByPk(gbp.body.data.id))!.valuationCurrency).toBe('GBP');
    const edit = await patch('registrar', `/api/prints/${eur.body.data.id}`, { version: eur.body.data.version, valuationCurrency: 'POU' });
    expect(edit.status).toBe(400);
    expect(edit.body.error.details[0].path).toBe('valuationCurrency');
  });

  it('the CSV import refuses an unknown code in valuation_currency, naming the column, and reads gbp as GBP', async () => {
    const b = `2093.${Date.now() % 100000}`;
    const csv = [
      'accession_number,title,valuation_amount,valuation_currency',
      `${b}.1,Lock gates,1200,POU`,
      `${b}.2,Lock gates again,1200,XXX`,
      `${b}.3,Canal basin,1200,gbp`,
      `${b}.4,Canal basin again,1200,EUR`,
    ].join('\n');
    const res = await supertest(t.app).post('/api/imports').set('Cookie', c.registrar).set('Origin', t.origin).attach('file', Buffer.from(csv, 'utf8'), 'prints.csv');
    expect(res.status).toBe(202);
    await settleImports();
    const job = (await get('registrar', `/api/imports/${res.body.data.id}`)).body.data;
    expect(job.status).toBe('invalid');
    expect(job.errors).toEqual([
      expect.objectContaining({ row: 2, column: 'valuation_currency', value: 'POU', message: '"POU" is not an ISO 4217 currency code (such as GBP, EUR or USD)' }),
      expect.objectContaining({ row: 3, column: 'valuation_currency', value: 'XXX', message: '"XXX" is not an ISO 4217 currency code (such as GBP, EUR or USD)' }),
    ]);

    const good = [csv.split('\n')[0], `${b}.3,Canal basin,1200,gbp`, `${b}.4,Canal basin again,1200,EUR`].join('\n');
    const ok = await supertest(t.app).post('/api/imports').set('Cookie', c.registrar).set('Origin', t.origin).attach('file', Buffer.from(good, 'utf8'), 'prints.csv');
    await settleImports();
    const checked = (await get('registrar', `/api/imports/${ok.body.data.id}`)).body.data;
    expect(checked.errors).toEqual([]);
    expect((await post('registrar', `/api/imports/${checked.id}/commit`, {})).status).toBe(202);
    await settleImports();
    expect((await Print.findOne({ where: { accessionNumber: `${b}.3` } }))!.valuationCurrency).toBe('GBP');
    expect((await Print.findOne({ where: { accessionNumber: `${b}.4` } }))!.valuationCurrency).toBe('EUR');
  });
});
