import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { ROLES, type Role } from '@toneledger/common/domain/roles';
import { DEFAULT_GRADE_DEFINITIONS } from '@toneledger/common/schemas/condition';
import { testApp, sessionFor, signIn } from '../../../test/app';
import { TEST_ONLY_ACCOUNTS } from '../../../test/accounts';
import { accession, createImageRecord } from '../../../test/factories';
import { db } from '../../db';
import { Addendum, AuditEventModel, ConditionReport, ConditionTerm, Observation, User } from '../../models';

type Who = Role | 'second';

const t = testApp();
const c = {} as Record<Who, string>;
const ids = {} as Record<'conservator' | 'second', string>;
const second = TEST_ONLY_ACCOUNTS.find((a) => a.email === 'second-conservator@test.example')!;

beforeAll(async () => {
  for (const r of ROLES) c[r] = await sessionFor(t.app, r);
  // A second conservator: a first sign-in makes a viewer, whom an administrator then makes a conservator.
  c.second = await signIn(t.app, second.email, second.password);
  await User.update({ role: 'conservator' }, { where: { email: second.email } });
  ids.second = (await User.findOne({ where: { email: second.email } }))!.id;
  ids.conservator = (await supertest(t.app).get('/api/me').set('Cookie', c.conservator)).body.data.id;
});
afterAll(() => t.close());

const api = (who: Who | null) => ({
  get: (url: string) => (who ? supertest(t.app).get(url).set('Cookie', c[who]) : supertest(t.app).get(url)),
  post: (url: string, body?: object) => {
    const r = supertest(t.app).post(url).set('Origin', t.origin);
    return (who ? r.set('Cookie', c[who]) : r).send(body ?? {});
  },
  patch: (url: string, body: object) => {
    const r = supertest(t.app).patch(url).set('Origin', t.origin);
    return (who ? r.set('Cookie', c[who]) : r).send(body);
  },
  put: (url: string, body: object) => {
    const r = supertest(t.app).put(url).set('Origin', t.origin);
    return (who ? r.set('Cookie', c[who]) : r).send(body);
  },
  del: (url: string) => {
    const r = supertest(t.app).delete(url).set('Origin', t.origin);
    return who ? r.set('Cookie', c[who]) : r;
  },
});

const UNKNOWN = '00000000-0000-4000-8000-00000000000f';
const paths = (res: { body: { error: { details: { path: string }[] } } }) => res.body.error.details.map((d) => d.path);

async function newPrint(title = 'Breakwater, silver-rich shadows') {
  const res = await api('registrar').post('/api/prints', { accessionNumber: accession(), title, process: 'gelatin_silver_developing_out' });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.data as { id: string; accessionNumber: string; title: string };
}

const observation = (extra: Record<string, unknown> = {}) => ({ termCode: 'silver_mirroring', side: 'recto', area: 'image', extent: 'localised', severity: 'slight', ...extra });

async function newDraft(printId: string, body: Record<string, unknown> = {}, who: Who = 'conservator') {
  const res = await api(who).post(`/api/prints/${printId}/condition-reports`, { examinedOn: '2025-03-14', context: 'routine', ...body });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.data;
}

async function signedReport(printId: string) {
  const draft = await newDraft(printId, { grade: 'fair', observations: [observation()] });
  const res = await api('conservator').post(`/api/condition-reports/${draft.id}/sign`, { version: draft.version });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body.data;
}

function isoDay(offsetDays: number) {
  return new Date(Date.now() + offsetDays * 86_400_000).toISOString().slice(0, 10);
}

