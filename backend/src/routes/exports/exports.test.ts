import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { parse } from 'csv-parse/sync';
import { ROLES, type Role } from '@toneledger/common/domain/roles';
import { EXPORT_NAMES } from '@toneledger/common/schemas/exports';
import { testApp, sessionFor } from '../../../test/app';
import { accession, createLocation } from '../../../test/factories';

const t = testApp();
const c = {} as Record<Role, string>;
beforeAll(async () => {
  for (const r of ROLES) c[r] = await sessionFor(t.app, r);
});
afterAll(() => t.close());

const get = (who: Role | null, url: string) => {
  const r = supertest(t.app).get(url).buffer(true).parse((res, done) => {
    const chunks: Buffer[] = [];
    res.on('data', (b: Buffer) => chunks.push(b));
    res.on('end', () => done(null, Buffer.concat(chunks).toString('utf8')));
  });
  return who ? r.set('Cookie', c[who]) : r;
};
const getJson = (who: Role, url: string) => supertest(t.app).get(url).set('Cookie', c[who]);
const post = (who: Role, url: string, body: object) => supertest(t.app).post(url).set('Origin', t.origin).set('Cookie', c[who]).send(body);

const BOM = '\uFEFF';
/** The CSV's rows as objects, after checking that it starts with the byte-order mark. */
function rowsOf(text: string): Record<string, string>[] {
  expect(text.startsWith(BOM)).toBe(true);
  return parse(text.slice(1), { columns: true }) as Record<string, string>[];
}
const headerOf = (text: string) => (parse(text.slice(1), { to_line: 1 }) as string[][])[0];

async function newPrint(process = 'gelatin_silver_developing_out') {
  const res = await post('registrar', '/api/prints', { accessionNumber: accession(), title: 'Breakwater in fog', process });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.data as { id: string; accessionNumber: string; version: number };
}
const sessionBody = (measuredOn: string, readings: object[]) => ({
  measuredOn, instrument: 'Spectrodensitometer, 4 mm aperture', illuminant: 'D50', observer: '2', geometry: '45/0', condition: 'M1', readings,
});

