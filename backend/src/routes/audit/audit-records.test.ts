import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import supertest from 'supertest';
import { AUDIT_RECORD_KINDS, RECORD_PAGES, recordPagePath } from '@toneledger/common/fields/audit-records';
import { AREAS } from '@toneledger/common/domain/areas';
import { testApp, sessionFor } from '../../../test/app';
import { accession, createImageRecord, createRecipe } from '../../../test/factories';
import { exhibitionClient } from '../../../test/exhibition-helpers';
import { DEMO_ACCOUNTS } from '../../seed/demo-accounts';
import { AuditEventModel } from '../../models';
import { db } from '../../db';
import { auditRecords } from '../../services/audit-records.service';

const t = testApp();
let admin: string;
let registrar: string;
beforeAll(async () => {
  admin = await sessionFor(t.app, 'admin');
  registrar = await sessionFor(t.app, 'registrar');
});
afterAll(() => t.close());

/** Every record type the server's code writes to the trail, read from its source. */
function typesWritten(): Set<string> {
  const root = join(__dirname, '../..');
  const found = new Set<string>();
  const walk = (dir: string) => {
    for (const name of readdirSync(dir)) {
      const path = join(dir, name);
      if (statSync(path).isDirectory()) walk(path);
      else if (name.endsWith('.ts') && !name.endsWith('.test.ts')) {
        const text = readFileSync(path, 'utf8');
        for (const m of text.matchAll(/entity_?[tT]ype: '([a-z_]+)'/g)) found.add(m[1]!);
        // Services that name their record type once: `const ENTITY = 'loan'` … `entityType: ENTITY`.
        for (const m of text.matchAll(/const ([A-Z_]+) = '([a-z_]+)';/g)) if (new RegExp(`entityType: ${m[1]}\\b`).test(text)) found.add(m[2]!);
      }
    }
  };
  walk(root);
  return found;
}

async function eventOf(query: string) {
  const res = await supertest(t.app).get(`/api/audit?${query}`).set('Cookie', admin);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body.data as { entityType: string; entityId: string | null; record: { kind: string; name: string | null; link: { page: keyof typeof RECORD_PAGES; id: string } | null } }[];
}

