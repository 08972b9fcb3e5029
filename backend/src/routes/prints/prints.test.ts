import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { ROLES, type Role } from '@toneledger/common/domain/roles';
import { testApp, sessionFor } from '../../../test/app';
import { accession, createEnclosure, createLocation, createMaker, createPaper, createRecipe } from '../../../test/factories';
import { AuditEventModel, Print } from '../../models';

const t = testApp();
const c = {} as Record<Role, string>;
beforeAll(async () => {
  for (const r of ROLES) c[r] = await sessionFor(t.app, r);
});
afterAll(() => t.close());

const api = (role: Role | null) => ({
  get: (url: string) => (role ? supertest(t.app).get(url).set('Cookie', c[role]) : supertest(t.app).get(url)),
  post: (url: string, body?: object) => {
    const r = supertest(t.app).post(url).set('Origin', t.origin);
    return (role ? r.set('Cookie', c[role]) : r).send(body ?? {});
  },
  patch: (url: string, body: object) => {
    const r = supertest(t.app).patch(url).set('Origin', t.origin);
    return (role ? r.set('Cookie', c[role]) : r).send(body);
  },
  put: (url: string, body: object) => {
    const r = supertest(t.app).put(url).set('Origin', t.origin);
    return (role ? r.set('Cookie', c[role]) : r).send(body);
  },
  del: (url: string) => {
    const r = supertest(t.app).delete(url).set('Origin', t.origin);
    return role ? r.set('Cookie', c[role]) : r;
  },
});

async function newPrint(extra: Record<string, unknown> = {}) {
  const res = await api('registrar').post('/api/prints', { accessionNumber: accession(), title: 'Harbour wall at low tide', process: 'gelatin_silver_developing_out', ...extra });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.data;
}

describe('POST /api/prints', () => {
  it('401 without a session; 403 for researcher, conservator and viewer', async () => {
    const body = { accessionNumber: accession(), title: 'x', process: 'cyanotype' };
    expect((await api(null).post('/api/prints', body)).status).toBe(401);
    for (const role of ['researcher', 'conservator', 'viewer'] as const) {
      const res = await api(role).post('/api/prints', body);
      expect(res.status, role).toBe(403);
    }
    expect(await Print.count({ where: { accessionNumber: body.accessionNumber } })).toBe(0);
  });

  it('400 names each bad field: missing title, unknown process, bad EDTF, bad accession pattern', async () => {
    const res = await api('registrar').post('/api/prints', { accessionNumber: accession(), title: '', process: 'daguerreotype' });
    expect(res.status).toBe(400);
    const paths = res.body.error.details.map((d: { path: string }) => d.path);
    expect(paths).toEqual(expect.arrayContaining(['title', 'process']));

    const date = await api('registrar').post('/api/prints', { accessionNumber: accession(), title: 'x', process: 'cyanotype', dateMade: '1968-13' });
    expect(date.status).toBe(400);
    expect(date.body.error.details[0]).toMatchObject({ path: 'dateMade' });
    expect(date.body.error.details[0].message).toMatch(/month/i);

    const acc = await api('registrar').post('/api/prints', { accessionNumber: 'ABC-1', title: 'x', process: 'cyanotype' });
    expect(acc.status).toBe(400);
    expect(acc.body.error.details[0].path).toBe('accessionNumber');
    expect(acc.body.error.details[0].message).toMatch(/YYYY\.N\.N|1987\.14\.3/);
  });

  it('creates a print with EDTF dates parsed into a sortable range, and audits it', async () => {
    const maker = await createMaker();
    const p = await newPrint({ makerId: maker.id, dateMade: '1968-04~', imageWidthMm: '203', imageHeightMm: 254 });
    expect(p).toMatchObject({ maker: { id: maker.id, name: maker.name }, dateMade: '1968-04~', dateEarliest: '1968-04-01', dateLatest: '1968-04-30', imageWidthMm: 203, imageHeightMm: 254, status: 'in_store', version: 1 });
    expect(p.dateDisplay).toMatch(/April 1968/);
    const audit = await AuditEventModel.findOne({ where: { entityType: 'print', entityId: p.id, action: 'print.created' } });
    expect((audit?.after as { title: string }).title).toBe('Harbour wall at low tide');
  });

  it('409 for an accession number already in use, whatever its case', async () => {
    const a = accession();
    await newPrint({ accessionNumber: a });
    const res = await api('admin').post('/api/prints', { accessionNumber: a, title: 'Another', process: 'cyanotype' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('conflict');
    expect(res.body.error.details[0].path).toBe('accessionNumber');
  });

  it('400 for a reference that does not exist', async () => {
    const res = await api('registrar').post('/api/prints', { accessionNumber: accession(), title: 'x', process: 'cyanotype', makerId: '00000000-0000-4000-8000-000000000001' });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0]).toMatchObject({ path: 'makerId', message: 'No such maker' });
  });
});

