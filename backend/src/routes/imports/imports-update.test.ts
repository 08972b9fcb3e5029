import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { testApp, sessionFor } from '../../../test/app';
import { accession, createLocation, createRecipe } from '../../../test/factories';
import { AuditEventModel, Movement, Print, ProcessStep } from '../../models';
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

const post = (path: string, cookie = registrar) => supertest(t.app).post(path).set('Cookie', cookie).set('Origin', t.origin);
const get = (path: string, cookie = registrar) => supertest(t.app).get(path).set('Cookie', cookie);

async function check(prints: string, steps?: string) {
  let req = post('/api/imports').attach('file', Buffer.from(prints, 'utf8'), 'prints.csv');
  if (steps !== undefined) req = req.attach('steps', Buffer.from(steps, 'utf8'), 'steps.csv');
  const res = await req;
  expect(res.status).toBe(202);
  await settleImports();
  return (await get(`/api/imports/${res.body.data.id}`)).body.data;
}

async function commit(id: string, mode: 'create_only' | 'create_or_update') {
  const res = await post(`/api/imports/${id}/commit`).send({ mode });
  await settleImports();
  return { res, job: (await get(`/api/imports/${id}`)).body.data };
}

async function newPrint(extra: Record<string, unknown> = {}) {
  const res = await post('/api/prints').send({ accessionNumber: accession(), title: 'Quay steps', process: 'gelatin_silver_developing_out', ...extra });
  expect(res.status).toBe(201);
  return res.body.data as { id: string; accessionNumber: string; version: number };
}

