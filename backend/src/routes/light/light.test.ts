import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { budgetStatus, DEFAULT_LIGHT_BUDGETS } from '@toneledger/common/domain/light-budget';
import { fitLightCost } from '@toneledger/common/domain/light-cost';
import { deltaE00 } from '@toneledger/common/domain/colour';
import type { DisplayPeriodInput } from '@toneledger/common/domain/light-dose';
import { testApp } from '../../../test/app';
import { daysFromToday, exhibitionClient, paths } from '../../../test/exhibition-helpers';
import { AuditEventModel, Setting } from '../../models';
import { db } from '../../db';
import { beginLightRecompute, recomputeBatch, recomputeJob, settleLightRecompute } from '../../services/light-recompute.service';

const t = testApp();
let h: Awaited<ReturnType<typeof exhibitionClient>>;

beforeAll(async () => {
  h = await exhibitionClient(t);
});
afterAll(() => t.close());

const stored = async (printId: string) =>
  (await db().query<{ light_responsivity: string; over_light_budget: boolean; warning_codes: string[] }>(
    'SELECT light_responsivity, over_light_budget, warning_codes FROM prints WHERE id = $1', { bind: [printId], type: QueryTypes.SELECT },
  ))[0];

// The budget of the 'high' category in the default settings (light-budget.ts, REFERENCES.md §4): 50 lx, 15,000 lx·h a year.
const HIGH = DEFAULT_LIGHT_BUDGETS.high;

