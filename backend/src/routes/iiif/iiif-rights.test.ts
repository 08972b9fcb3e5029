import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { errorEnvelopeSchema } from '@toneledger/common/schemas/envelope';
import { testApp, sessionFor, type TestApp } from '../../../test/app';
import { accession } from '../../../test/factories';

/**
 * A print's rights statement through the API into its IIIF Presentation 3.0 manifest, on the real app
 * and PostgreSQL. The rule checked is §3.3.2 `rights` as the published 3.0 text words it: "The value
 * must be drawn from the set of Creative Commons license URIs, the RightsStatements.org rights
 * statement URIs, or those added via the extension mechanism", a single string; `requiredStatement`
 * (§3.3.2) is a label/value pair of language maps. The RightsStatements.org URIs are those of the
 * consortium's rights-statements.ttl (base http://rightsstatements.org/vocab/, `<InC-RUU/1.0/>`).
 */

let t: TestApp;
const c: Record<string, string> = {};
const CREDIT = 'Calder Reach Photographic Trust. Gift of Orla Penhallow, 2011';

/** A rights value as §3.3.2 allows it, written here independently of the product's parser. */
const IIIF_RIGHTS = /^http:\/\/(creativecommons\.org\/(licenses|publicdomain)|rightsstatements\.org\/vocab)\/[A-Za-z-]+\/\d\.\d\/([a-z]{2,3}\/)?$/;

const send = (method: 'post' | 'patch', path: string, body: object) =>
  supertest(t.app)[method](path).set('Cookie', c.registrar!).set('Origin', t.origin).send(body);

async function create(rights: string | null) {
  const res = await send('post', '/api/prints', { accessionNumber: accession(), title: 'Slipway at dusk', process: 'gelatin_silver_developing_out', creditLine: CREDIT, rights });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.data as { id: string; rights: string | null; version: number };
}

const manifest = async (id: string) => {
  const res = await supertest(t.app).get(`/api/iiif/prints/${id}/manifest`).set('Cookie', c.viewer!);
  expect(res.status).toBe(200);
  return res.body as { rights?: unknown; requiredStatement?: unknown; metadata: { label: { en: string[] }; value: { en: string[] } }[] };
};

beforeAll(async () => {
  t = testApp();
  for (const r of ['registrar', 'viewer'] as const) c[r] = await sessionFor(t.app, r);
}, 60_000);
afterAll(() => t.close());

describe('a print\'s rights statement in its IIIF manifest', () => {
  it('carries a Creative Commons licence as `rights` (canonical http URI) beside the credit line as `requiredStatement`', async () => {
    // The licence's deed page over https, as someone copies it from a browser: the same licence.
    const print = await create('https://creativecommons.org/licenses/by-nc/4.0/deed.en');
    expect(print.rights).toBe('http://creativecommons.org/licenses/by-nc/4.0/');
    const m = await manifest(print.id);
    expect(typeof m.rights).toBe('string');
    expect(m.rights).toMatch(IIIF_RIGHTS);
    expect(m.rights).toBe('http://creativecommons.org/licenses/by-nc/4.0/');
    expect(m.requiredStatement).toEqual({ label: { en: ['Credit line'] }, value: { en: [CREDIT] } });
    expect(m.metadata.find((e) => e.label.en[0] === 'Rights statement')?.value.en[0]).toMatch(/NonCommercial 4\.0/);
  });

  it('follows an edit to a RightsStatements.org statement, and leaves `rights` out once it is cleared', async () => {
    const print = await create('http://rightsstatements.org/vocab/InC/1.0/');
    // The statement's human-readable page is read as the statement.
    const edited = await send('patch', `/api/prints/${print.id}`, { version: print.version, rights: 'https://rightsstatements.org/page/InC-RUU/1.0/?language=en' });
    expect(edited.status, JSON.stringify(edited.body)).toBe(200);
    expect(edited.body.data.rights).toBe('http://rightsstatements.org/vocab/InC-RUU/1.0/');
    const m = await manifest(print.id);
    expect(m.rights).toBe('http://rightsstatements.org/vocab/InC-RUU/1.0/');
    expect(m.rights).toMatch(IIIF_RIGHTS);

    const cleared = await send('patch', `/api/prints/${print.id}`, { version: edited.body.data.version, rights: '' });
    expect(cleared.status).toBe(200);
    expect(cleared.body.data.rights).toBeNull();
    const after = await manifest(print.id);
    expect(after.rights).toBeUndefined();
    expect(after.requiredStatement).toEqual({ label: { en: ['Credit line'] }, value: { en: [CREDIT] } });
  });

  it.each([
    ['a sentence', 'All rights reserved'],
    ['another site\'s licence page', 'http://example.org/licence/1.0/'],
    ['a statement RightsStatements.org does not publish', 'http://rightsstatements.org/vocab/InC-RUW/1.0/'],
    ['a ported 4.0 licence (4.0 has no jurisdictions)', 'http://creativecommons.org/licenses/by/4.0/de/'],
    ['a statement version that does not exist', 'http://rightsstatements.org/vocab/InC/2.0/'],
  ])('refuses %s with a 400 naming `rights`, and the print keeps its value', async (_, value) => {
    const print = await create('http://rightsstatements.org/vocab/UND/1.0/');
    const res = await send('patch', `/api/prints/${print.id}`, { version: print.version, rights: value });
    expect(res.status).toBe(400);
    const env = errorEnvelopeSchema.parse(res.body);
    expect(env.error.code).toBe('validation_failed');
    const details = env.error.details as { path: string; message: string }[];
    expect(details.map((d) => d.path)).toEqual(['rights']);
    expect(details[0].message).toMatch(/Creative Commons licence or a RightsStatements\.org statement/);
    const still = await supertest(t.app).get(`/api/prints/${print.id}`).set('Cookie', c.viewer!);
    expect(still.body.data.rights).toBe('http://rightsstatements.org/vocab/UND/1.0/');
    expect((await manifest(print.id)).rights).toBe('http://rightsstatements.org/vocab/UND/1.0/');
  });
});