describe('import: create or update by accession number', () => {
  it('the preview shows each row as a create or an update with its changes; create only refuses, create or update writes them like a form edit', async () => {
    const place = await createLocation();
    const existing = await newPrint({ status: 'in_store', inscriptions: 'Verso: pencil', locationId: place.id });
    const fresh = accession();
    const csv = [
      'accession_number,title,status,inscriptions',
      `${existing.accessionNumber},Quay steps at noon,on_loan,Verso: pencil`,
      `${fresh},A new one,,`,
    ].join('\n');
    const job = await check(csv);
    expect(job).toMatchObject({ status: 'ready', toCreate: 1, toUpdate: 1, unchanged: 0 });

    const rows = await get(`/api/imports/${job.id}/rows`);
    expect(rows.status).toBe(200);
    expect(rows.body.pagination.total).toBe(2);
    const [update, create] = rows.body.data;
    expect(create).toMatchObject({ row: 3, accessionNumber: fresh, action: 'create', changes: [] });
    expect(update).toMatchObject({ row: 2, action: 'update' });
    expect(update.changes).toEqual([
      { field: 'title', label: 'Title', before: 'Quay steps', after: 'Quay steps at noon' },
      { field: 'status', label: 'Status', before: 'in_store', after: 'on_loan' },
    ]);
    const onlyUpdates = await get(`/api/imports/${job.id}/rows?action=update`);
    expect(onlyUpdates.body.data.map((r: { row: number }) => r.row)).toEqual([2]);

    const refused = await commit(job.id, 'create_only');
    expect(refused.res.status).toBe(409);
    expect(refused.res.body.error.message).toMatch(/1 row matches a print already in the catalogue/);
    expect(refused.job.status).toBe('ready');
    expect(await Print.count({ where: { accessionNumber: fresh } })).toBe(0);

    const done = await commit(job.id, 'create_or_update');
    expect(done.res.status).toBe(202);
    expect(done.job).toMatchObject({ status: 'committed', createdPrints: 1, updatedPrints: 1, mode: 'create_or_update' });
    const print = (await get(`/api/prints/${existing.id}`)).body.data;
    expect(print).toMatchObject({ title: 'Quay steps at noon', status: 'on_loan', inscriptions: 'Verso: pencil', version: existing.version + 1 });
    expect(print.location.id).toBe(place.id);
    const audit = await AuditEventModel.findAll({ where: { entityId: existing.id, action: 'print.updated' } });
    expect(audit).toHaveLength(1);
    expect(audit[0].before).toMatchObject({ title: 'Quay steps', status: 'in_store' });
    expect(audit[0].after).toMatchObject({ title: 'Quay steps at noon', status: 'on_loan' });
    const history = (await get(`/api/prints/${existing.id}/history`)).body.data;
    expect(history[0].summary).toBe('Edited title, status');
  });

  it('a row that matches its print exactly is unchanged and writes nothing; a missing column leaves the field alone, an empty cell clears it', async () => {
    const p = await newPrint({ creditLine: 'Gift of the maker', provenance: 'The maker' });
    const job = await check(`accession_number,title,credit_line\n${p.accessionNumber},Quay steps,Gift of the maker\n`);
    expect(job).toMatchObject({ toCreate: 0, toUpdate: 0, unchanged: 1 });
    const cleared = await check(`accession_number,credit_line\n${p.accessionNumber},\n`);
    const [row] = (await get(`/api/imports/${cleared.id}/rows`)).body.data;
    expect(row.changes).toEqual([{ field: 'credit_line', label: 'Credit line', before: 'Gift of the maker', after: '' }]);
    await commit(cleared.id, 'create_or_update');
    expect(await Print.findByPk(p.id)).toMatchObject({ creditLine: null, provenance: 'The maker', title: 'Quay steps' });
  });

  it('a new location on an update is a movement, with its audit row', async () => {
    const from = await createLocation();
    const to = await createLocation();
    const p = await newPrint({ locationId: from.id });
    const job = await check(`accession_number,location\n${p.accessionNumber},${to.pathLabel}\n`);
    const [row] = (await get(`/api/imports/${job.id}/rows`)).body.data;
    expect(row.changes).toEqual([{ field: 'location', label: 'Location', before: from.pathLabel, after: to.pathLabel }]);
    await commit(job.id, 'create_or_update');
    const moves = await Movement.findAll({ where: { printId: p.id }, order: [['movedAt', 'ASC']] });
    expect(moves.map((m) => [m.fromLocationId, m.toLocationId])).toEqual([[null, from.id], [from.id, to.id]]);
    expect(await AuditEventModel.count({ where: { entityId: p.id, action: 'print.moved' } })).toBe(1);
    const gone = await check(`accession_number,location\n${p.accessionNumber},\n`);
    expect(gone.status).toBe('invalid');
    expect(gone.errors[0]).toMatchObject({ file: 'prints', row: 2, column: 'location' });
  });

  it('all or nothing: when a print changes between the check and the commit, nothing of the file is written', async () => {
    const p = await newPrint();
    const fresh = accession();
    const job = await check(`accession_number,title\n${p.accessionNumber},Renamed by the file\n${fresh},Also new\n`);
    expect(job.status).toBe('ready');
    const edit = await supertest(t.app).patch(`/api/prints/${p.id}`).set('Cookie', registrar).set('Origin', t.origin).send({ version: p.version, title: 'Renamed by a person' });
    expect(edit.status).toBe(200);
    const { job: failed } = await commit(job.id, 'create_or_update');
    expect(failed.status).toBe('failed');
    expect(failed.message).toMatch(/changed since the file was checked/);
    expect(await Print.count({ where: { accessionNumber: fresh } })).toBe(0);
    expect((await Print.findByPk(p.id))!.title).toBe('Renamed by a person');
  });

  it('403 for roles that may not write, 404 for an unknown import, 400 for an unknown action or mode', async () => {
    const job = await check(`accession_number,title\n${accession()},Checked\n`);
    expect((await get(`/api/imports/${job.id}/rows`, researcher)).status).toBe(403);
    expect((await supertest(t.app).get(`/api/imports/${job.id}/rows`)).status).toBe(401);
    expect((await get('/api/imports/00000000-0000-4000-8000-000000000000/rows')).status).toBe(404);
    const bad = await get(`/api/imports/${job.id}/rows?action=delete`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('query.action');
    const mode = await post(`/api/imports/${job.id}/commit`).send({ mode: 'replace_everything' });
    expect(mode.status).toBe(400);
    expect((await get(`/api/imports/${job.id}`)).body.data.status).toBe('ready');
  });
});

describe('import: process histories in the steps file', () => {
  it('replaces the steps of the prints that have rows in it, in step order, with recipes by name; warnings and toner classes follow', async () => {
    const recipe = await createRecipe();
    const p = await newPrint({ process: 'cyanotype' });
    await supertest(t.app).put(`/api/prints/${p.id}/steps`).set('Cookie', registrar).set('Origin', t.origin)
      .send({ version: p.version, steps: [{ type: 'washing', agent: 'Running water' }] });
    const fresh = accession();
    const prints = `accession_number,title,process\n${p.accessionNumber},Quay steps,cyanotype\n${fresh},Blue hour,cyanotype\n`;
    const steps = [
      'accession_number,step,type,agent,toner_class,recipe,time_seconds,alkaline',
      `${p.accessionNumber},2,after_bath,Borax 1%,,,1:30,yes`,
      `${p.accessionNumber},1,washing,Running water,,,600,`,
      `${fresh},1,toning,,iron_blue,${recipe.name.toUpperCase()},240,`,
    ].join('\n');
    const job = await check(prints, steps);
    expect(job.errors).toEqual([]);
    expect(job).toMatchObject({ toCreate: 1, toUpdate: 1, stepRows: 3, stepsFileName: 'steps.csv' });
    const [row] = (await get(`/api/imports/${job.id}/rows?action=update`)).body.data;
    expect(row.changes).toEqual([
      { field: 'steps.1.time_seconds', label: 'Step 1: Time (s)', before: '', after: '600' },
      { field: 'steps.2', label: 'Step 2', before: '', after: 'after_bath, Borax 1%, 90, yes' },
    ]);
    await commit(job.id, 'create_or_update');
    const updated = (await get(`/api/prints/${p.id}`)).body.data;
    expect(updated.steps.map((s: { type: string; timeSeconds: number }) => [s.type, s.timeSeconds])).toEqual([['washing', 600], ['after_bath', 90]]);
    expect(updated.warnings.map((w: { code: string }) => w.code)).toContain('alkaline_after_bath_on_iron_blue');
    expect(await AuditEventModel.count({ where: { entityId: p.id, action: 'print.steps_replaced' } })).toBe(2);
    const created = await Print.findOne({ where: { accessionNumber: fresh } });
    expect(created!.tonerClasses).toEqual(['iron_blue']);
    expect(await ProcessStep.findAll({ where: { printId: created!.id } })).toMatchObject([{ position: 1, recipeId: recipe.id, timeSeconds: 240 }]);
  });

  it('checks every step row: codes, step numbers, recipes, the step rules, and prints missing from the prints file', async () => {
    const a = accession();
    const steps = [
      'accession_number,step,type,toner_class,recipe',
      `${a},1,toning,,`,
      `${a},1,washing,,`,
      `${a},x,tintype,,No such recipe`,
      `${accession()},1,washing,,`,
    ].join('\n');
    const job = await check(`accession_number,title\n${a},With bad steps\n`, steps);
    expect(job.status).toBe('invalid');
    const where = job.errors.map((e: { file: string; row: number; column: string }) => `${e.file}:${e.row}:${e.column}`);
    expect(where).toEqual(expect.arrayContaining([
      'steps:2:toner_class', 'steps:3:step', 'steps:4:step', 'steps:4:type', 'steps:4:recipe', 'steps:5:accession_number',
    ]));
    expect(await Print.count({ where: { accessionNumber: a } })).toBe(0);
  });

  it('refuses a steps file without its key columns, and a second file that is not UTF-8', async () => {
    const job = await check(`accession_number,title\n${accession()},x\n`, 'type,agent\nwashing,water\n');
    expect(job.status).toBe('invalid');
    expect(job.message).toMatch(/needs the column accession_number/);
    const binary = await post('/api/imports').attach('file', Buffer.from('accession_number,title\n'), 'p.csv').attach('steps', Buffer.from([0xff, 0xfe, 0, 0x41]), 's.csv');
    expect(binary.status).toBe(415);
  });
});
