import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { testApp } from '../../../test/app';
import { daysFromToday, exhibitionClient } from '../../../test/exhibition-helpers';
import { settleImports } from '../../services/import.service';

/**
 * A row of an import that would change a deaccessioned print is named in the preview as an error of
 * that row (the record is read-only), so the person sees it before choosing to commit; a row that
 * leaves the print as it stands is not an error.
 */
const t = testApp();
let h: Awaited<ReturnType<typeof exhibitionClient>>;
beforeAll(async () => {
  h = await exhibitionClient(t);
});
afterAll(async () => {
  await settleImports();
  await t.close();
});

async function check(prints: string) {
  const res = await supertest(t.app).post('/api/imports').set('Cookie', h.c.registrar).set('Origin', t.origin).attach('file', Buffer.from(prints, 'utf8'), 'prints.csv');
  expect(res.status, JSON.stringify(res.body)).toBe(202);
  await settleImports();
  return (await h.as('registrar').get(`/api/imports/${res.body.data.id}`)).body.data;
}

async function deaccessioned(title: string) {
  const p = await h.newPrint('gelatin_silver_developing_out', title);
  const r = h.as('registrar');
  const proposed = (await r.post(`/api/prints/${p.id}/deaccessions`, { proposedOn: daysFromToday(-30), reason: 'Water damage beyond use', method: 'destruction' })).body.data;
  const approved = (await r.post(`/api/deaccessions/${proposed.id}/approve`, { authority: 'Collections Committee, minute 2025/12', approvedOn: daysFromToday(-20), version: proposed.version })).body.data;
  const done = await r.post(`/api/deaccessions/${proposed.id}/complete`, { completedOn: daysFromToday(-10), finalNote: 'Destroyed; certificate filed', version: approved.version });
  expect(done.status, JSON.stringify(done.body)).toBe(200);
  return p;
}

describe('import rows for a deaccessioned print', () => {
  it('names the row that would change it as an error of that row, and the commit is refused before anything is written', async () => {
    const gone = await deaccessioned('Net lofts after rain');
    const live = await h.newPrint('gelatin_silver_developing_out', 'Weir in fog');
    const job = await check([
      'accession_number,title',
      `${live.accessionNumber},Weir in fog at dawn`,
      `${gone.accessionNumber},Net lofts after rain (retitled)`,
    ].join('\n'));
    expect(job.status).toBe('invalid');
    expect(job.errors).toHaveLength(1);
    expect(job.errors[0]).toMatchObject({ file: 'prints', row: 3, column: 'accession_number', value: gone.accessionNumber });
    expect(job.errors[0].message).toContain('deaccessioned');
    expect(job.errors[0].message).toContain('read-only');
    expect(job.errors[0].message).toContain(daysFromToday(-10));
    const commit = await h.as('registrar').post(`/api/imports/${job.id}/commit`, { mode: 'create_or_update' });
    expect(commit.status).toBe(409);
    expect(commit.body.error.code).toBe('conflict');
    expect((await h.as('registrar').get(`/api/prints/${gone.id}`)).body.data.title).toBe('Net lofts after rain');
    expect((await h.as('registrar').get(`/api/prints/${live.id}`)).body.data.title).toBe('Weir in fog');
  });

  it('lets a row that leaves the deaccessioned print as it stands through as unchanged', async () => {
    const gone = await deaccessioned('Signal box');
    const job = await check(['accession_number,title', `${gone.accessionNumber},Signal box`].join('\n'));
    expect(job.errors).toEqual([]);
    expect(job).toMatchObject({ status: 'ready', unchanged: 1, toUpdate: 0 });
  });
});