describe('a print’s light dose', () => {
  it('sums lux-hours by year, over 12 months, in total and planned, as worked by hand and by the pure module', async () => {
    expect(HIGH).toEqual({ maxLux: 50, annualLuxHours: 15_000 });
    const p = await h.newPrint('cyanotype', 'Fern on blue');
    const e = await h.newExhibition([{ name: 'Calder Reach, Print Room', opensOn: '2025-12-01', closesOn: '2026-03-31' }]);
    await h.addObjects(e, [p.id]);
    const d1 = { printId: p.id, startsOn: '2025-12-22', endsOn: '2025-12-31', lux: 40, hoursPerDay: 6 };
    const d2 = { printId: p.id, startsOn: '2026-01-05', endsOn: '2026-02-03', lux: 50, hoursPerDay: 8 };
    // 40 lx × 6 h × 10 days = 2,400 lx·h; 50 lx × 8 h × 30 days = 12,000 lx·h.
    expect((await h.display(e.id, d1)).luxHours).toBe(2_400);
    expect((await h.display(e.id, d2)).luxHours).toBe(12_000);

    const res = await h.as('researcher').get(`/api/prints/${p.id}/light?asOf=2026-06-30`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const l = res.body.data;
    expect(l).toMatchObject({ category: 'high', categorySource: 'default', defaultCategory: 'high', budget: HIGH, asOf: '2026-06-30' });
    // This year (2026): 12,000. The 12 months to 30 June 2026 hold both: 14,400. Nothing after 30 June.
    expect(l.usedThisYear).toBe(12_000);
    expect(l.usedLast12Months).toBe(14_400);
    expect(l.total).toBe(14_400);
    expect(l.planned).toBe(0);
    expect(l.byYear).toEqual([{ year: 2025, luxHours: 2_400 }, { year: 2026, luxHours: 12_000 }]);
    // Cumulative before each mark: 0 at the first start, 2,400 the day after the first ends and at the second start, 14,400 after it.
    expect(l.series).toEqual([
      { date: '2025-12-22', luxHours: 0 }, { date: '2026-01-01', luxHours: 2_400 }, { date: '2026-01-05', luxHours: 2_400 }, { date: '2026-02-04', luxHours: 14_400 },
    ]);
    expect(l.displays.map((d: { luxHours: number }) => d.luxHours)).toEqual([2_400, 12_000]);
    expect(l.rest.owedUntil).toBeNull();
    expect(l.warnings).toEqual([]);

    // Midway through the second display, 20 January 2026: 16 days × 400 = 6,400 this year; total 2,400 + 6,400 = 8,800;
    // still to come 12,000 − 6,400 = 5,600.
    const mid = (await h.as('conservator').get(`/api/prints/${p.id}/light?asOf=2026-01-20`)).body.data;
    expect([mid.usedThisYear, mid.total, mid.planned]).toEqual([6_400, 8_800, 5_600]);
    const periods: DisplayPeriodInput[] = [d1, d2].map((d) => ({ start: d.startsOn, end: d.endsOn, lux: d.lux, hoursPerDay: d.hoursPerDay }));
    const pure = budgetStatus({ periods, category: 'high', asOf: '2026-01-20' });
    expect([mid.usedThisYear, mid.usedLast12Months, mid.total, mid.planned]).toEqual([pure.usedThisYear, pure.usedRolling12, pure.total, pure.scheduled]);

    // The exhibition opens in 2025: left of 2025's budget after it, 15,000 − 2,400 = 12,600 (the 2026 days count in 2026).
    const detail = (await h.as('viewer').get(`/api/exhibitions/${e.id}`)).body.data;
    expect(detail.objects[0]).toMatchObject({ luxHours: 14_400, budgetLeftLuxHours: 12_600, lightResponsivity: 'high', expectedDeltaE00: null });
  });

  it('past its budget: the warning and the rest owed under the rest rule, worked by hand', async () => {
    const p = await h.newPrint('cyanotype', 'Seaweed, pressed');
    const e = await h.newExhibition([{ name: 'Calder Reach, Print Room', opensOn: '2025-12-01', closesOn: '2026-03-31' }]);
    await h.addObjects(e, [p.id]);
    await h.display(e.id, { printId: p.id, startsOn: '2025-12-22', endsOn: '2025-12-31', lux: 40, hoursPerDay: 6 });
    await h.display(e.id, { printId: p.id, startsOn: '2026-01-05', endsOn: '2026-02-03', lux: 50, hoursPerDay: 8 });
    // 50 lx × 8 h × 5 days = 2,000: 16,400 lx·h in the 12 months to 30 June 2026, 1,400 over 15,000.
    await h.display(e.id, { printId: p.id, startsOn: '2026-03-01', endsOn: '2026-03-05', lux: 50, hoursPerDay: 8 });
    const l = (await h.as('registrar').get(`/api/prints/${p.id}/light?asOf=2026-06-30`)).body.data;
    expect(l.usedLast12Months).toBe(16_400);
    expect(l.warnings.map((w: { code: string }) => w.code)).toContain('over_annual_budget');
    // Rest: the 12-month window must lose 1,400 lx·h with no further display. The first days to leave it are
    // 22, 23, … December 2025 at 240 lx·h each: six days (1,440) are needed, so the window must start on
    // 28 December 2025 and end on 27 December 2026 (28 Dec 2025 + 364 days). The print rests through 26 December 2026.
    expect(l.rest.owedUntil).toBe('2026-12-26');
    expect(l.rest.explanation).toMatch(/rests in the dark/);
  });

  it('stores the warning "on display past its light budget" while a display takes the print over, and clears it', async () => {
    const p = await h.newPrint('cyanotype', 'Lace on blue');
    const e = await h.newExhibition([{ name: 'Calder Reach, Long Gallery', opensOn: daysFromToday(-30), closesOn: daysFromToday(60) }]);
    await h.addObjects(e, [p.id]);
    expect((await stored(p.id)).warning_codes).not.toContain('over_light_budget');
    // 50 lx × 10 h × 31 days (today − 10 to today + 20) = 15,500 lx·h > 15,000.
    const d = await h.display(e.id, { printId: p.id, startsOn: daysFromToday(-10), endsOn: daysFromToday(20), lux: 50, hoursPerDay: 10 });
    expect(d.luxHours).toBe(15_500);
    expect(await stored(p.id)).toMatchObject({ over_light_budget: true, warning_codes: expect.arrayContaining(['over_light_budget']) });
    const listed = await h.as('registrar').get('/api/prints?hasWarnings=true&pageSize=200&q=Lace');
    expect(listed.body.data.map((r: { id: string }) => r.id)).toContain(p.id);

    const over = await h.as('conservator').get('/api/light/over-budget');
    expect(over.status).toBe(200);
    const item = over.body.data.find((x: { printId: string }) => x.printId === p.id);
    expect(item).toMatchObject({ category: 'high', annualLuxHours: 15_000 });
    expect(item.warnings.map((w: { code: string }) => w.code)).toContain('scheduled_exceeds_budget');

    // 40 lx × 10 h × 31 days = 12,400: within the budget again.
    const edit = await h.as('registrar').patch(`/api/displays/${d.id}`, { lux: 40, version: d.version });
    expect(edit.status).toBe(200);
    expect(await stored(p.id)).toMatchObject({ over_light_budget: false });
    expect((await stored(p.id)).warning_codes).not.toContain('over_light_budget');
    expect((await h.as('conservator').get('/api/light/over-budget')).body.data.map((x: { printId: string }) => x.printId)).not.toContain(p.id);

    // Brighter than the category's 50 lx maximum is past the budget too, and deleting the display clears it.
    const bright = await h.as('registrar').patch(`/api/displays/${d.id}`, { lux: 60, hoursPerDay: 2, version: edit.body.data.version });
    expect(await stored(p.id)).toMatchObject({ over_light_budget: true });
    expect((await h.as('registrar').delete(`/api/displays/${d.id}?version=${bright.body.data.version}`)).status).toBe(200);
    expect(await stored(p.id)).toMatchObject({ over_light_budget: false });
  });

  it('viewers cannot read light (403); researchers read but cannot override', async () => {
    const p = await h.newPrint();
    expect((await h.as('viewer').get(`/api/prints/${p.id}/light`)).status).toBe(403);
    expect((await h.as('viewer').get('/api/light/over-budget')).status).toBe(403);
    expect((await h.as('researcher').get(`/api/prints/${p.id}/light`)).status).toBe(200);
    expect((await h.as('researcher').put(`/api/prints/${p.id}/light-responsivity`, { category: 'low', reason: 'x', version: 1 })).status).toBe(403);
    expect((await h.as('registrar').put(`/api/prints/${p.id}/light-responsivity`, { category: 'low', reason: 'x', version: 1 })).status).toBe(403);
    expect((await h.as('conservator').get('/api/prints/00000000-0000-4000-8000-00000000000f/light')).status).toBe(404);
  });
});

describe('the light category', () => {
  it('a conservator overrides the default with a reason (audited, version-checked) and returns it to the default', async () => {
    const p = await h.newPrint('gelatin_silver_developing_out', 'Mill chimney');
    expect((await stored(p.id)).light_responsivity).toBe('medium');
    const url = `/api/prints/${p.id}/light-responsivity`;
    const noReason = await h.as('conservator').put(url, { category: 'high', version: p.version });
    expect(noReason.status).toBe(400);
    expect(paths(noReason)).toEqual(['reason']);
    const ok = await h.as('conservator').put(url, { category: 'high', reason: 'Hand-coloured with aniline dyes', version: p.version });
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    expect(ok.body.data).toMatchObject({ category: 'high', categorySource: 'override', defaultCategory: 'medium', overrideReason: 'Hand-coloured with aniline dyes', budget: HIGH });
    expect((await stored(p.id)).light_responsivity).toBe('high');
    const audit = await AuditEventModel.findOne({ where: { entityId: p.id, action: 'print.light_responsivity_set' } });
    expect(audit?.after).toMatchObject({ lightResponsivityOverride: 'high', reason: 'Hand-coloured with aniline dyes' });
    const stale = await h.as('conservator').put(url, { category: 'low', reason: 'Older', version: p.version });
    expect(stale.status).toBe(409);
    const back = await h.as('conservator').put(url, { category: null, version: ok.body.data.version });
    expect(back.status).toBe(200);
    expect(back.body.data).toMatchObject({ category: 'medium', categorySource: 'default', overrideReason: null });
    expect((await stored(p.id)).light_responsivity).toBe('medium');
  });

  it('a change of the rules recomputes every print’s category and light warnings, after the request, with its progress', async () => {
    const p = await h.newPrint('cyanotype', 'Cyanotype ferns, rules');
    const e = await h.newExhibition([{ name: 'Calder Reach, Long Gallery', opensOn: daysFromToday(-30), closesOn: daysFromToday(60) }]);
    await h.addObjects(e, [p.id]);
    // 50 lx × 10 h × 31 days = 15,500 lx·h: over the high budget (15,000), within the low one (600,000).
    await h.display(e.id, { printId: p.id, startsOn: daysFromToday(-10), endsOn: daysFromToday(20), lux: 50, hoursPerDay: 10 });
    expect(await stored(p.id)).toMatchObject({ light_responsivity: 'high', over_light_budget: true });
    const before = (await h.as('admin').get('/api/settings/light')).body.data;
    const [{ n: prints }] = await db().query<{ n: number }>('SELECT count(*)::int AS n FROM prints', { type: QueryTypes.SELECT });
    try {
      const next = { ...before, rules: [{ process: 'cyanotype', category: 'low' }, ...before.rules] };
      expect((await h.as('conservator').put('/api/settings/light', next)).status).toBe(403);
      const res = await h.as('admin').put('/api/settings/light', next);
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      await settleLightRecompute();
      expect(await stored(p.id)).toMatchObject({ light_responsivity: 'low', over_light_budget: false });
      expect((await h.as('conservator').get(`/api/prints/${p.id}/light`)).body.data).toMatchObject({ category: 'low', defaultCategory: 'low' });
      const progress = await h.as('researcher').get('/api/settings/light/recompute');
      expect(progress.status).toBe(200);
      // Every print of the test database was visited once.
      expect(progress.body.data).toMatchObject({ status: 'done', done: prints, total: prints, finishedAt: expect.any(String) });
      expect((await h.as('viewer').get('/api/settings/light/recompute')).status).toBe(403);
      // The job asked again for the same change (a retry, a second worker) finds it done and changes nothing.
      const generationRow = async () => (await db().query<{ value: { generation: number; finishedAt: string } }>(
        "SELECT value FROM settings WHERE key = 'light-recompute'", { type: QueryTypes.SELECT },
      ))[0]!.value;
      const g = await generationRow();
      await recomputeJob(g.generation);
      expect(await generationRow()).toEqual(g);
    } finally {
      expect((await h.as('admin').put('/api/settings/light', before)).status).toBe(200);
      await settleLightRecompute();
    }
    expect(await stored(p.id)).toMatchObject({ light_responsivity: 'high', over_light_budget: true });
  });

  it('two changes in a row end with every print computed from the latest', async () => {
    const p = await h.newPrint('cyanotype', 'Cyanotype reeds, two changes');
    const before = (await h.as('admin').get('/api/settings/light')).body.data;
    try {
      // The first change would make cyanotypes "medium", the second "low": the second is the one that holds.
      expect((await h.as('admin').put('/api/settings/light', { ...before, rules: [{ process: 'cyanotype', category: 'medium' }, ...before.rules] })).status).toBe(200);
      expect((await h.as('admin').put('/api/settings/light', { ...before, rules: [{ process: 'cyanotype', category: 'low' }, ...before.rules] })).status).toBe(200);
      await settleLightRecompute();
      expect((await stored(p.id)).light_responsivity).toBe('low');
      expect((await h.as('admin').get('/api/settings/light/recompute')).body.data.status).toBe('done');
    } finally {
      expect((await h.as('admin').put('/api/settings/light', before)).status).toBe(200);
      await settleLightRecompute();
    }
    expect((await stored(p.id)).light_responsivity).toBe('high');
  });

  it('in batches: a change made while a recompute runs stops the older job and starts again from the first print', async () => {
    const p = await h.newPrint('cyanotype', 'Cyanotype rushes, batches');
    const before = (await h.as('admin').get('/api/settings/light')).body.data;
    const [{ n: prints }] = await db().query<{ n: number }>('SELECT count(*)::int AS n FROM prints', { type: QueryTypes.SELECT });
    const progress = async () => (await h.as('admin').get('/api/settings/light/recompute')).body.data;
    const change = (category: string) => db().transaction(async (tx) => {
      await Setting.upsert({ key: 'light', value: { ...before, rules: [{ process: 'cyanotype', category }, ...before.rules] } }, { transaction: tx });
      return beginLightRecompute(tx);
    });
    try {
      const g1 = await change('medium');
      expect(await recomputeBatch(g1, 2)).toBe(true);
      expect(await progress()).toMatchObject({ status: 'running', done: 2, total: prints });
      // A newer change while the first is part way: back to the first print.
      const g2 = await change('low');
      // Its total is the planner's estimate until its first batch counts.
      expect(await progress()).toMatchObject({ status: 'running', done: 0, finishedAt: null });
      expect(await recomputeBatch(g1, 2)).toBe(false);
      expect((await progress()).done).toBe(0);
      await recomputeJob(g2, 3);
      expect(await progress()).toMatchObject({ status: 'done', done: prints, total: prints });
      expect((await stored(p.id)).light_responsivity).toBe('low');
    } finally {
      expect((await h.as('admin').put('/api/settings/light', before)).status).toBe(200);
      await settleLightRecompute();
    }
    expect((await stored(p.id)).light_responsivity).toBe('high');
  });
});

describe('light cost', () => {
  const session = (measuredOn: string, spotId: string, lab: { L: number; a: number; b: number }) => ({
    measuredOn, instrument: 'Spectrodensitometer, 4 mm aperture', serial: 'SN-0417', illuminant: 'D50', observer: '2', geometry: '45/0',
    condition: 'M1', readings: [{ spotId, readings: [lab] }],
  });

  it('fits ΔE00 at the most changed spot against cumulative lux-hours, and an exhibition shows what it is expected to add', async () => {
    const p = await h.newPrint('cyanotype', 'Blue harbour, measured');
    const spots = [];
    for (const [name, purpose] of [['Sky', 'highlight'], ['Hull', 'dmax']] as const) {
      const r = await h.as('conservator').post(`/api/prints/${p.id}/measurement-spots`, { name, purpose });
      expect(r.status, JSON.stringify(r.body)).toBe(201);
      spots.push(r.body.data as { id: string });
    }
    const past = await h.newExhibition([{ name: 'Calder Reach, Print Room', opensOn: '2024-01-01', closesOn: '2024-12-31' }]);
    await h.addObjects(past, [p.id]);
    // 50 lx × 10 h × 30 days = 15,000 lx·h each: 10 Jan – 8 Feb and 1 – 30 April 2024.
    await h.display(past.id, { printId: p.id, startsOn: '2024-01-10', endsOn: '2024-02-08', lux: 50, hoursPerDay: 10 });
    await h.display(past.id, { printId: p.id, startsOn: '2024-04-01', endsOn: '2024-04-30', lux: 50, hoursPerDay: 10 });
    const labs = {
      hull: [{ L: 30, a: -5, b: -35 }, { L: 31, a: -4.5, b: -33 }, { L: 32.5, a: -4, b: -30 }],
      sky: [{ L: 80, a: -2, b: -8 }, { L: 80.2, a: -2, b: -7.8 }, { L: 80.3, a: -1.9, b: -7.7 }],
    };
    const dates = ['2024-01-02', '2024-03-01', '2024-06-03'];
    for (const [i, date] of dates.entries()) {
      const body = session(date, spots[1].id, labs.hull[i]);
      body.readings.push({ spotId: spots[0].id, readings: [labs.sky[i]] });
      const r = await h.as('conservator').post(`/api/prints/${p.id}/measurement-sessions`, body);
      expect(r.status, JSON.stringify(r.body)).toBe(201);
    }
    const l = (await h.as('researcher').get(`/api/prints/${p.id}/light?asOf=2024-12-31`)).body.data;
    expect(l.cost.status).toBe('ok');
    // The hull changed most (its latest ΔE00 is the larger), so it is the spot fitted.
    expect(l.cost.spotLabel).toBe('Hull');
    // Exposure before each session: 0, 0.015 and 0.030 Mlx·h. Least squares through the origin:
    // slope = Σxy / Σx² = (0.015·y₂ + 0.030·y₃) / (0.015² + 0.030²), with y the CIEDE2000 differences from the baseline.
    const y2 = deltaE00(labs.hull[0], labs.hull[1]);
    const y3 = deltaE00(labs.hull[0], labs.hull[2]);
    const slope = (0.015 * y2 + 0.03 * y3) / (0.015 ** 2 + 0.03 ** 2);
    expect(l.cost.slopePerMlxh).toBeCloseTo(slope, 6);
    expect(l.cost.points.map((x: { megaLuxHours: number }) => x.megaLuxHours)).toEqual([0, 0.015, 0.03]);
    const pure = fitLightCost(
      [{ date: dates[0], deltaE00: 0 }, { date: dates[1], deltaE00: y2 }, { date: dates[2], deltaE00: y3 }],
      [{ start: '2024-01-10', end: '2024-02-08', lux: 50, hoursPerDay: 10 }, { start: '2024-04-01', end: '2024-04-30', lux: 50, hoursPerDay: 10 }],
    );
    expect(pure.status === 'ok' && l.cost.ci95[0]).toBeCloseTo(pure.status === 'ok' ? pure.ci95[0] : NaN, 6);

    // A planned show: 50 lx × 10 h × 10 days = 5,000 lx·h = 0.005 Mlx·h, so ΔE00 slope × 0.005 expected.
    const next = await h.newExhibition([{ name: 'Lower Fenwick Arts Hall', opensOn: '2025-07-01', closesOn: '2025-07-31' }]);
    await h.addObjects(next, [p.id]);
    await h.display(next.id, { printId: p.id, startsOn: '2025-07-01', endsOn: '2025-07-10', lux: 50, hoursPerDay: 10 });
    const o = (await h.as('registrar').get(`/api/exhibitions/${next.id}`)).body.data.objects[0];
    expect(o.luxHours).toBe(5_000);
    expect(o.expectedDeltaE00).toBeCloseTo(slope * 0.005, 6);
  });

  it('says "not enough data" with fewer than three sessions', async () => {
    const p = await h.newPrint('cyanotype');
    const l = (await h.as('researcher').get(`/api/prints/${p.id}/light`)).body.data;
    expect(l.cost).toEqual({ status: 'not_enough_data', reason: expect.stringMatching(/^Not enough data/) });
  });
});
