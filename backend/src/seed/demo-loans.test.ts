import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { onServer } from '../../test/scratch-database';

/**
 * The demo's exhibitions and loans, seeded into a database of this test's own (created and
 * dropped here) after the catalogue and measurement histories, as the first start seeds them.
 * The light figures are read through the light service and checked against exposure counted
 * here by hand: illuminance × hours × open days (the reciprocity of REFERENCES.md §4, lux-hours
 * as the product of illuminance and time).
 */

const shared = process.env.DATABASE_URL!;
const name = `toneledger_seed_loans_${process.pid}`;


type Modules = {
  db: typeof import('../db');
  light: typeof import('../services/light.service');
  list: typeof import('../services/print-list.service');
  schemas: typeof import('@toneledger/common/schemas/catalogue');
};
let m: Modules;
const rows = <T extends object>(sql: string, bind: unknown[] = []) => m.db.db().query<T>(sql, { bind, type: 'SELECT' as never }) as unknown as Promise<T[]>;

beforeAll(async () => {
  await onServer(`DROP DATABASE IF EXISTS ${name}`);
  await onServer(`CREATE DATABASE ${name}`);
  vi.resetModules();
  const url = new URL(shared);
  url.pathname = `/${name}`;
  vi.stubEnv('DATABASE_URL', url.toString());
  const { migrateUp } = await import('../migrate');
  const db = await import('../db');
  await migrateUp(db.db());
  const { seedDemoIfEmpty } = await import('./demo');
  const lines: string[] = [];
  await seedDemoIfEmpty(db.db(), { catalogue: true, histories: true, log: (l) => lines.push(l) });
  console.info(lines.filter((l) => l.startsWith('Demo')).join('\n'));
  m = { db, light: await import('../services/light.service'), list: await import('../services/print-list.service'), schemas: await import('@toneledger/common/schemas/catalogue') };
}, 300_000);

afterAll(async () => {
  await m?.db.closeDb();
  vi.unstubAllEnvs();
  await onServer(`DROP DATABASE IF EXISTS ${name}`);
}, 60_000);

/** Lux-hours of one period counted day by day: lux × hours on each open weekday that is not a closed date. */
function byHand(p: { startsOn: string; endsOn: string; lux: number; hoursPerDay: number; daysOpen: number[]; closedDates: string[] }, until?: string): number {
  let sum = 0;
  for (let t = Date.parse(`${p.startsOn}T00:00:00Z`); t <= Date.parse(`${p.endsOn}T00:00:00Z`); t += 86_400_000) {
    const day = new Date(t).toISOString().slice(0, 10);
    if (until && day > until) break;
    const iso = ((new Date(t).getUTCDay() + 6) % 7) + 1;
    if (p.daysOpen.includes(iso) && !p.closedDates.includes(day)) sum += p.lux * p.hoursPerDay;
  }
  return sum;
}