describe('readings export', () => {
  let print: { id: string; accessionNumber: string };
  let other: { id: string };
  beforeAll(async () => {
    print = await newPrint();
    // A spot name that a spreadsheet would run as a formula.
    const spot = await post('conservator', `/api/prints/${print.id}/measurement-spots`, { name: '=HYPERLINK("http://x.invalid","dmax")', purpose: 'dmax' });
    expect(spot.status, JSON.stringify(spot.body)).toBe(201);
    // Sharma, Wu & Dalal (2005), Table 1, pair 1: (50, 2.6772, −79.7751) against (50, 0, −82.7485) is ΔE00 2.0425; ΔE*ab 4.0011 (REFERENCES.md §1).
    const first = await post('conservator', `/api/prints/${print.id}/measurement-sessions`, sessionBody('2019-05-02', [{ spotId: spot.body.data.id, readings: [{ L: 50, a: 0, b: -82.7485 }] }]));
    expect(first.status, JSON.stringify(first.body)).toBe(201);
    const second = await post('conservator', `/api/prints/${print.id}/measurement-sessions`, sessionBody('2024-05-02', [{ spotId: spot.body.data.id, readings: [{ L: 50, a: 2.6772, b: -79.7751 }] }]));
    expect(second.status, JSON.stringify(second.body)).toBe(201);
    other = await newPrint('albumen');
    const s2 = await post('conservator', `/api/prints/${other.id}/measurement-spots`, { name: 'Margin', purpose: 'paper_base' });
    await post('conservator', `/api/prints/${other.id}/measurement-sessions`, sessionBody('2020-01-01', [{ spotId: s2.body.data.id, readings: [{ L: 90, a: 1, b: 8 }] }]));
  });

  it('is refused without a session and to a viewer; researchers may export', async () => {
    expect((await get(null, `/api/exports/readings.csv?printId=${print.id}`)).status).toBe(401);
    expect((await get('viewer', `/api/exports/readings.csv?printId=${print.id}`)).status).toBe(403);
    expect((await get('researcher', `/api/exports/readings.csv?printId=${print.id}`)).status).toBe(200);
  });

  it('writes one row per spot per session with ΔE00 against the baseline, BOM, ISO dates and the formula cell neutralised', async () => {
    const res = await get('conservator', `/api/exports/readings.csv?printId=${print.id}`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv; charset=utf-8/);
    const rows = rowsOf(res.body as string);
    expect(rows).toHaveLength(2);
    expect(rows.map((r) => r.measured_on)).toEqual(['2019-05-02', '2024-05-02']);
    expect(rows[0]).toMatchObject({ is_baseline: 'yes', delta_e00: '0', accession_number: print.accessionNumber });
    expect(Number(rows[1].delta_e00)).toBeCloseTo(2.0425, 4);
    expect(Number(rows[1].delta_e_ab)).toBeCloseTo(4.0011, 4);
    expect(rows[1].is_baseline).toBe('no');
    expect(rows[0].spot_name).toBe('\'=HYPERLINK("http://x.invalid","dmax")');
  });

  it('writes a voided session with its reason and leaves it out of the change against the baseline', async () => {
    const p = await newPrint();
    const spot = await post('conservator', `/api/prints/${p.id}/measurement-spots`, { name: 'Sky', purpose: 'dmax' });
    const ids = [];
    for (const [day, lab] of [['2018-01-02', { L: 50, a: 0, b: -82.7485 }], ['2021-01-02', { L: 60, a: 9, b: -60 }], ['2024-01-02', { L: 50, a: 2.6772, b: -79.7751 }]] as const) {
      const res = await post('conservator', `/api/prints/${p.id}/measurement-sessions`, sessionBody(day, [{ spotId: spot.body.data.id, readings: [lab] }]));
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      ids.push(res.body.data.id as string);
    }
    const voided = await post('conservator', `/api/measurement-sessions/${ids[1]}/void`, { reason: 'Readings taken through the glazing' });
    expect(voided.status, JSON.stringify(voided.body)).toBe(200);
    const rows = rowsOf((await get('conservator', `/api/exports/readings.csv?printId=${p.id}`)).body as string);
    expect(rows.map((r) => [r.measured_on, r.voided])).toEqual([['2018-01-02', 'no'], ['2021-01-02', 'yes'], ['2024-01-02', 'no']]);
    expect(rows[1]).toMatchObject({ void_reason: 'Readings taken through the glazing', delta_e00: '', comparable: '' });
    // Sharma et al. (2005) pair 1 again: the later session is still measured against the first.
    expect(Number(rows[2].delta_e00)).toBeCloseTo(2.0425, 4);
  });

  it('honours the filters of the list: one print, or a process', async () => {
    const mine = rowsOf((await get('conservator', `/api/exports/readings.csv?printId=${other.id}`)).body as string);
    expect(mine.map((r) => r.spot_name)).toEqual(['Margin']);
    const albumen = rowsOf((await get('conservator', '/api/exports/readings.csv?process=albumen')).body as string);
    expect(albumen.some((r) => r.print_id === other.id)).toBe(true);
    expect(albumen.some((r) => r.print_id === print.id)).toBe(false);
  });

  it('gives the JSON with the Getty AAT identifiers of the process and object type', async () => {
    const res = await get('conservator', `/api/exports/readings.json?printId=${print.id}`);
    expect(res.status).toBe(200);
    const doc = JSON.parse(res.body as string);
    expect(doc.prints).toHaveLength(1);
    // REFERENCES.md §8: gelatin silver prints 300128695, photographs 300046300.
    expect(doc.prints[0].linkedData).toMatchObject({ process: { id: '300128695' }, objectType: { id: '300046300' } });
    expect(doc.prints[0].spots[0].readings[1].deltaE00).toBeCloseTo(2.0425, 4);
  });

  it('404 for an unknown print, 400 for a bad id, before any file starts', async () => {
    expect((await get('conservator', '/api/exports/readings.csv?printId=00000000-0000-4000-8000-00000000000f')).status).toBe(404);
    const bad = await getJson('conservator', '/api/exports/readings.csv?printId=nope');
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('query.printId');
  });
});