describe('grade definitions (settings)', () => {
  it('reads the defaults; 401 without a session, 403 for a viewer', async () => {
    expect((await api(null).get('/api/settings/condition')).status).toBe(401);
    expect((await api('viewer').get('/api/settings/condition')).status).toBe(403);
    const res = await api('researcher').get('/api/settings/condition');
    expect(res.status).toBe(200);
    expect(res.body.data).toEqual({ grades: DEFAULT_GRADE_DEFINITIONS });
  });

  it('only an administrator changes them; a too-short definition is named; the change is audited', async () => {
    const next = { grades: { ...DEFAULT_GRADE_DEFINITIONS, fair: 'Stable; visible damage that does not threaten the print. Recheck within a year.' } };
    expect((await api('conservator').put('/api/settings/condition', next)).status).toBe(403);
    const bad = await api('admin').put('/api/settings/condition', { grades: { ...DEFAULT_GRADE_DEFINITIONS, poor: 'Bad' } });
    expect(bad.status).toBe(400);
    expect(paths(bad)).toEqual(['grades.poor']);
    const ok = await api('admin').put('/api/settings/condition', next);
    expect(ok.status).toBe(200);
    expect((await api('conservator').get('/api/settings/condition')).body.data.grades.fair).toBe(next.grades.fair);
    const audit = await AuditEventModel.findOne({ where: { action: 'settings.updated', entityId: 'condition' }, order: [['id', 'DESC']] });
    expect(audit).toMatchObject({ actorName: 'Idris Penhallow', before: { grades: { fair: DEFAULT_GRADE_DEFINITIONS.fair } }, after: next });
    expect((await api('admin').put('/api/settings/condition', { grades: DEFAULT_GRADE_DEFINITIONS })).status).toBe(200);
  });
});

describe('the deterioration vocabulary', () => {
  it('lists the active terms in order; a viewer cannot read it', async () => {
    expect((await api(null).get('/api/condition-terms')).status).toBe(401);
    expect((await api('viewer').get('/api/condition-terms')).status).toBe(403);
    const res = await api('researcher').get('/api/condition-terms');
    expect(res.status).toBe(200);
    expect(res.body.data.slice(0, 3).map((x: { code: string }) => x.code)).toEqual(['silver_mirroring', 'fading', 'colour_shift']);
    expect(res.body.data[0]).toEqual({ code: 'silver_mirroring', label: 'Silver mirroring', description: null, active: true, builtIn: true });
  });

  it('an administrator adds a term (after the built-in ones); a duplicate code is a 409; others get 403', async () => {
    const code = `ferrotype_sheen_${Date.now() % 100000}`;
    const body = { code, label: 'Uneven ferrotype sheen', description: 'Glossy patches from contact with glass or a glazing plate' };
    expect((await api('conservator').post('/api/condition-terms', body)).status).toBe(403);
    const bad = await api('admin').post('/api/condition-terms', { code: 'Has Spaces', label: '' });
    expect(bad.status).toBe(400);
    expect(paths(bad)).toEqual(expect.arrayContaining(['code', 'label']));
    const created = await api('admin').post('/api/condition-terms', body);
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    expect(created.body.data).toEqual({ ...body, active: true, builtIn: false });
    const list = await api('conservator').get('/api/condition-terms');
    expect(list.body.data.at(-1).code).toBe(code);
    const dup = await api('admin').post('/api/condition-terms', { ...body, label: 'Again' });
    expect(dup.status).toBe(409);
    expect(dup.body.error.details[0].path).toBe('code');
    expect((await ConditionTerm.findByPk(code))!.label).toBe('Uneven ferrotype sheen');
    expect(await AuditEventModel.count({ where: { action: 'condition_term.created', entityId: code } })).toBe(1);
  });

  it('a built-in term can be deactivated (and comes back with all=true, after the active ones) but not deleted', async () => {
    expect((await api('conservator').patch('/api/condition-terms/fingerprint', { active: false })).status).toBe(403);
    expect((await api('admin').patch('/api/condition-terms/no_such_term', { active: false })).status).toBe(404);
    const off = await api('admin').patch('/api/condition-terms/fingerprint', { active: false, description: 'Oily marks from handling without gloves' });
    expect(off.status).toBe(200);
    expect(off.body.data).toMatchObject({ code: 'fingerprint', active: false, builtIn: true, description: 'Oily marks from handling without gloves' });
    try {
      const active = await api('conservator').get('/api/condition-terms');
      expect(active.body.data.map((x: { code: string }) => x.code)).not.toContain('fingerprint');
      const all = await api('conservator').get('/api/condition-terms?all=true');
      const codes = all.body.data.map((x: { code: string }) => x.code);
      expect(codes.at(-1)).toBe('fingerprint');
      expect(all.body.data.findIndex((x: { active: boolean }) => !x.active)).toBe(codes.length - 1);
      // A deactivated term cannot be used in a new observation.
      const p = await newPrint();
      const res = await api('conservator').post(`/api/prints/${p.id}/condition-reports`, {
        examinedOn: '2025-03-14', context: 'routine', observations: [observation(), observation({ termCode: 'fingerprint' })],
      });
      expect(res.status).toBe(400);
      expect(paths(res)).toEqual(['observations.1.termCode']);
      // There is no delete.
      expect((await api('admin').del('/api/condition-terms/fingerprint')).status).toBe(404);
      expect(await ConditionTerm.count({ where: { code: 'fingerprint' } })).toBe(1);
      const audit = await AuditEventModel.findOne({ where: { action: 'condition_term.updated', entityId: 'fingerprint' }, order: [['id', 'DESC']] });
      expect(audit).toMatchObject({ before: { active: true }, after: { active: false } });
    } finally {
      expect((await api('admin').patch('/api/condition-terms/fingerprint', { active: true })).status).toBe(200);
    }
  });
});