describe('the record of each audit event, in words', () => {
  it('has a label for every record type the server writes', () => {
    const written = typesWritten();
    // The source names more than twenty kinds (prints, reports, loans, settings…); an empty read would pass vacuously.
    expect(written.size).toBeGreaterThan(20);
    const missing = [...written].filter((type) => !(type in AUDIT_RECORD_KINDS));
    expect(missing).toEqual([]);
  });

  it("links only to pages inside the app's areas", () => {
    for (const path of Object.values(RECORD_PAGES)) expect(AREAS.some((a) => path.startsWith(`${a.path}/`)), path).toBe(true);
  });

  it('names each record (accession number, reference, title, person, file) and links it to its page; a deleted one keeps its name without a link', async () => {
    const ex = await exhibitionClient(t);
    const print = await ex.newPrint();
    const exhibition = await ex.newExhibition([{ name: 'Long gallery', opensOn: '2031-03-01', closesOn: '2031-05-01' }]);
    const reference = `AR-${accession()}`;
    const loan = await supertest(t.app).post('/api/loans').set('Cookie', registrar).set('Origin', t.origin)
      .send({ direction: 'out', reference, otherInstitution: 'Harbour Hall', purpose: 'exhibition' });
    expect(loan.status, JSON.stringify(loan.body)).toBe(201);
    const gone = await ex.newPrint();
    const del = await supertest(t.app).delete(`/api/prints/${gone.id}?version=${gone.version}`).set('Cookie', registrar).set('Origin', t.origin);
    expect(del.status, JSON.stringify(del.body)).toBe(200);
    const image = await createImageRecord(print.id);
    await AuditEventModel.create({ actorId: null, actorName: null, action: 'image.updated', entityType: 'image', entityId: image.id, before: null, after: null, requestId: null, ip: null });

    const [printEvent] = await eventOf(`entityType=print&entityId=${print.id}`);
    expect(printEvent!.record).toEqual({ kind: 'Print', name: print.accessionNumber, link: { page: 'print', id: print.id } });
    expect(recordPagePath(printEvent!.record.link!)).toBe(`/catalogue/prints/${print.id}`);
    const [loanEvent] = await eventOf(`entityType=loan&entityId=${loan.body.data.id}`);
    expect(loanEvent!.record).toEqual({ kind: 'Loan', name: reference, link: { page: 'loan', id: loan.body.data.id } });
    const [exhibitionEvent] = await eventOf(`entityType=exhibition&entityId=${exhibition.id}`);
    expect(exhibitionEvent!.record).toEqual({ kind: 'Exhibition', name: exhibition.title, link: { page: 'exhibition', id: exhibition.id } });
    const [imageEvent] = await eventOf(`entityType=image&entityId=${image.id}`);
    expect(imageEvent!.record).toEqual({ kind: 'Image', name: `${print.accessionNumber}, ${image.fileName}`, link: { page: 'print', id: print.id } });
    const goneEvents = await eventOf(`entityType=print&entityId=${gone.id}`);
    expect(goneEvents.map((e) => e.record)).toEqual(goneEvents.map(() => ({ kind: 'Print', name: gone.accessionNumber, link: null })));
    const me = (await supertest(t.app).get('/api/me').set('Cookie', admin)).body.data as { id: string };
    const [signIn] = await eventOf(`action=session.signed_in&actorId=${me.id}&pageSize=1`);
    expect(signIn!.record).toEqual({ kind: 'Person', name: DEMO_ACCOUNTS.find((a) => a.role === 'admin')!.name, link: null });
  });

  it('words a settings section and a record type it does not know, never showing the code', async () => {
    const tag = accession();
    await AuditEventModel.create({ actorId: null, actorName: null, action: 'settings.updated', entityType: 'settings', entityId: 'light', before: null, after: null, requestId: `rec-${tag}`, ip: null });
    await AuditEventModel.create({ actorId: null, actorName: null, action: 'shelf_list.rebuilt', entityType: 'shelf_list', entityId: `x-${tag}`, before: null, after: null, requestId: `rec-${tag}`, ip: null });
    const [settings] = await eventOf(`entityType=settings&entityId=light&pageSize=1`);
    expect(settings!.record).toEqual({ kind: 'Settings', name: 'Light', link: null });
    const [unknown] = await eventOf(`entityType=shelf_list&entityId=x-${tag}`);
    expect(unknown!.record).toEqual({ kind: 'Shelf list', name: null, link: null });
  });

  it('reads the records of a page of many kinds in one query', async () => {
    const ex = await exhibitionClient(t);
    const print = await ex.newPrint();
    const recipe = await createRecipe();
    const image = await createImageRecord(print.id);
    const users = await db().query<{ id: string; name: string }>('SELECT id::text AS id, name FROM users ORDER BY name LIMIT 2', { type: 'SELECT' as never });
    const events = [
      { entityType: 'print', entityId: print.id, before: null, after: null },
      { entityType: 'recipe', entityId: recipe.id, before: null, after: null },
      { entityType: 'image', entityId: image.id, before: null, after: null },
      { entityType: 'print_schedule', entityId: print.id, before: null, after: null },
      ...users.map((u) => ({ entityType: 'user', entityId: u.id, before: null, after: null })),
      { entityType: 'condition_term', entityId: 'no-such-term', before: null, after: { label: 'Silvering' } },
      { entityType: 'settings', entityId: 'catalogue', before: null, after: null },
    ];
    const spy = vi.spyOn(db(), 'query');
    try {
      const records = await auditRecords(events);
      // Only the statements that read these records count: the app's background work (the new print's
      // inspection date) may read prints meanwhile, but never binds a recipe's, an image's or a person's id.
      const ours = new Set([recipe.id, image.id, ...users.map((u) => u.id)]);
      const binds = (c: unknown[]) => JSON.stringify((c[1] as { bind?: unknown } | undefined)?.bind ?? null);
      const reads = spy.mock.calls.filter((c) => [...ours].some((id) => binds(c).includes(id))).map((c) => String(c[0]));
      expect(reads).toHaveLength(1);
      expect(records.map((r) => r.name)).toEqual([
        print.accessionNumber, recipe.name, `${print.accessionNumber}, ${image.fileName}`, print.accessionNumber, ...users.map((u) => u.name), 'Silvering', 'Catalogue',
      ]);
      expect(records[1]!.link).toEqual({ page: 'recipe', id: recipe.id });
    } finally {
      spy.mockRestore();
    }
  });
});