describe('condition report, movement and loan exports', () => {
  it('condition reports: one row per observation; viewers refused; JSON leaves out an AAT id the references do not confirm', async () => {
    const p = await newPrint('cyanotype');
    const draft = await post('conservator', `/api/prints/${p.id}/condition-reports`, {
      examinedOn: '2025-03-14', context: 'outgoing_loan', grade: 'fair', summary: '+1 scuff near the corner',
      observations: [{ termCode: 'silver_mirroring', side: 'recto', area: 'image', extent: 'localised', severity: 'slight' }, { termCode: 'silver_mirroring', side: 'verso', area: 'edge', extent: 'scattered', severity: 'moderate' }],
    });
    expect(draft.status, JSON.stringify(draft.body)).toBe(201);
    expect((await get('viewer', `/api/exports/prints/${p.id}/condition-reports.csv`)).status).toBe(403);
    const res = await get('researcher', `/api/exports/prints/${p.id}/condition-reports.csv`);
    expect(res.status).toBe(200);
    const rows = rowsOf(res.body as string);
    expect(rows).toHaveLength(2);
    expect(rows[0]).toMatchObject({ examined_on: '2025-03-14', context: 'Outgoing loan', grade: 'Fair', observation: '1', side: 'Recto', summary: "'+1 scuff near the corner" });
    expect(rows[1]).toMatchObject({ observation: '2', severity: 'Moderate' });
    const json = JSON.parse((await get('researcher', `/api/exports/prints/${p.id}/condition-reports.json`)).body as string);
    expect(json.reports[0].observations).toHaveLength(2);
    expect(json.print.linkedData).toEqual({ objectType: expect.objectContaining({ id: '300046300' }), process: null });
    expect((await get('researcher', '/api/exports/prints/00000000-0000-4000-8000-00000000000f/condition-reports.csv')).status).toBe(404);
  });

  it('movements: staff only, ISO 8601 times, newest first', async () => {
    const p = await newPrint();
    const room = await createLocation();
    const moved = await post('registrar', `/api/prints/${p.id}/movements`, { toLocationId: room.id, reason: '-moved for survey', version: p.version });
    expect(moved.status, JSON.stringify(moved.body)).toBe(201);
    expect((await get('viewer', `/api/exports/prints/${p.id}/movements.csv`)).status).toBe(403);
    const rows = rowsOf((await get('researcher', `/api/exports/prints/${p.id}/movements.csv`)).body as string);
    expect(rows).toHaveLength(1);
    expect(rows[0].moved_at).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/);
    expect(rows[0]).toMatchObject({ to_location: room.pathLabel, reason: "'-moved for survey" });
  });

  it('loans: every role reads them; the list filters are honoured in the CSV and the JSON', async () => {
    const tag = accession().replace(/\W/g, '');
    const made = [];
    for (const [i, direction] of (['out', 'in'] as const).entries()) {
      const res = await post('registrar', '/api/loans', { direction, reference: `EXP-${tag}-${i}`, otherInstitution: '@Harrowgate Gallery', purpose: 'exhibition' });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      made.push(res.body.data);
    }
    expect((await get(null, '/api/exports/loans.csv')).status).toBe(401);
    const res = await get('viewer', `/api/exports/loans.csv?q=EXP-${tag}&direction=in`);
    expect(res.status).toBe(200);
    const rows = rowsOf(res.body as string);
    expect(rows.map((r) => r.reference)).toEqual([`EXP-${tag}-1`]);
    expect(rows[0]).toMatchObject({ direction: 'Loan in', status: 'Proposed', other_institution: "'@Harrowgate Gallery" });
    expect(rows[0].updated_at).toMatch(/Z$/);
    const all = rowsOf((await get('viewer', `/api/exports/loans.csv?q=EXP-${tag}`)).body as string);
    expect(all).toHaveLength(2);
    const json = JSON.parse((await get('viewer', `/api/exports/loans.json?q=EXP-${tag}`)).body as string);
    expect(json.loans.map((l: { reference: string }) => l.reference).sort()).toEqual([`EXP-${tag}-0`, `EXP-${tag}-1`]);
    expect(json.loans[0].objects).toEqual([]);
    const bad = await getJson('viewer', '/api/exports/loans.csv?status=lost');
    expect(bad.status).toBe(400);
  });
});

describe('data dictionaries', () => {
  it('list exactly the columns of each CSV, in order, each with a meaning and a source', async () => {
    const p = await newPrint();
    const files: Record<(typeof EXPORT_NAMES)[number], string> = {
      'condition-reports': `/api/exports/prints/${p.id}/condition-reports.csv`,
      readings: `/api/exports/readings.csv?printId=${p.id}`,
      movements: `/api/exports/prints/${p.id}/movements.csv`,
      loans: '/api/exports/loans.csv?q=nothing-matches-this',
      audit: '/api/audit/export.csv?from=2020-01-01&to=2020-01-02',
    };
    for (const name of EXPORT_NAMES) {
      const csv = await get('admin', files[name]);
      expect(csv.status, name).toBe(200);
      const dict = await getJson('viewer', `/api/exports/${name}/dictionary`);
      expect(dict.status).toBe(200);
      expect(dict.body.data.map((d: { column: string }) => d.column), name).toEqual(headerOf(csv.body as string));
      for (const d of dict.body.data) expect(d.meaning.length && d.source.length, `${name}.${d.column}`).toBeTruthy();
      const dictCsv = rowsOf((await get('viewer', `/api/exports/${name}/dictionary.csv`)).body as string);
      expect(dictCsv.map((r) => r.column)).toEqual(headerOf(csv.body as string));
      expect(Object.keys(dictCsv[0])).toEqual(['column', 'meaning', 'type', 'unit', 'source']);
    }
    expect((await getJson('viewer', '/api/exports/nothing/dictionary')).status).toBe(400);
    expect((await get(null, '/api/exports/loans/dictionary.csv')).status).toBe(401);
  });
});