describe('the demo exhibitions and loans', () => {
  it('holds a loan in each status the demo shows, with its status history in order', async () => {
    const loans = await rows<{ id: string; direction: string; status: string; reference: string }>('SELECT id, direction, status, reference FROM loans ORDER BY reference');
    const has = (direction: string, status: string) => loans.filter((l) => l.direction === direction && l.status === status);
    expect(has('out', 'returned').length).toBeGreaterThanOrEqual(1);
    expect(has('out', 'agreed')).toHaveLength(1);
    expect(has('in', 'on_loan')).toHaveLength(1);
    expect(has('out', 'proposed').length + has('in', 'proposed').length).toBe(1);
    expect(has('out', 'declined')).toHaveLength(1);
    const returned = has('out', 'returned')[0];
    const history = await rows<{ to: string }>('SELECT to_status AS "to" FROM loan_status_changes WHERE loan_id = $1 ORDER BY id', [returned.id]);
    expect(history.map((h) => h.to)).toEqual(['proposed', 'approved', 'agreed', 'in_transit', 'on_loan', 'returned']);
    // Prints came back: none of a returned loan's prints is still away.
    const away = await rows<{ n: number }>(`SELECT count(*)::int AS n FROM loan_objects o JOIN prints p ON p.id = o.print_id WHERE o.loan_id = $1 AND p.status = 'on_loan'`, [returned.id]);
    expect(away[0].n).toBe(0);
  });

  it('has signed outgoing reports by the conservator for every print of every loan out that left, and returning ones when it came back', async () => {
    const left = await rows<{ id: string; status: string }>(
      `SELECT l.id, l.status FROM loans l WHERE l.direction = 'out' AND EXISTS (SELECT 1 FROM loan_status_changes c WHERE c.loan_id = l.id AND c.to_status = 'in_transit')`,
    );
    expect(left.length).toBeGreaterThanOrEqual(1);
    for (const loan of left) {
      const missing = await rows<{ printId: string; context: string }>(
        `SELECT o.print_id AS "printId", c.context FROM loan_objects o CROSS JOIN (VALUES ('outgoing_loan'), ('returning_loan')) AS c(context)
          WHERE o.loan_id = $1 AND (c.context = 'outgoing_loan' OR $2 = 'returned')
            AND NOT EXISTS (SELECT 1 FROM condition_reports r JOIN users u ON u.id = r.examiner_id
                             WHERE r.loan_id = o.loan_id AND r.print_id = o.print_id AND r.context = c.context AND r.status = 'signed' AND u.role = 'conservator')`,
        [loan.id, loan.status],
      );
      expect(missing).toEqual([]);
    }
  });

  it('dispatched every loan out for an exhibition with its prints approved for display there by a conservator; the agreed one still waits', async () => {
    const left = await rows<{ id: string; exhibitionId: string }>(
      `SELECT l.id, l.exhibition_id AS "exhibitionId" FROM loans l WHERE l.direction = 'out' AND l.purpose = 'exhibition' AND l.exhibition_id IS NOT NULL
          AND EXISTS (SELECT 1 FROM loan_status_changes c WHERE c.loan_id = l.id AND c.to_status = 'in_transit')`,
    );
    expect(left.length).toBeGreaterThanOrEqual(1);
    for (const loan of left) {
      const notApproved = await rows<{ printId: string }>(
        `SELECT o.print_id AS "printId" FROM loan_objects o
          WHERE o.loan_id = $1 AND NOT EXISTS (SELECT 1 FROM exhibition_objects e JOIN users u ON u.id = e.approved_by
                                               WHERE e.exhibition_id = $2 AND e.print_id = o.print_id AND e.approval = 'approved' AND u.role = 'conservator')`,
        [loan.id, loan.exhibitionId],
      );
      expect(notApproved).toEqual([]);
    }
    // The agreed loan's exhibition is not approved yet: its page says so before anyone dispatches it.
    const [agreed] = await rows<{ id: string }>(`SELECT id FROM loans WHERE direction = 'out' AND status = 'agreed'`);
    const { loanDetail } = await import('../services/loan.service');
    const detail = await loanDetail(agreed.id, 'registrar');
    expect(detail.blockers.map((b) => b.message)).toContain(`4 prints are not approved for display in The Toned Print, 1920–1960 by a conservator.`);
  });

  it('shows prints over their light budget, with exposure equal to lux × hours × open days counted by hand', async () => {
    const over = await rows<{ id: string }>(`SELECT id FROM prints WHERE over_light_budget ORDER BY accession_sort`);
    expect(over.length).toBeGreaterThanOrEqual(3);
    let pastBudget = 0;
    for (const { id } of over) {
      const light = await m.light.printLight(id);
      const periods = await rows<{ startsOn: string; endsOn: string; lux: number; hoursPerDay: number; daysOpen: number[]; closedDates: string[] }>(
        `SELECT starts_on::text AS "startsOn", ends_on::text AS "endsOn", lux::float8 AS lux, hours_per_day::float8 AS "hoursPerDay", days_open AS "daysOpen",
                ARRAY(SELECT d::text FROM unnest(closed_dates) d) AS "closedDates" FROM display_periods WHERE print_id = $1`,
        [id],
      );
      expect(light.total).toBeCloseTo(periods.reduce((s, p) => s + byHand(p, light.asOf), 0), 6);
      // Stored when some 12 months of its displays, past or scheduled, go over the budget.
      expect(light.warnings.some((w) => w.code === 'scheduled_exceeds_budget' || w.code === 'over_annual_budget')).toBe(true);
      if (light.budget.annualLuxHours !== null && light.usedLast12Months > light.budget.annualLuxHours) {
        expect(light.warnings.map((w) => w.code)).toContain('over_annual_budget');
        pastBudget += 1;
        expect(light.category).toBe('high');
        expect(light.rest.owedUntil).not.toBeNull();
      }
    }
    expect(pastBudget).toBeGreaterThanOrEqual(1);
  });

  it('warns on the agreed loan\'s iron-blue print before it leaves: its planned displays go past the budget', async () => {
    const [loan] = await rows<{ id: string }>(`SELECT id FROM loans WHERE direction = 'out' AND status = 'agreed'`);
    const prints = await rows<{ id: string; toners: string[] }>(`SELECT p.id, p.toner_classes AS toners FROM loan_objects o JOIN prints p ON p.id = o.print_id WHERE o.loan_id = $1`, [loan.id]);
    const blue = prints.filter((p) => p.toners.includes('iron_blue'));
    expect(blue).toHaveLength(1);
    const light = await m.light.printLight(blue[0].id);
    expect(light.planned).toBeGreaterThan(light.budget.annualLuxHours!);
    expect(light.warnings.map((w) => w.code)).toContain('scheduled_exceeds_budget');
    const [stored] = await rows<{ over: boolean }>('SELECT over_light_budget AS over FROM prints WHERE id = $1', [blue[0].id]);
    expect(stored.over).toBe(true);
  });

  it('fits a light cost for at least three measured prints', async () => {
    const measured = await rows<{ id: string }>(
      `SELECT DISTINCT s.print_id AS id FROM measurement_sessions s WHERE EXISTS (SELECT 1 FROM display_periods d WHERE d.print_id = s.print_id)`,
    );
    const ok: string[] = [];
    for (const { id } of measured) {
      const light = await m.light.printLight(id);
      if (light.cost.status === 'ok') {
        ok.push(id);
        expect(light.cost.n).toBeGreaterThanOrEqual(3);
        // The exposure at the last session is what the displays gave between the first and last sessions.
        expect(Math.max(...light.cost.points.map((p) => p.megaLuxHours))).toBeGreaterThan(0);
      }
    }
    expect(ok.length).toBeGreaterThanOrEqual(3);
  });

  it('keeps the borrowed prints out of the default catalogue list and shows them when asked', async () => {
    const borrowed = await rows<{ id: string }>('SELECT id FROM prints WHERE borrowed');
    expect(borrowed).toHaveLength(3);
    const ids = new Set(borrowed.map((b) => b.id));
    const collection = await rows<{ n: number }>('SELECT count(*)::int AS n FROM prints WHERE NOT borrowed');
    const listed: string[] = [];
    for (let page = 1; listed.length < collection[0].n; page++) {
      const list = await m.list.listPrints(m.schemas.printListQuerySchema.parse({ pageSize: 200, page }), 'registrar');
      expect(list.total).toBe(collection[0].n);
      if (!list.rows.length) break;
      listed.push(...list.rows.map((r: { id: string }) => r.id));
    }
    expect(listed).toHaveLength(collection[0].n);
    expect(listed.some((id) => ids.has(id))).toBe(false);
    const only = await m.list.listPrints(m.schemas.printListQuerySchema.parse({ holding: 'borrowed' }), 'registrar');
    expect(new Set(only.rows.map((r: { id: string }) => r.id))).toEqual(ids);
  });
});
