import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { parse } from 'csv-parse/sync';
import { ENTERED_PRINT_FIELDS } from '@toneledger/common/fields/print';
import { testApp, sessionFor } from '../../../test/app';
import { createEnclosure, createLocation, createPaper } from '../../../test/factories';
import { Maker, Print } from '../../models';
import { settleImports } from '../../services/import.service';

const t = testApp();
let registrar: string;
let researcher: string;
beforeAll(async () => {
  registrar = await sessionFor(t.app, 'registrar');
  researcher = await sessionFor(t.app, 'researcher');
});
afterAll(async () => {
  await settleImports();
  await t.close();
});

const upload = (csv: string, cookie = registrar, name = 'prints.csv') =>
  supertest(t.app).post('/api/imports').set('Cookie', cookie).set('Origin', t.origin).attach('file', Buffer.from(csv, 'utf8'), name);

async function finished(id: string) {
  await settleImports();
  const res = await supertest(t.app).get(`/api/imports/${id}`).set('Cookie', registrar);
  return res.body.data;
}

const base = () => `2096.${Date.now() % 100000}`;

describe('CSV import of prints', () => {
  it('401/403/415: needs a session, a registrar, and multipart', async () => {
    expect((await supertest(t.app).post('/api/imports').set('Origin', t.origin).attach('file', Buffer.from('a'), 'a.csv')).status).toBe(401);
    expect((await upload('accession_number,title,process\n', researcher)).status).toBe(403);
    const json = await supertest(t.app).post('/api/imports').set('Cookie', registrar).set('Origin', t.origin).send({ file: 'x' });
    expect(json.status).toBe(415);
    expect(json.body.error.code).toBe('unsupported_media_type');
  });

  it('a file with one bad row shows every problem by row and column, and writes nothing on commit attempts', async () => {
    const b = base();
    const csv = [
      'accession_number,title,process,date_made,toner_classes,maker',
      `${b}.1,Quay steps,gelatin_silver_developing_out,1962,selenium,Imported Maker ${b}`,
      `${b}.2,Gull on a post,tintype,1962-13,iron_blue;plum,`,
      `${b}.1,Same number again,cyanotype,,,`,
    ].join('\n');
    const res = await upload(csv);
    expect(res.status).toBe(202);
    const job = await finished(res.body.data.id);
    expect(job.status).toBe('invalid');
    expect(job.totalRows).toBe(3);
    const where = job.errors.map((e: { row: number; column: string }) => `${e.row}:${e.column}`);
    expect(where).toEqual(expect.arrayContaining(['3:process', '3:date_made', '3:toner_classes', '4:accession_number']));
    const commit = await supertest(t.app).post(`/api/imports/${job.id}/commit`).set('Cookie', registrar).set('Origin', t.origin).send({});
    expect(commit.status).toBe(409);
    expect(await Print.count({ where: { accessionNumber: `${b}.1` } })).toBe(0);
    expect(await Maker.count({ where: { name: `Imported Maker ${b}` } })).toBe(0);
  });

  it('a good file matches paper, location and enclosure by name, creates new makers, and commits all rows in one go', async () => {
    const b = base();
    const paper = await createPaper({ manufacturer: 'Fennick', product: `Lustre ${b}`, surface: 'pearl' });
    const building = await createLocation(`Depot ${b}`);
    const box = await createLocation('Box 3', building);
    const buffered = await createEnclosure({ name: `Buffered folder ${b}`, alkalineBuffered: true });
    const rows = [
      'accession_number,title,maker,date_made,process,paper,location,enclosure,toner_classes,image_width_mm,image_height_mm',
      `${b}.1,"Nets drying, Calder quay",Imported Printer ${b},1964/1969,gelatin_silver_developing_out,Fennick Lustre ${b}\\, pearl,Depot ${b} › Box 3,Buffered folder ${b},iron_blue,240,180`,
      `${b}.2,Ferry at dusk,Imported Printer ${b},197X,Gelatin silver\\, developing-out,,Depot ${b} > Box 3,,Selenium;gold,,`,
    ].map((l) => l.replace(/\\,/g, ','));
    // Quote the fields that contain commas.
    rows[1] = `${b}.1,"Nets drying, Calder quay",Imported Printer ${b},1964/1969,gelatin_silver_developing_out,"Fennick Lustre ${b}, pearl",Depot ${b} › Box 3,Buffered folder ${b},iron_blue,240,180`;
    rows[2] = `${b}.2,Ferry at dusk,Imported Printer ${b},197X,"Gelatin silver, developing-out",,Depot ${b} > Box 3,,Selenium;gold,,`;
    const res = await upload(rows.join('\r\n'));
    const job = await finished(res.body.data.id);
    expect(job.errors).toEqual([]);
    expect(job.status).toBe('ready');
    expect(job.newMakers).toEqual([`Imported Printer ${b}`]);
    // toner_classes made toning steps for these new prints, so it is not among the ignored columns.
    expect(job.ignoredColumns).toEqual([]);
    const commit = await supertest(t.app).post(`/api/imports/${job.id}/commit`).set('Cookie', registrar).set('Origin', t.origin).send({});
    expect(commit.status).toBe(202);
    const done = await finished(job.id);
    expect(done).toMatchObject({ status: 'committed', createdPrints: 2 });
    const p1 = await Print.findOne({ where: { accessionNumber: `${b}.1` } });
    expect(p1).toMatchObject({ paperId: paper.id, locationId: box.id, enclosureId: buffered.id, dateEarliest: '1964-01-01', dateLatest: '1969-12-31', tonerClasses: ['iron_blue'] });
    expect(p1!.warningCodes).toContain('prussian_blue_in_buffered_enclosure');
    const p2 = await Print.findOne({ where: { accessionNumber: `${b}.2` } });
    expect(p2!.tonerClasses).toEqual(['selenium', 'gold']);
    const detail = await supertest(t.app).get(`/api/prints/${p1!.id}`).set('Cookie', registrar);
    expect(detail.body.data.steps.map((s: { tonerClass: string }) => s.tonerClass)).toEqual(['iron_blue']);
    const again = await supertest(t.app).post(`/api/imports/${job.id}/commit`).set('Cookie', registrar).set('Origin', t.origin).send({});
    expect(again.status).toBe(409);
  });

  it('refuses unknown columns and a file that is not UTF-8 text', async () => {
    const cols = await upload('accession_number,title,process,colour\n1,2,3,4\n');
    const job = await finished(cols.body.data.id);
    expect(job.status).toBe('invalid');
    expect(job.message).toMatch(/Unknown columns: colour/);
    const binary = await upload(String.fromCharCode(0xff, 0xfe, 0, 0x41), registrar, 'x.csv');
    expect(binary.status).toBe(415);
  });

  it('the template has a note on every column (type, codes, default, who may read it), the header and an example row; file=steps gives the steps template', async () => {
    const res = await supertest(t.app).get('/api/imports/template.csv').set('Cookie', registrar);
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toMatch(/prints-import-template\.csv/);
    const records = parse(res.text, { relax_column_count: true }) as string[][];
    const notes = records.filter((r) => r[0].startsWith('#')).map((r) => r[0]);
    const [header, example] = records.filter((r) => !r[0].startsWith('#'));
    const entered = ENTERED_PRINT_FIELDS.map((f) => f.column);
    expect(header).toEqual(entered);
    expect(example).toHaveLength(entered.length);
    expect(example[header.indexOf('process')]).toBe('gelatin_silver_developing_out');
    for (const column of entered) expect(notes.some((n) => n.startsWith(`# ${column}:`)), column).toBe(true);
    expect(notes.find((n) => n.startsWith('# process:'))).toContain('cyanotype | albumen');
    expect(notes.find((n) => n.startsWith('# status:'))).toContain('Empty: in_store.');
    expect(notes.find((n) => n.startsWith('# staff_notes:'))).toMatch(/Read only by: Administrator \| Registrar \| Conservator \| Researcher\./);

    const steps = await supertest(t.app).get('/api/imports/template.csv?file=steps').set('Cookie', registrar);
    const stepRecords = (parse(steps.text, { relax_column_count: true }) as string[][]).filter((r) => !r[0].startsWith('#'));
    expect(stepRecords[0].slice(0, 3)).toEqual(['accession_number', 'step', 'type']);
    expect(stepRecords[1].slice(0, 3)).toEqual(['1987.14.3', '1', 'toning']);

    expect((await supertest(t.app).get('/api/imports/template.csv?file=colours').set('Cookie', registrar)).status).toBe(400);
    expect((await supertest(t.app).get('/api/imports/template.csv').set('Cookie', researcher)).status).toBe(403);
  });

  it('the template, filled in, imports: notes above the header are skipped', async () => {
    const template = (await supertest(t.app).get('/api/imports/template.csv').set('Cookie', registrar)).text;
    const records = parse(template, { relax_column_count: true }) as string[][];
    const header = records.find((r) => !r[0].startsWith('#'))!;
    const notes = template.split('\r\n').filter((line) => line.startsWith('#') || line.startsWith('"#'));
    const b = base();
    const row = header.map((c) => (c === 'accession_number' ? `${b}.1` : c === 'title' ? 'From the template' : ''));
    const res = await upload([...notes, header.join(','), row.join(',')].join('\r\n'));
    const job = await finished(res.body.data.id);
    expect(job.errors).toEqual([]);
    expect(job).toMatchObject({ status: 'ready', totalRows: 1, toCreate: 1 });
  });

  it('a rights column: a licence\'s deed page is kept as the licence URI, a sentence is refused by row and column; the template lists the choices', async () => {
    const b = base();
    const deed = 'https://creativecommons.org/licenses/by-nc/4.0/deed.en';
    const bad = await upload(`accession_number,title,rights\n${b}.1,Pier lamps,${deed}\n${b}.2,Pier lamps at dusk,Copyright the Trust\n`);
    const refused = await finished(bad.body.data.id);
    expect(refused.status).toBe('invalid');
    expect(refused.errors.map((e: { row: number; column: string }) => `${e.row}:${e.column}`)).toEqual(['3:rights']);
    expect(refused.errors[0].message).toMatch(/Creative Commons licence or a RightsStatements\.org statement/);
    const res = await upload(`accession_number,title,rights\n${b}.1,Pier lamps,${deed}\n${b}.2,Pier lamps at dusk,http://rightsstatements.org/vocab/InC-RUU/1.0/\n`);
    const job = await finished(res.body.data.id);
    expect(job.errors).toEqual([]);
    expect((await supertest(t.app).post(`/api/imports/${job.id}/commit`).set('Cookie', registrar).set('Origin', t.origin).send({ mode: 'create_only' })).status).toBe(202);
    expect(await finished(job.id)).toMatchObject({ status: 'committed', createdPrints: 2 });
    expect((await Print.findOne({ where: { accessionNumber: `${b}.1` } }))!.rights).toBe('http://creativecommons.org/licenses/by-nc/4.0/');
    expect((await Print.findOne({ where: { accessionNumber: `${b}.2` } }))!.rights).toBe('http://rightsstatements.org/vocab/InC-RUU/1.0/');
    const template = (await supertest(t.app).get('/api/imports/template.csv').set('Cookie', registrar)).text;
    expect(template).toMatch(/# rights: Rights statement\. Optional\. A rights statement URI .*http:\/\/rightsstatements\.org\/vocab\/UND\/1\.0\//);
  });

  it('accession number and title alone import: every other field takes its default', async () => {
    const b = base();
    const res = await upload(`accession_number,title\n${b}.1,Only the essentials\n`);
    const job = await finished(res.body.data.id);
    expect(job.errors).toEqual([]);
    const commit = await supertest(t.app).post(`/api/imports/${job.id}/commit`).set('Cookie', registrar).set('Origin', t.origin).send({ mode: 'create_only' });
    expect(commit.status).toBe(202);
    expect(await finished(job.id)).toMatchObject({ status: 'committed', createdPrints: 1 });
    const p = await Print.findOne({ where: { accessionNumber: `${b}.1` } });
    expect(p).toMatchObject({ title: 'Only the essentials', process: 'gelatin_silver_developing_out', status: 'in_store', makerId: null, locationId: null });
  });
});