describe('warnings', () => {
  it('an iron-blue toned print in a buffered enclosure is warned about, on the record and in the list', async () => {
    const buffered = await createEnclosure({ alkalineBuffered: true, patResult: 'passed' });
    const p = await newPrint({ enclosureId: buffered.id });
    expect(p.warnings).toEqual([]);
    const recipe = await createRecipe();
    const toned = await api('registrar').put(`/api/prints/${p.id}/steps`, {
      version: p.version,
      steps: [
        { type: 'development', agent: 'metol-hydroquinone', timeSeconds: 120, temperatureC: 20 },
        { type: 'fixing', agent: 'ammonium thiosulfate', timeSeconds: 60 },
        { type: 'washing', timeSeconds: 1800 },
        { type: 'toning', tonerClass: 'iron_blue', recipeId: recipe.id, dilution: '1+0', timeSeconds: 240, temperatureC: 20, extent: 'full' },
      ],
    });
    expect(toned.status, JSON.stringify(toned.body)).toBe(200);
    expect(toned.body.data.tonerClasses).toEqual(['iron_blue']);
    expect(toned.body.data.warnings.map((w: { code: string }) => w.code)).toContain('prussian_blue_in_buffered_enclosure');
    expect(toned.body.data.steps.map((s: { type: string }) => s.type)).toEqual(['development', 'fixing', 'washing', 'toning']);
    expect(toned.body.data.steps[3].recipe.name).toBe(recipe.name);

    const list = await api('viewer').get(`/api/prints?enclosureId=${buffered.id}&hasWarnings=true`);
    expect(list.body.data.map((x: { id: string }) => x.id)).toEqual([p.id]);
    expect(list.body.data[0].warningCodes).toContain('prussian_blue_in_buffered_enclosure');
  });

  it('an alkaline after-bath on an iron-blue print is warned about; changing the enclosure type updates stored warnings', async () => {
    const enc = await createEnclosure({ alkalineBuffered: false, patResult: 'passed' });
    const p = await newPrint({ enclosureId: enc.id });
    const res = await api('registrar').put(`/api/prints/${p.id}/steps`, {
      version: 1,
      steps: [
        { type: 'toning', tonerClass: 'iron_blue', timeSeconds: 300, extent: 'full' },
        { type: 'after_bath', agent: 'borax 1 %', concentration: '1 %', timeSeconds: 30 },
      ],
    });
    expect(res.body.data.warnings.map((w: { code: string }) => w.code)).toEqual(['alkaline_after_bath_on_iron_blue']);
    const upd = await api('registrar').patch(`/api/enclosures/${enc.id}`, { version: enc.version, alkalineBuffered: true });
    expect(upd.status).toBe(200);
    const row = await Print.findByPk(p.id);
    expect(row!.warningCodes).toContain('prussian_blue_in_buffered_enclosure');
  });

  it('a step list that breaks the step rules is refused with the step named', async () => {
    const p = await newPrint();
    const res = await api('registrar').put(`/api/prints/${p.id}/steps`, { version: 1, steps: [{ type: 'washing' }, { type: 'toning', timeSeconds: 10 }, { type: 'residual_thiosulfate_test', value: 0.01 }] });
    expect(res.status).toBe(400);
    const paths = res.body.error.details.map((d: { path: string }) => d.path);
    expect(paths).toEqual(expect.arrayContaining(['steps.1.tonerClass', 'steps.2.method']));
  });
});

describe('PATCH /api/prints/:id', () => {
  it('a registrar edits; a researcher cannot', async () => {
    const p = await newPrint();
    expect((await api('researcher').patch(`/api/prints/${p.id}`, { version: 1, title: 'No' })).status).toBe(403);
    const res = await api('registrar').patch(`/api/prints/${p.id}`, { version: 1, title: 'Harbour wall, evening' });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ title: 'Harbour wall, evening', version: 2 });
  });

  it('a stale edit gets 409 with the current record and who saved it; nothing is overwritten', async () => {
    const p = await newPrint();
    const first = await api('registrar').patch(`/api/prints/${p.id}`, { version: 1, title: 'Saved first' });
    expect(first.status).toBe(200);
    const second = await api('admin').patch(`/api/prints/${p.id}`, { version: 1, title: 'Saved second from an old form' });
    expect(second.status).toBe(409);
    expect(second.body.error.details.current).toMatchObject({ title: 'Saved first', version: 2 });
    expect(second.body.error.details.lastChangedBy).toBe('Maren Oakshott');
    expect((await Print.findByPk(p.id))!.title).toBe('Saved first');
  });

  it('404 for an unknown print, 400 for a missing version', async () => {
    expect((await api('registrar').patch('/api/prints/00000000-0000-4000-8000-000000000009', { version: 1, title: 'x' })).status).toBe(404);
    const p = await newPrint();
    const res = await api('registrar').patch(`/api/prints/${p.id}`, { title: 'x' });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('version');
  });

  it('the history shows who changed which field, before and after', async () => {
    const p = await newPrint();
    await api('registrar').patch(`/api/prints/${p.id}`, { version: 1, status: 'on_display' });
    const h = await api('researcher').get(`/api/prints/${p.id}/history`);
    expect(h.status).toBe(200);
    expect(h.body.data[0]).toMatchObject({ action: 'print.updated', actorName: 'Maren Oakshott', changes: [{ field: 'status', before: 'in_store', after: 'on_display' }] });
    expect(h.body.data.at(-1).action).toBe('print.created');
    expect((await api('viewer').get(`/api/prints/${p.id}/history`)).status).toBe(403);
  });
});