describe('POST /api/prints/:id/condition-reports', () => {
  it('401 without a session; 403 for every role but conservator; nothing is stored', async () => {
    const p = await newPrint();
    const body = { examinedOn: '2025-03-14', context: 'routine' };
    expect((await api(null).post(`/api/prints/${p.id}/condition-reports`, body)).status).toBe(401);
    for (const role of ['admin', 'registrar', 'researcher', 'viewer'] as const) {
      expect((await api(role).post(`/api/prints/${p.id}/condition-reports`, body)).status, role).toBe(403);
    }
    expect(await ConditionReport.count({ where: { printId: p.id } })).toBe(0);
  });

  it('creates a draft by the signed-in examiner, observations in the order given, and audits it with the print', async () => {
    const p = await newPrint('Gasworks at dusk');
    const image = await createImageRecord(p.id);
    const region = { imageId: image.id, shape: 'polygon', points: [[0.1, 0.2], [0.3, 0.2], [0.25, 0.4]] };
    const draft = await newDraft(p.id, {
      context: 'incoming', summary: 'Mirroring in the dense shadows; otherwise sound.', nextCheckOn: '2026-03-14',
      observations: [
        observation({ region, notes: 'Bluish sheen at raking light' }),
        observation({ termCode: 'crease', side: 'recto', area: 'corner', extent: 'percentage', extentPercent: 5, severity: 'moderate' }),
      ],
    });
    expect(draft).toMatchObject({
      printId: p.id, accessionNumber: p.accessionNumber, printTitle: 'Gasworks at dusk', examinedOn: '2025-03-14', context: 'incoming',
      examinerId: ids.conservator, examinerName: 'Tamsin Wrey', status: 'draft', signedAt: null, grade: null, nextCheckOn: '2026-03-14', version: 1, addenda: [],
    });
    expect(draft.observations).toMatchObject([
      { position: 1, termCode: 'silver_mirroring', termLabel: 'Silver mirroring', region, notes: 'Bluish sheen at raking light', extentPercent: null },
      { position: 2, termCode: 'crease', termLabel: 'Crease', area: 'corner', extent: 'percentage', extentPercent: 5, severity: 'moderate', region: null },
    ]);
    const again = await api('researcher').get(`/api/condition-reports/${draft.id}`);
    expect(again.status).toBe(200);
    expect(again.body.data).toEqual(draft);
    const audit = await AuditEventModel.findOne({ where: { entityType: 'condition_report', entityId: draft.id, action: 'condition_report.created' } });
    expect(audit).toMatchObject({ actorName: 'Tamsin Wrey', after: { printId: p.id, summary: 'Mirroring in the dense shadows; otherwise sound.' } });
  });

  it('400 names each bad field: future examination, next check before it, unknown term, missing percentage, bad region', async () => {
    const p = await newPrint();
    const future = await api('conservator').post(`/api/prints/${p.id}/condition-reports`, { examinedOn: isoDay(3), context: 'routine' });
    expect(future.status).toBe(400);
    expect(future.body.error.details).toEqual([expect.objectContaining({ path: 'examinedOn', code: 'future' })]);

    const res = await api('conservator').post(`/api/prints/${p.id}/condition-reports`, {
      examinedOn: '2025-03-14', context: 'routine', nextCheckOn: '2025-03-13',
      observations: [observation(), observation({ termCode: 'sunburn' })],
    });
    expect(res.status).toBe(400);
    expect(paths(res)).toEqual(['nextCheckOn', 'observations.1.termCode']);

    const shape = await api('conservator').post(`/api/prints/${p.id}/condition-reports`, {
      examinedOn: '2025-02-30', context: 'lunch',
      observations: [observation({ extent: 'percentage' }), observation({ region: { imageId: UNKNOWN, shape: 'rect', points: [[0.1, 0.1], [0.2, 0.2], [0.3, 0.3]] } })],
    });
    expect(shape.status).toBe(400);
    expect(paths(shape)).toEqual(expect.arrayContaining(['context', 'observations.0.extentPercent', 'observations.1.region.points']));

    const notADay = await api('conservator').post(`/api/prints/${p.id}/condition-reports`, { examinedOn: '2025-02-30', context: 'routine' });
    expect(notADay.status).toBe(400);
    expect(paths(notADay)).toEqual(['examinedOn']);
    expect(await ConditionReport.count({ where: { printId: p.id } })).toBe(0);
  });

  it('400 for a region on an image of another print, on a withdrawn image, or on no image at all', async () => {
    const p = await newPrint();
    const other = await newPrint();
    const theirs = await createImageRecord(other.id);
    const withdrawn = await createImageRecord(p.id, { withdrawnAt: new Date() });
    const rect = (imageId: string) => ({ imageId, shape: 'rect', points: [[0.1, 0.1], [0.4, 0.5]] });
    const res = await api('conservator').post(`/api/prints/${p.id}/condition-reports`, {
      examinedOn: '2025-03-14', context: 'routine',
      observations: [observation({ region: rect(theirs.id) }), observation({ region: rect(withdrawn.id) }), observation({ region: rect(UNKNOWN) })],
    });
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([
      expect.objectContaining({ path: 'observations.0.region.imageId', code: 'other_print' }),
      expect.objectContaining({ path: 'observations.1.region.imageId', code: 'withdrawn' }),
      expect.objectContaining({ path: 'observations.2.region.imageId', code: 'not_found' }),
    ]);
    expect(await ConditionReport.count({ where: { printId: p.id } })).toBe(0);
  });

  it('404 for an unknown print', async () => {
    expect((await api('conservator').post(`/api/prints/${UNKNOWN}/condition-reports`, { examinedOn: '2025-03-14', context: 'routine' })).status).toBe(404);
  });
});

