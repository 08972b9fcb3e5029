import { Writable } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { pino } from 'pino';
import { Op } from 'sequelize';
import { testApp, sessionFor } from '../../../test/app';
import { createMaker, createPaper } from '../../../test/factories';
import { buildApp } from '../../app';
import { db } from '../../db';
import { Maker, Print } from '../../models';
import { settleImports } from '../../services/import.service';

const t = testApp();
let registrar: string;
beforeAll(async () => {
  registrar = await sessionFor(t.app, 'registrar');
});
afterAll(async () => {
  await settleImports();
  await t.close();
});

const upload = (csv: string, app = t.app) =>
  supertest(app).post('/api/imports').set('Cookie', registrar).set('Origin', t.origin).attach('file', Buffer.from(csv, 'utf8'), 'prints.csv');

async function finished(id: string) {
  await settleImports();
  return (await supertest(t.app).get(`/api/imports/${id}`).set('Cookie', registrar)).body.data;
}

async function checkedAndCommitted(csv: string, app = t.app) {
  const job = await finished((await upload(csv, app)).body.data.id);
  expect(job.errors).toEqual([]);
  expect(job.status).toBe('ready');
  const commit = await supertest(app).post(`/api/imports/${job.id}/commit`).set('Cookie', registrar).set('Origin', t.origin).send({});
  expect(commit.status).toBe(202);
  return { requestId: commit.headers['x-request-id'] as string | undefined, job: await finished(job.id) };
}

const base = () => `2095.${Date.now() % 100000}`;

describe('committing an import', () => {
  it('stores a matched paper by its id and its label as the catalogue writes it, whatever the case and spacing typed', async () => {
    const b = base();
    const paper = await createPaper({ manufacturer: 'Fennick', product: `Lustre ${b}`, surface: 'pearl' });
    const csv = [
      'accession_number,title,paper',
      `${b}.1,Typed in capitals,"FENNICK LUSTRE ${b}, PEARL"`,
      `${b}.2,Typed with spaces,"  fennick lustre ${b}, pearl "`,
    ].join('\r\n');
    const { job } = await checkedAndCommitted(csv);
    expect(job).toMatchObject({ status: 'committed', createdPrints: 2 });
    for (const n of [1, 2]) {
      const p = await Print.findOne({ where: { accessionNumber: `${b}.${n}` } });
      expect(p).toMatchObject({ paperId: paper.id, paperLabel: `Fennick Lustre ${b}, pearl` });
      const detail = await supertest(t.app).get(`/api/prints/${p!.id}`).set('Cookie', registrar);
      expect(detail.body.data.paper).toEqual({ id: paper.id, label: `Fennick Lustre ${b}, pearl` });
    }
    const list = await supertest(t.app).get(`/api/prints?q=${encodeURIComponent(b)}`).set('Cookie', registrar);
    expect(list.body.data.map((p: { paperLabel: string }) => p.paperLabel)).toEqual([`Fennick Lustre ${b}, pearl`, `Fennick Lustre ${b}, pearl`]);
  });

  it('stores a maker by its id and the name the maker record has: a known one as listed, a new one as first written, however later rows spell it', async () => {
    const b = base();
    const known = await createMaker(`Wenna Trask ${b}`);
    const csv = [
      'accession_number,title,maker',
      `${b}.1,Known in lower case,wenna trask ${b}`,
      `${b}.2,New as first written,New Printer ${b}`,
      `${b}.3,New in capitals,NEW PRINTER ${b}`,
    ].join('\r\n');
    const { job } = await checkedAndCommitted(csv);
    expect(job).toMatchObject({ status: 'committed', createdPrints: 3 });
    const made = await Maker.findAll({ where: { name: { [Op.iLike]: `new printer ${b}` } } });
    expect(made.map((m) => m.name)).toEqual([`New Printer ${b}`]);
    const byNumber = async (n: number) => Print.findOne({ where: { accessionNumber: `${b}.${n}` } });
    expect(await byNumber(1)).toMatchObject({ makerId: known.id, makerName: `Wenna Trask ${b}` });
    for (const n of [2, 3]) expect(await byNumber(n)).toMatchObject({ makerId: made[0].id, makerName: `New Printer ${b}` });
  });

  it('a database failure during the commit is logged in full; the job says in plain words that nothing was imported, with its ids, and no SQL', async () => {
    const b = base();
    const title = `Refused by the database ${b}`;
    const logged: Record<string, unknown>[] = [];
    const sink = new Writable({ write(chunk, _enc, done) { logged.push(JSON.parse(String(chunk))); done(); } });
    const app = buildApp(t.deps, pino({ level: 'error' }, sink));
    const fn = `test_refuse_print_${b.replace('.', '_')}`;
    await db().query(`CREATE FUNCTION ${fn}() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN IF NEW.title = '${title}' THEN PERFORM 1 / 0; END IF; RETURN NEW; END $$`);
    await db().query(`CREATE TRIGGER ${fn} BEFORE INSERT ON prints FOR EACH ROW EXECUTE FUNCTION ${fn}()`);
    try {
      const { job, requestId } = await checkedAndCommitted(`accession_number,title\r\n${b}.1,Fine\r\n${b}.2,${title}\r\n`, app);
      expect(job.status).toBe('failed');
      expect(job.message).toMatch(/^Nothing was imported/);
      expect(job.message).toContain(job.id);
      expect(requestId).toBeTruthy();
      expect(job.message).toContain(requestId);
      expect(job.message).not.toMatch(/division|zero|insert|select|prints"|sql|sequelize|constraint|relation/i);
      expect(await Print.count({ where: { accessionNumber: [`${b}.1`, `${b}.2`] } })).toBe(0);
      const entry = logged.find((l) => l.importId === job.id);
      expect(entry, JSON.stringify(logged)).toBeTruthy();
      expect(JSON.stringify(entry)).toMatch(/division by zero/);
    } finally {
      await db().query(`DROP TRIGGER IF EXISTS ${fn} ON prints`);
      await db().query(`DROP FUNCTION IF EXISTS ${fn}()`);
    }
  });
});