describe('restricted fields and movements', () => {
  it('viewers do not receive location, valuation or staff notes; staff do (the valuation: registrars and administrators only)', async () => {
    const building = await createLocation();
    const p = await newPrint({ locationId: building.id, staffNotes: 'Insured separately', valuationAmount: 1200, valuationCurrency: 'GBP' });
    const viewer = await api('viewer').get(`/api/prints/${p.id}`);
    expect(viewer.status).toBe(200);
    for (const k of ['location', 'staffNotes', 'valuationAmount', 'valuationCurrency']) expect(viewer.body.data, k).not.toHaveProperty(k);
    const researcher = await api('researcher').get(`/api/prints/${p.id}`);
    expect(researcher.body.data).toMatchObject({ location: { pathLabel: building.pathLabel }, staffNotes: 'Insured separately' });
    for (const role of ['researcher', 'conservator'] as const) {
      const staff = await api(role).get(`/api/prints/${p.id}`);
      expect(staff.body.data, role).toMatchObject({ location: { pathLabel: building.pathLabel }, staffNotes: 'Insured separately' });
      for (const k of ['valuationAmount', 'valuationCurrency']) expect(staff.body.data, `${role} ${k}`).not.toHaveProperty(k);
    }
    for (const role of ['registrar', 'admin'] as const) {
      const staff = await api(role).get(`/api/prints/${p.id}`);
      expect(staff.body.data, role).toMatchObject({ location: { pathLabel: building.pathLabel }, staffNotes: 'Insured separately', valuationAmount: 1200, valuationCurrency: 'GBP' });
    }
    const list = await api('viewer').get(`/api/prints?q=${encodeURIComponent(p.accessionNumber)}`);
    expect(list.body.data[0]).not.toHaveProperty('locationLabel');
    // Viewers cannot find a print by words that only its staff notes hold.
    const word = `zq${Date.now()}`;
    await api('registrar').patch(`/api/prints/${p.id}`, { version: 1, staffNotes: `Insured separately ${word}` });
    expect((await api('viewer').get(`/api/prints?q=${word}`)).body.pagination.total).toBe(0);
    expect((await api('registrar').get(`/api/prints?q=${word}`)).body.pagination.total).toBe(1);
  });

  it('moving a print records from, to, who and why, in order', async () => {
    const a = await createLocation();
    const box = await createLocation('Box 7', a);
    const p = await newPrint({ locationId: a.id });
    const moved = await api('registrar').post(`/api/prints/${p.id}/movements`, { toLocationId: box.id, reason: 'Rehoused after survey', version: 1 });
    expect(moved.status, JSON.stringify(moved.body)).toBe(201);
    expect(moved.body.data.location.pathLabel).toBe(`${a.pathLabel} › Box 7`);
    const list = await api('conservator').get(`/api/prints/${p.id}/movements`);
    expect(list.body.data.map((m: { to: { pathLabel: string } }) => m.to.pathLabel)).toEqual([box.pathLabel, a.pathLabel]);
    expect(list.body.data[0]).toMatchObject({ from: { pathLabel: a.pathLabel }, movedBy: 'Maren Oakshott', reason: 'Rehoused after survey' });
    expect((await api('viewer').get(`/api/prints/${p.id}/movements`)).status).toBe(403);
    const inside = await api('registrar').get(`/api/prints?locationId=${a.id}`);
    expect(inside.body.data.map((x: { id: string }) => x.id)).toContain(p.id);
  });
});