describe('reading reports', () => {
  it('lists a print’s reports newest examination first; viewers cannot read; 404 for an unknown print or report', async () => {
    const p = await newPrint();
    for (const day of ['2024-03-01', '2025-01-15', '2023-06-30']) await newDraft(p.id, { examinedOn: day });
    expect((await api(null).get(`/api/prints/${p.id}/condition-reports`)).status).toBe(401);
    expect((await api('viewer').get(`/api/prints/${p.id}/condition-reports`)).status).toBe(403);
    const list = await api('registrar').get(`/api/prints/${p.id}/condition-reports`);
    expect(list.status).toBe(200);
    expect(list.body.data.map((r: { examinedOn: string }) => r.examinedOn)).toEqual(['2025-01-15', '2024-03-01', '2023-06-30']);
    expect((await api('viewer').get(`/api/condition-reports/${list.body.data[0].id}`)).status).toBe(403);
    expect((await api('admin').get(`/api/prints/${UNKNOWN}/condition-reports`)).status).toBe(404);
    expect((await api('admin').get(`/api/condition-reports/${UNKNOWN}`)).status).toBe(404);
    const bad = await api('admin').get('/api/condition-reports/not-an-id');
    expect(bad.status).toBe(400);
    expect(paths(bad)).toEqual(['params.id']);
  });
});

describe('PATCH /api/condition-reports/:id (drafts)', () => {
  it('the author edits; observations stay unless a new list is given, which replaces them in order', async () => {
    const p = await newPrint();
    const draft = await newDraft(p.id, { observations: [observation(), observation({ termCode: 'foxing', severity: 'moderate' })] });
    const summary = await api('conservator').patch(`/api/condition-reports/${draft.id}`, { version: 1, summary: 'Foxing along the lower margin.', grade: 'fair' });
    expect(summary.status, JSON.stringify(summary.body)).toBe(200);
    expect(summary.body.data).toMatchObject({ summary: 'Foxing along the lower margin.', grade: 'fair', version: 2, status: 'draft' });
    expect(summary.body.data.observations.map((o: { termCode: string }) => o.termCode)).toEqual(['silver_mirroring', 'foxing']);

    const replaced = await api('conservator').patch(`/api/condition-reports/${draft.id}`, {
      version: 2, observations: [observation({ termCode: 'tear', area: 'edge' }), observation({ termCode: 'foxing', area: 'margin' })],
    });
    expect(replaced.status).toBe(200);
    expect(replaced.body.data.observations.map((o: { termCode: string; position: number }) => [o.position, o.termCode])).toEqual([[1, 'tear'], [2, 'foxing']]);
    expect(await Observation.count({ where: { reportId: draft.id } })).toBe(2);

    const audit = await AuditEventModel.findOne({ where: { entityType: 'condition_report', entityId: draft.id, action: 'condition_report.updated' }, order: [['id', 'DESC']] });
    expect((audit!.after as { printId: string }).printId).toBe(p.id);
    expect((audit!.before as { observations: { termCode: string }[] }).observations.map((o) => o.termCode)).toEqual(['silver_mirroring', 'foxing']);
  });

  it('another conservator gets 403 and the draft is unchanged; other roles cannot write at all', async () => {
    const p = await newPrint();
    const draft = await newDraft(p.id, { summary: 'Mine' });
    const res = await api('second').patch(`/api/condition-reports/${draft.id}`, { version: 1, summary: 'Theirs' });
    expect(res.status).toBe(403);
    expect(res.body.error).toMatchObject({ code: 'forbidden', message: 'Only the author can change a draft' });
    expect((await api('second').post(`/api/condition-reports/${draft.id}/sign`, { version: 1 })).status).toBe(403);
    expect((await api('second').del(`/api/condition-reports/${draft.id}?version=1`)).status).toBe(403);
    expect((await api('admin').patch(`/api/condition-reports/${draft.id}`, { version: 1, summary: 'Admin' })).status).toBe(403);
    const row = await ConditionReport.findByPk(draft.id);
    expect(row).toMatchObject({ summary: 'Mine', version: 1, status: 'draft' });
    // The same person can write reports of their own: the 403 above is about authorship, not role.
    const own = await newDraft(p.id, {}, 'second');
    expect(own.examinerName).toBe(second.name);
  });

  it('a stale version gets 409 with the current draft and who saved it; nothing is overwritten', async () => {
    const p = await newPrint();
    const draft = await newDraft(p.id);
    expect((await api('conservator').patch(`/api/condition-reports/${draft.id}`, { version: 1, summary: 'First tab' })).status).toBe(200);
    const stale = await api('conservator').patch(`/api/condition-reports/${draft.id}`, { version: 1, summary: 'Second tab' });
    expect(stale.status).toBe(409);
    expect(stale.body.error.details.current).toMatchObject({ id: draft.id, summary: 'First tab', version: 2 });
    expect(stale.body.error.details.lastChangedBy).toBe('Tamsin Wrey');
    expect((await ConditionReport.findByPk(draft.id))!.summary).toBe('First tab');
  });

  it('400 for a next check before the (new) examination date, and for a missing version; 404 for an unknown report', async () => {
    const p = await newPrint();
    const draft = await newDraft(p.id, { nextCheckOn: '2025-06-01' });
    const res = await api('conservator').patch(`/api/condition-reports/${draft.id}`, { version: 1, examinedOn: '2025-07-01' });
    expect(res.status).toBe(400);
    expect(paths(res)).toEqual(['nextCheckOn']);
    const noVersion = await api('conservator').patch(`/api/condition-reports/${draft.id}`, { summary: 'x' });
    expect(noVersion.status).toBe(400);
    expect(paths(noVersion)).toEqual(['version']);
    expect((await api('conservator').patch(`/api/condition-reports/${UNKNOWN}`, { version: 1, summary: 'x' })).status).toBe(404);
    expect((await ConditionReport.findByPk(draft.id))!.examinedOn).toBe('2025-03-14');
  });
});