describe('GET /api/prints (the list)', () => {
  it('sorts accession numbers naturally, filters by toner class and date, pages', async () => {
    const maker = await createMaker();
    const base = `2098.${Date.now() % 100000}`;
    for (const [n, date] of [['2', '1955'], ['10', '1971?'], ['1', '196X']] as const) {
      await newPrint({ accessionNumber: `${base}.${n}`, makerId: maker.id, dateMade: date });
    }
    const sorted = await api('viewer').get(`/api/prints?makerId=${maker.id}&sort=accessionNumber`);
    expect(sorted.body.data.map((x: { accessionNumber: string }) => x.accessionNumber)).toEqual([`${base}.1`, `${base}.2`, `${base}.10`]);
    const byDate = await api('viewer').get(`/api/prints?makerId=${maker.id}&sort=-dateMade`);
    expect(byDate.body.data.map((x: { dateMade: string }) => x.dateMade)).toEqual(['1971?', '196X', '1955']);
    const sixties = await api('viewer').get(`/api/prints?makerId=${maker.id}&madeFrom=1960&madeTo=1969`);
    expect(sixties.body.data.map((x: { dateMade: string }) => x.dateMade)).toEqual(['196X']);
    const paged = await api('viewer').get(`/api/prints?makerId=${maker.id}&pageSize=2&page=2`);
    expect(paged.body.pagination).toEqual({ page: 2, pageSize: 2, total: 3 });
    expect(paged.body.data).toHaveLength(1);
  });

  it('full-text search finds by title words, maker, paper and accession prefix', async () => {
    const maker = await createMaker(`Ottoline Varga ${Date.now()}`);
    const paper = await createPaper({ manufacturer: 'Brennmoor', product: `Velvetine ${Date.now()}` });
    const p = await newPrint({ title: 'Gasometers under snow', makerId: maker.id, paperId: paper.id });
    for (const q of ['gasometer', 'Gasometers snow', 'Ottoline', 'velvetine', p.accessionNumber.slice(0, 7)]) {
      const res = await api('viewer').get(`/api/prints?q=${encodeURIComponent(q)}&pageSize=200`);
      expect(res.status).toBe(200);
      expect(res.body.data.map((x: { id: string }) => x.id), q).toContain(p.id);
    }
    const none = await api('viewer').get('/api/prints?q=' + encodeURIComponent('&|!:*()'));
    expect(none.status).toBe(200);
  });

  it('400 for an unknown sort or filter value', async () => {
    const res = await api('viewer').get('/api/prints?sort=colour&process=tintype');
    expect(res.status).toBe(400);
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toEqual(expect.arrayContaining(['query.sort', 'query.process']));
  });

  it('exports the filtered list as CSV; viewers get no location or staff-notes columns', async () => {
    const maker = await createMaker();
    await newPrint({ makerId: maker.id, title: 'Pier, "windy" day, 1961' });
    await newPrint({ makerId: maker.id });
    const staff = await api('registrar').get(`/api/prints/export.csv?makerId=${maker.id}`);
    expect(staff.status).toBe(200);
    expect(staff.headers['content-type']).toMatch(/text\/csv/);
    const lines = staff.text.trim().split(/\r?\n/);
    expect(lines).toHaveLength(3);
    expect(lines[0].split(',')).toEqual(expect.arrayContaining(['accession_number', 'location', 'staff_notes']));
    expect(staff.text).toContain('"Pier, ""windy"" day, 1961"');
    const viewer = await api('viewer').get(`/api/prints/export.csv?makerId=${maker.id}`);
    expect(viewer.text.split(/\r?\n/)[0].split(',')).not.toContain('location');
    expect(viewer.text.split(/\r?\n/)[0].split(',')).not.toContain('staff_notes');
    expect(lines[0].split(',')).toEqual(expect.arrayContaining(['valuation_amount', 'valuation_currency']));
    for (const role of ['researcher', 'conservator', 'viewer'] as const) {
      const header = (await api(role).get(`/api/prints/export.csv?makerId=${maker.id}`)).text.split(/\r?\n/)[0].split(',');
      expect(header, role).not.toContain('valuation_amount');
      expect(header, role).not.toContain('valuation_currency');
    }
  });

  it('exports one print as JSON with its process history', async () => {
    const p = await newPrint();
    const res = await api('researcher').get(`/api/prints/${p.id}/export.json`);
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toMatch(/attachment; filename="print-/);
    expect(res.body.print.id).toBe(p.id);
    expect(Array.isArray(res.body.history)).toBe(true);
  });
});

describe('DELETE /api/prints/:id', () => {
  it('keeps the whole record in the audit trail', async () => {
    const p = await newPrint({ inscriptions: 'Verso: pencil, "for M."' });
    expect((await api('viewer').del(`/api/prints/${p.id}?version=1`)).status).toBe(403);
    const res = await api('registrar').del(`/api/prints/${p.id}?version=1`);
    expect(res.status).toBe(200);
    expect(await Print.count({ where: { id: p.id } })).toBe(0);
    const audit = await AuditEventModel.findOne({ where: { entityId: p.id, action: 'print.deleted' } });
    expect((audit!.before as { inscriptions: string }).inscriptions).toBe('Verso: pencil, "for M."');
    expect((await api('registrar').get(`/api/prints/${p.id}`)).status).toBe(404);
  });
});