describe('signing', () => {
  it('needs a grade; then the report is signed, locked to the API and to the database', async () => {
    const p = await newPrint();
    const draft = await newDraft(p.id, { observations: [observation()] });
    const noGrade = await api('conservator').post(`/api/condition-reports/${draft.id}/sign`, { version: 1 });
    expect(noGrade.status).toBe(400);
    expect(paths(noGrade)).toEqual(['grade']);
    expect((await ConditionReport.findByPk(draft.id))!.status).toBe('draft');

    const graded = await api('conservator').patch(`/api/condition-reports/${draft.id}`, { version: 1, grade: 'good' });
    const before = Date.now();
    const signed = await api('conservator').post(`/api/condition-reports/${draft.id}/sign`, { version: graded.body.data.version });
    expect(signed.status, JSON.stringify(signed.body)).toBe(200);
    expect(signed.body.data).toMatchObject({ status: 'signed', grade: 'good', version: 3 });
    expect(Math.abs(new Date(signed.body.data.signedAt).getTime() - before)).toBeLessThan(10_000);

    const edit = await api('conservator').patch(`/api/condition-reports/${draft.id}`, { version: 3, summary: 'Changed my mind' });
    expect(edit.status).toBe(409);
    expect(edit.body.error.message).toMatch(/signed reports are locked; add an addendum/i);
    expect((await api('conservator').post(`/api/condition-reports/${draft.id}/sign`, { version: 3 })).status).toBe(409);
    const row = await ConditionReport.findByPk(draft.id);
    expect(row).toMatchObject({ summary: null, grade: 'good', version: 3, status: 'signed' });
    expect(await Observation.count({ where: { reportId: draft.id } })).toBe(1);

    // Past the API, the database refuses too.
    await expect(db().query('UPDATE condition_reports SET grade = $1 WHERE id = $2', { bind: ['poor', draft.id] })).rejects.toThrow(/signed and locked/);
    await expect(db().query('UPDATE observations SET severity = $1 WHERE report_id = $2', { bind: ['severe', draft.id] })).rejects.toThrow(/locked/);
    await expect(db().query('DELETE FROM condition_reports WHERE id = $1', { bind: [draft.id] })).rejects.toThrow(/signed and locked/);
    expect((await ConditionReport.findByPk(draft.id))!.grade).toBe('good');

    const audit = await AuditEventModel.findOne({ where: { entityType: 'condition_report', entityId: draft.id, action: 'condition_report.signed' } });
    expect(audit).toMatchObject({ actorName: 'Tamsin Wrey', after: { printId: p.id, status: 'signed', grade: 'good' } });
  });

  it('a signed report cannot be discarded', async () => {
    const p = await newPrint();
    const report = await signedReport(p.id);
    const res = await api('conservator').del(`/api/condition-reports/${report.id}?version=${report.version}`);
    expect(res.status).toBe(409);
    expect(await ConditionReport.count({ where: { id: report.id } })).toBe(1);
  });
});

describe('addenda', () => {
  it('any conservator adds to a signed report, with name and time; the report itself stays as signed', async () => {
    const p = await newPrint();
    const report = await signedReport(p.id);
    expect((await api('researcher').post(`/api/condition-reports/${report.id}/addenda`, { text: 'x' })).status).toBe(403);
    const empty = await api('second').post(`/api/condition-reports/${report.id}/addenda`, { text: '   ' });
    expect(empty.status).toBe(400);
    expect(paths(empty)).toEqual(['text']);

    const before = Date.now();
    const res = await api('second').post(`/api/condition-reports/${report.id}/addenda`, { text: 'Under UV the mirroring extends 5 mm further into the sky.' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.data).toMatchObject({ id: report.id, status: 'signed', version: report.version, signedAt: report.signedAt });
    expect(res.body.data.addenda).toHaveLength(1);
    expect(res.body.data.addenda[0]).toMatchObject({ authorName: second.name, text: 'Under UV the mirroring extends 5 mm further into the sky.' });
    expect(Math.abs(new Date(res.body.data.addenda[0].writtenAt).getTime() - before)).toBeLessThan(10_000);

    await api('conservator').post(`/api/condition-reports/${report.id}/addenda`, { text: 'Agreed; rehoused in a new folder.' });
    const read = await api('researcher').get(`/api/condition-reports/${report.id}`);
    expect(read.body.data.addenda.map((a: { authorName: string }) => a.authorName)).toEqual([second.name, 'Tamsin Wrey']);
    expect((await Addendum.findOne({ where: { reportId: report.id, authorId: ids.second } }))).not.toBeNull();

    await expect(db().query('UPDATE addenda SET text = $1 WHERE report_id = $2', { bind: ['rewritten', report.id] })).rejects.toThrow(/append-only/);
    const audit = await AuditEventModel.findOne({ where: { entityType: 'condition_report', entityId: report.id, action: 'condition_report.addendum_added', actorId: ids.second } });
    expect(audit).toMatchObject({ after: { printId: p.id, addendum: { authorName: second.name } } });
  });

  it('409 on a draft: edit the draft instead; 404 for an unknown report', async () => {
    const p = await newPrint();
    const draft = await newDraft(p.id);
    const res = await api('conservator').post(`/api/condition-reports/${draft.id}/addenda`, { text: 'Note' });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/edit the draft instead/);
    expect(await Addendum.count({ where: { reportId: draft.id } })).toBe(0);
    expect((await api('conservator').post(`/api/condition-reports/${UNKNOWN}/addenda`, { text: 'Note' })).status).toBe(404);
  });
});

describe('DELETE /api/condition-reports/:id (discarding a draft)', () => {
  it('the author discards a draft; the whole draft stays in the audit trail with its print', async () => {
    const p = await newPrint();
    const draft = await newDraft(p.id, { summary: 'Started on the wrong print', observations: [observation({ termCode: 'abrasion' })] });
    expect((await api('researcher').del(`/api/condition-reports/${draft.id}?version=1`)).status).toBe(403);
    const stale = await api('conservator').del(`/api/condition-reports/${draft.id}?version=7`);
    expect(stale.status).toBe(409);
    expect(stale.body.error.details.current.id).toBe(draft.id);
    const res = await api('conservator').del(`/api/condition-reports/${draft.id}?version=1`);
    expect(res.status).toBe(200);
    expect(res.body.data).toEqual({ id: draft.id });
    expect(await ConditionReport.count({ where: { id: draft.id } })).toBe(0);
    expect(await Observation.count({ where: { reportId: draft.id } })).toBe(0);
    expect((await api('conservator').get(`/api/condition-reports/${draft.id}`)).status).toBe(404);
    const audit = await AuditEventModel.findOne({ where: { entityType: 'condition_report', entityId: draft.id, action: 'condition_report.discarded' } });
    expect(audit).toMatchObject({
      actorName: 'Tamsin Wrey',
      before: { printId: p.id, summary: 'Started on the wrong print', observations: [expect.objectContaining({ termCode: 'abrasion' })] },
      after: { printId: p.id },
    });
  });

  it('every event on a report is one audit row on the report, each naming the print', async () => {
    const p = await newPrint();
    const report = await signedReport(p.id);
    await api('second').post(`/api/condition-reports/${report.id}/addenda`, { text: 'Checked again under raking light.' });
    const rows = await AuditEventModel.findAll({ where: { entityId: report.id }, order: [['id', 'ASC']] });
    expect(rows.map((r) => [r.entityType, r.action])).toEqual([
      ['condition_report', 'condition_report.created'],
      ['condition_report', 'condition_report.signed'],
      ['condition_report', 'condition_report.addendum_added'],
    ]);
    for (const r of rows) expect((r.after as { printId: string }).printId).toBe(p.id);
  });
});
